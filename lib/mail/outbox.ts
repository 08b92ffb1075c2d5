import "server-only";
import { Op, type Transaction } from "sequelize";
import { db, recordEvents, updateAudited } from "@/lib/db";
import { AppError } from "@/lib/errors";
import type { MailContent } from "./compose";
import { wakeMailSender } from "./sender";
import type { MailKind } from "./templates";

// The outbox (DESIGN §3): a message is a row written in the same transaction as the change that causes
// it, so either both happen or neither does; the sender loop delivers it afterwards. A slow or failing
// SMTP server therefore never fails the user's request and never loses a message.

export interface OutgoingMail {
  to: string;
  kind: MailKind;
  content: MailContent;
}

export interface QueueContext {
  actorId: number | null;
  /** required: queueing outside the causing change's transaction would defeat the outbox */
  transaction: Transaction;
}

export async function queueMail(messages: OutgoingMail | OutgoingMail[], context: QueueContext): Promise<void> {
  const list = Array.isArray(messages) ? messages : [messages];
  if (list.length === 0) return;
  const { models } = await db();
  const rows = [];
  for (const message of list) {
    rows.push(
      await models.OutboxMessage.create(
        { to: message.to, kind: message.kind, subject: message.content.subject, text: message.content.text, html: message.content.html, nextAttemptAt: new Date(), sentAt: null, lastError: null },
        { transaction: context.transaction },
      ),
    );
  }
  // The audit entry names the message but leaves out its body: a reset link must not land in the log.
  await recordEvents(
    rows.map((row) => ({ entity: "OutboxMessage", entityId: row.id, action: "queue", after: { to: row.to, kind: row.kind, subject: row.subject } })),
    context,
  );
  context.transaction.afterCommit(() => wakeMailSender());
}

/** Unsent after this many failed attempts, or this long after it was queued: shown as stuck. */
export const STUCK_AFTER_ATTEMPTS = 3;
export const STUCK_AFTER_MS = 15 * 60_000;

export interface UndeliveredMessage {
  id: number;
  to: string;
  kind: string;
  subject: string;
  attempts: number;
  lastError: string | null;
  nextAttemptAt: Date;
  createdAt: Date;
  stuck: boolean;
}

export function isStuck(message: { attempts: number; createdAt: Date }, now = new Date()): boolean {
  return message.attempts >= STUCK_AFTER_ATTEMPTS || now.getTime() - message.createdAt.getTime() > STUCK_AFTER_MS;
}

/** Messages not yet delivered, oldest first, for admins. Bodies are never listed (they may hold links). */
export async function listUndeliveredMessages({ page, pageSize, now = new Date() }: { page: number; pageSize: number; now?: Date }): Promise<{ rows: UndeliveredMessage[]; total: number }> {
  const { models } = await db();
  const { rows, count } = await models.OutboxMessage.findAndCountAll({
    where: { sentAt: null },
    attributes: ["id", "to", "kind", "subject", "attempts", "lastError", "nextAttemptAt", "createdAt"],
    order: [["createdAt", "ASC"], ["id", "ASC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return {
    rows: rows.map((row) => {
      const value = row.get({ plain: true }) as Omit<UndeliveredMessage, "stuck">;
      return { ...value, stuck: isStuck(value, now) };
    }),
    total: count,
  };
}

export async function summariseOutbox(now = new Date()): Promise<{ waiting: number; stuck: number; deliveredLastDay: number }> {
  const { models } = await db();
  const [waiting, stuck, deliveredLastDay] = await Promise.all([
    models.OutboxMessage.count({ where: { sentAt: null } }),
    models.OutboxMessage.count({
      where: { sentAt: null, [Op.or]: [{ attempts: { [Op.gte]: STUCK_AFTER_ATTEMPTS } }, { createdAt: { [Op.lt]: new Date(now.getTime() - STUCK_AFTER_MS) } }] },
    }),
    models.OutboxMessage.count({ where: { sentAt: { [Op.gte]: new Date(now.getTime() - 24 * 3_600_000) } } }),
  ]);
  return { waiting, stuck, deliveredLastDay };
}

/** An admin asks for an undelivered message to be tried again now rather than after its backoff. */
export async function retryMessageNow({ messageId, actorId }: { messageId: number; actorId: number }): Promise<void> {
  const { models, sequelize } = await db();
  await sequelize.transaction(async (transaction) => {
    const message = await models.OutboxMessage.findOne({ where: { id: messageId }, attributes: ["id", "sentAt", "nextAttemptAt"], transaction });
    if (!message) throw new AppError("not_found", "There is no such message in the outbox.");
    if (message.sentAt) throw new AppError("conflict", "That message has already been delivered.");
    await updateAudited(message, { nextAttemptAt: new Date() }, { actorId, transaction, action: "retry-now" });
    transaction.afterCommit(() => wakeMailSender());
  });
}
