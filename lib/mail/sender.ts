import "server-only";
import { Op } from "sequelize";
import type { Transporter } from "nodemailer";
import { db, recordEvent } from "@/lib/db";
import { env } from "@/lib/env";
import { SENSITIVE_KINDS, type MailKind } from "./templates";
import { createMailTransport } from "./transport";

// The sender loop: reads due messages from the outbox and hands them to SMTP. A failure is recorded on
// the message with the error and retried with exponential backoff; a message is never dropped, and a
// message that keeps failing shows up on /admin/outbox. Delivery is at least once: a message is
// claimed with a lease before sending, so two senders (two instances) do not both send it, but a
// process that dies between the SMTP reply and the database update will send it again after the lease.

export const RETRY_BASE_MS = 30_000;
export const RETRY_MAX_MS = 60 * 60_000;
/** how long a claimed message is reserved for the sender that claimed it */
export const LEASE_MS = 2 * 60_000;
const BATCH = 20;
const REMOVED_BODY = "(This message held a password reset link. Its body was removed after delivery.)";

/** Wait before the next try after `failures` failed attempts: 30 s, 1 min, 2 min, … capped at an hour. */
export function retryDelayMs(failures: number): number {
  return Math.min(RETRY_MAX_MS, RETRY_BASE_MS * 2 ** Math.max(0, failures - 1));
}

export interface DeliveryReport {
  attempted: number;
  delivered: number;
  failed: number;
}

function describe(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  return message.replace(/\s+/g, " ").slice(0, 1000);
}

export async function deliverDueMessages(options: { transport: Transporter; now?: Date; limit?: number; from?: string }): Promise<DeliveryReport> {
  const { models } = await db();
  const now = options.now ?? new Date();
  const report: DeliveryReport = { attempted: 0, delivered: 0, failed: 0 };
  const due = await models.OutboxMessage.findAll({
    where: { sentAt: null, nextAttemptAt: { [Op.lte]: now } },
    order: [["nextAttemptAt", "ASC"], ["id", "ASC"]],
    limit: options.limit ?? BATCH,
  });
  for (const message of due) {
    // The lease is bookkeeping of the attempt itself; the attempt's outcome is what the audit log records.
    const [claimed] = await models.OutboxMessage.update(
      { nextAttemptAt: new Date(now.getTime() + LEASE_MS) },
      { where: { id: message.id, sentAt: null, nextAttemptAt: { [Op.lte]: now } } },
    );
    if (claimed !== 1) continue;
    report.attempted += 1;
    const attempts = message.attempts + 1;
    try {
      await options.transport.sendMail({ from: options.from ?? env.MAIL_FROM, to: message.to, subject: message.subject, text: message.text, html: message.html ?? undefined });
      const sentAt = new Date();
      const scrub = SENSITIVE_KINDS.has(message.kind as MailKind);
      await message.update({ attempts, sentAt, lastError: null, ...(scrub ? { text: REMOVED_BODY, html: null } : {}) });
      // Written by hand rather than with updateAudited: the body may hold a reset link, and the audit
      // log keeps the before/after of every changed field.
      await recordEvent(
        { entity: "OutboxMessage", entityId: message.id, action: "deliver", before: { attempts: message.attempts, sentAt: null }, after: { attempts, sentAt, bodyRemoved: scrub } },
        { actorId: null },
      );
      report.delivered += 1;
    } catch (error) {
      const lastError = describe(error);
      const nextAttemptAt = new Date(now.getTime() + retryDelayMs(attempts));
      await message.update({ attempts, lastError, nextAttemptAt });
      await recordEvent(
        { entity: "OutboxMessage", entityId: message.id, action: "delivery-failed", before: { attempts: message.attempts }, after: { attempts, lastError, nextAttemptAt } },
        { actorId: null },
      );
      report.failed += 1;
    }
  }
  return report;
}

export interface MailSender {
  /** run a pass soon (after a message was queued) instead of at the next interval */
  wake(): void;
  stop(): Promise<void>;
}

const globalForSender = globalThis as typeof globalThis & { __fitledgerMailSender?: MailSender };

/** Starts the in-process sender loop once per process (instrumentation.ts calls this at server start). */
export function startMailSender(options: { intervalMs?: number; transport?: Transporter } = {}): MailSender {
  if (globalForSender.__fitledgerMailSender) return globalForSender.__fitledgerMailSender;
  const intervalMs = options.intervalMs ?? 5_000;
  const transport = options.transport ?? createMailTransport();
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<void> | undefined;
  let again = false;
  let stopped = false;
  let lastProblem = "";

  const schedule = (delay: number) => {
    if (stopped) return;
    clearTimeout(timer);
    timer = setTimeout(tick, delay);
    timer.unref(); // the loop must never keep a process (a build worker, a script) alive
  };

  async function pass() {
    try {
      await db();
      let report: DeliveryReport;
      do report = await deliverDueMessages({ transport });
      while (report.attempted === BATCH && !stopped);
      lastProblem = "";
    } catch (error) {
      // e.g. the database is not migrated yet: say so once, not every few seconds
      const problem = describe(error);
      if (problem !== lastProblem) console.error(`[mail] sender pass failed: ${problem}`);
      lastProblem = problem;
    }
  }

  function tick() {
    if (running) {
      again = true;
      return;
    }
    running = pass().finally(() => {
      running = undefined;
      if (again) {
        again = false;
        schedule(0);
      } else schedule(intervalMs);
    });
  }

  const sender: MailSender = {
    wake: () => schedule(0),
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await running;
      transport.close();
      globalForSender.__fitledgerMailSender = undefined;
    },
  };
  globalForSender.__fitledgerMailSender = sender;
  schedule(0);
  return sender;
}

/** Nudges the running sender, if this process has one; queued mail is otherwise sent at the next interval. */
export function wakeMailSender(): void {
  globalForSender.__fitledgerMailSender?.wake();
}
