import type { CreationAttributes, Model, ModelStatic, Transaction } from "sequelize";
import { getDatabase } from "./connection";

// Every write path goes through these helpers, so each change leaves an AuditEvent with the row before
// and after, written in the same transaction as the change itself.

export interface WriteContext {
  /** the signed-in user, or null for the system (seeding, migrations, background jobs) */
  actorId: number | null;
  transaction?: Transaction;
}

export interface AuditRecord {
  entity: string;
  entityId: string | number;
  action: string;
  before?: Record<string, unknown> | null;
  after?: Record<string, unknown> | null;
}

const HIDDEN = new Set(["passwordHash", "tokenHash"]);

/** Plain values of a row without secrets, fit for the audit log. */
export function auditValues(row: Model | Record<string, unknown>): Record<string, unknown> {
  const values = "get" in row && typeof row.get === "function" ? (row.get({ plain: true }) as Record<string, unknown>) : (row as Record<string, unknown>);
  const clean: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(values)) if (!HIDDEN.has(key)) clean[key] = value;
  return clean;
}

export async function recordEvents(records: AuditRecord[], context: WriteContext): Promise<void> {
  if (records.length === 0) return;
  // through the shared instance: this module may sit in a different Next.js chunk than the caller
  await getDatabase().models.AuditEvent.bulkCreate(
    records.map((record) => ({
      actorId: context.actorId,
      entity: record.entity,
      entityId: String(record.entityId),
      action: record.action,
      before: record.before ?? null,
      after: record.after ?? null,
    })),
    { transaction: context.transaction },
  );
}

export async function recordEvent(record: AuditRecord, context: WriteContext): Promise<void> {
  await recordEvents([record], context);
}

export async function createAudited<M extends Model>(
  model: ModelStatic<M>,
  values: CreationAttributes<M>,
  context: WriteContext & { action?: string },
): Promise<M> {
  const row = await model.create(values, { transaction: context.transaction });
  await recordEvent({ entity: model.name, entityId: String(row.get("id")), action: context.action ?? "create", after: auditValues(row) }, context);
  return row;
}

/** Applies `changes` and records only the fields that really changed; no event when nothing did. */
export async function updateAudited<M extends Model>(
  row: M,
  changes: Partial<M["_attributes"]>,
  context: WriteContext & { action?: string },
): Promise<M> {
  const before: Record<string, unknown> = {};
  const after: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(changes)) {
    const previous = row.get(key);
    if (JSON.stringify(previous) === JSON.stringify(value)) continue;
    if (!HIDDEN.has(key)) {
      before[key] = previous;
      after[key] = value;
    } else {
      before[key] = "(hidden)";
      after[key] = "(changed)";
    }
  }
  if (Object.keys(after).length === 0 && !context.action) return row;
  row.set(changes);
  await row.save({ transaction: context.transaction });
  const entity = (row.constructor as ModelStatic<M>).name;
  await recordEvent({ entity, entityId: String(row.get("id")), action: context.action ?? "update", before, after }, context);
  return row;
}

export async function destroyAudited<M extends Model>(row: M, context: WriteContext & { action?: string }): Promise<void> {
  const before = auditValues(row);
  await row.destroy({ transaction: context.transaction });
  const entity = (row.constructor as ModelStatic<M>).name;
  await recordEvent({ entity, entityId: String(row.get("id")), action: context.action ?? "delete", before }, context);
}
