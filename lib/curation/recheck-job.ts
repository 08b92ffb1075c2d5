import "server-only";
import { db } from "@/lib/db";
import { readRecheckSettings, rewriteFlagsForPaper } from "@/lib/db/flags";
import { ENGINE_VERSION } from "@/lib/recheck/settings";

// The full recheck after an engine or settings change (DESIGN §4.4): every paper's flags rewritten and
// stamped with the engine version. It runs in this process, in the background, one paper per
// transaction, yielding to the event loop between papers so requests keep being served; its progress
// lives on globalThis (one per process: Next may load this module in several chunks) and is polled as
// JSON. A second start while one runs is refused.

export interface RecheckProgress {
  state: "idle" | "running" | "finished" | "failed";
  engineVersion: string;
  total: number;
  done: number;
  flags: number;
  unreadable: number;
  startedAt: string | null;
  finishedAt: string | null;
  startedBy: number | null;
  error: string | null;
}

const IDLE: RecheckProgress = { state: "idle", engineVersion: ENGINE_VERSION, total: 0, done: 0, flags: 0, unreadable: 0, startedAt: null, finishedAt: null, startedBy: null, error: null };

const globalForJob = globalThis as typeof globalThis & { __fitledgerRecheckJob?: { progress: RecheckProgress; finished: Promise<void> | null } };
const job = () => (globalForJob.__fitledgerRecheckJob ??= { progress: { ...IDLE }, finished: null });

export function recheckProgress(): RecheckProgress {
  return { ...job().progress };
}

const yieldToRequests = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Starts the full recheck; returns at once. `false` when one is already running. */
export function startFullRecheck({ actorId }: { actorId: number }): boolean {
  const current = job();
  if (current.progress.state === "running") return false;
  current.progress = { ...IDLE, state: "running", startedAt: new Date().toISOString(), startedBy: actorId };
  current.finished = run(actorId).catch((error: unknown) => {
    console.error("[recheck] full recheck failed", error);
    current.progress = { ...current.progress, state: "failed", finishedAt: new Date().toISOString(), error: "The full recheck stopped with an error; it has been logged. Papers done so far keep their new flags." };
  });
  return true;
}

/** For tests and shutdown: resolves when the running recheck (if any) has ended. */
export async function fullRecheckFinished(): Promise<void> {
  await job().finished;
}

async function run(actorId: number): Promise<void> {
  const state = job();
  const { models, sequelize } = await db();
  const papers = await models.Paper.findAll({ attributes: ["id"], order: [["id", "ASC"]] });
  const settings = await readRecheckSettings();
  state.progress = { ...state.progress, total: papers.length };
  for (const paper of papers) {
    await yieldToRequests();
    const result = await sequelize.transaction((transaction) => rewriteFlagsForPaper(paper.id, { transaction, actorId, settings }));
    state.progress = { ...state.progress, done: state.progress.done + 1, flags: state.progress.flags + result.flags, unreadable: state.progress.unreadable + result.unreadable };
  }
  state.progress = { ...state.progress, state: "finished", finishedAt: new Date().toISOString() };
}
