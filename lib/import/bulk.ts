// Bulk writes for the importer's commit: one multi-row INSERT (or INSERT … ON CONFLICT (id) DO UPDATE
// for changed entries) per few thousand rows. Model.bulkCreate builds a model instance per row before it
// escapes the values into the SQL text; at 100 000 sheet rows (≈ 400 000 rows written with their audit
// events) that alone took most of the 30 s budget. (Bound parameters were slower still: Sequelize
// rewrites each $n placeholder of the statement in turn.) Values are escaped by Sequelize's own escape. The SQL is the portable
// subset both SQLite (≥ 3.24) and PostgreSQL accept; column names come from the models, values are
// converted the way Sequelize stores them (JSON as text, dates as UTC timestamps).
import { DataTypes, QueryTypes, type Model, type ModelStatic, type Sequelize, type Transaction } from "sequelize";
import { runStatements } from "@/lib/db/sqlite";

/** Values per statement, to keep each statement a few megabytes at most. */
const MAX_VALUES = 30_000;

type Row = Record<string, unknown>;

interface Column {
  attribute: string;
  field: string;
  json: boolean;
}

function columnsOf(model: ModelStatic<Model>, attributes: readonly string[]): Column[] {
  const definitions = model.getAttributes() as Record<string, { field?: string; type: unknown }>;
  return attributes.map((attribute) => {
    const definition = definitions[attribute];
    if (!definition) throw new Error(`${model.name} has no attribute ${attribute}`);
    return { attribute, field: definition.field ?? attribute, json: definition.type instanceof DataTypes.JSON };
  });
}

/** A UTC timestamp in the form Sequelize writes for DATE columns ("2026-12-01 23:26:08.847 +00:00"). */
export function sqlTimestamp(date: Date): string {
  return date.toISOString().replace("T", " ").replace("Z", " +00:00");
}

function value(column: Column, raw: unknown): unknown {
  if (raw === undefined || raw === null) return null;
  if (column.json) return JSON.stringify(raw);
  if (raw instanceof Date) return sqlTimestamp(raw);
  return raw;
}

/**
 * A SQL literal: strings quoted with '' doubled (the SQL standard; SQLite, and PostgreSQL with its default
 * standard_conforming_strings), finite numbers as written, NULL; anything else through Sequelize's escape.
 * The sheet reader refuses NUL bytes, so no string here holds one.
 */
let escapeOther: (value: unknown) => string = String;
function literal(value: unknown): string {
  if (value === null) return "NULL";
  if (typeof value === "string") return "'" + (value.includes("'") ? value.replace(/'/g, "''") : value) + "'";
  if (typeof value === "number" && Number.isFinite(value)) return String(value);
  return escapeOther(value);
}

export interface BulkOptions {
  transaction: Transaction;
  now: Date;
  /** attributes overwritten when a row's id exists (an upsert); without it, a plain insert */
  update?: readonly string[];
}

/**
 * The statements that insert `rows` (all with the same attributes) into the model's table. With
 * `update`, a row whose id exists has those attributes overwritten instead. Timestamps are filled when
 * the model keeps them.
 */
export function bulkStatements(model: ModelStatic<Model>, rows: readonly Row[], options: BulkOptions): string[] {
  if (rows.length === 0) return [];
  const sequelize = model.sequelize!;
  escapeOther = (value) => sequelize.escape(value as string);
  const quote = (name: string) => sequelize.getQueryInterface().quoteIdentifier(name);
  const definitions = model.getAttributes();
  const stamp = sqlTimestamp(options.now);
  const timestamps = ["createdAt", "updatedAt"].filter((name) => name in definitions && !(name in rows[0]));
  const columns = columnsOf(model, [...Object.keys(rows[0]), ...timestamps]);
  const table = quote(model.getTableName() as string);
  const head = `INSERT INTO ${table} (${columns.map((c) => quote(c.field)).join(", ")}) VALUES `;
  let tail = "";
  if (options.update) {
    const updates = columnsOf(model, options.update).map((c) => `${quote(c.field)} = excluded.${quote(c.field)}`);
    tail = ` ON CONFLICT (${quote("id")}) DO UPDATE SET ${updates.join(", ")}`;
  }
  const perStatement = Math.max(1, Math.floor(MAX_VALUES / columns.length));
  const stamped = columns.map((column) => timestamps.includes(column.attribute));
  const escapedStamp = literal(stamp);
  const statements: string[] = [];
  for (let at = 0; at < rows.length; at += perStatement) {
    const part = rows.slice(at, at + perStatement);
    const tuples: string[] = new Array(part.length);
    for (let r = 0; r < part.length; r++) {
      const row = part[r];
      let tuple = "(";
      for (let c = 0; c < columns.length; c++) {
        if (c > 0) tuple += ",";
        tuple += stamped[c] ? escapedStamp : literal(value(columns[c], row[columns[c].attribute]));
      }
      tuples[r] = tuple + ")";
    }
    statements.push(head + tuples.join(",") + tail);
  }
  return statements;
}

/**
 * Runs statements from bulkStatements in order inside the transaction. On SQLite they are queued
 * together (lib/db/sqlite.ts runStatements), and this settles once all have ended.
 */
export async function runBulk(sequelize: Sequelize, transaction: Transaction, statements: readonly string[]): Promise<void> {
  if (await runStatements(sequelize, transaction, statements)) return;
  for (const sql of statements) await sequelize.query(sql, { transaction, type: QueryTypes.INSERT });
}

/** Inserts (or, with `update`, upserts) `rows` into the model's table: bulkStatements, then runBulk. */
export async function bulkWrite(model: ModelStatic<Model>, rows: readonly Row[], options: BulkOptions): Promise<void> {
  if (rows.length === 0) return;
  await runBulk(model.sequelize!, options.transaction, bulkStatements(model, rows, options));
}
