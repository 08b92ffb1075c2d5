import "server-only";
import { runDigest } from "./digest";

// The in-process schedule of the saved-search digest: started once per server process (from
// instrumentation.ts), it checks every hour which alerts are due; each alert goes out at most once a day
// (lib/digest/digest.ts), and the conditional claim keeps several instances from doubling it.

const CHECK_EVERY_MS = 60 * 60 * 1000;
const FIRST_CHECK_MS = 60 * 1000;

const state = ((globalThis as typeof globalThis & { __fitledgerDigest?: { timer?: NodeJS.Timeout; running?: boolean } }).__fitledgerDigest ??= {});

async function tick(): Promise<void> {
  if (state.running) return;
  state.running = true;
  try {
    const report = await runDigest();
    if (report.mailed > 0 || report.unreadable.length > 0) console.log(`[digest] ${report.mailed} digests queued of ${report.checked} due alerts${report.unreadable.length ? `; unreadable saved searches ${report.unreadable.join(", ")}` : ""}`);
  } catch (error) {
    console.error("[digest] round failed; the next hour tries again", error);
  } finally {
    state.running = false;
  }
}

/** Starts the hourly check (idempotent). Call from instrumentation.ts `register()` in the Node.js runtime. */
export function startDigestSchedule(): void {
  if (state.timer) return;
  const first = setTimeout(() => {
    void tick();
    state.timer = setInterval(() => void tick(), CHECK_EVERY_MS);
    state.timer.unref?.();
  }, FIRST_CHECK_MS);
  first.unref?.();
  state.timer = first;
}

export function stopDigestSchedule(): void {
  if (state.timer) clearTimeout(state.timer);
  if (state.timer) clearInterval(state.timer);
  state.timer = undefined;
}
