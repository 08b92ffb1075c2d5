import "server-only";
import { Op, col, fn, where as sqlWhere, type WhereOptions } from "sequelize";
import { db } from "@/lib/db";
import type { AccountStatus, Role } from "@/models/user";
import type { EntryState } from "@/models/paper";

// Reads about people. One object argument, explicit attributes, plain objects out: a password hash can
// only leave through findCredentials, which exists for the password checks in lib/auth.

export interface AccountState {
  id: number;
  email: string;
  name: string;
  role: Role;
  status: AccountStatus;
}

export interface PersonRow extends AccountState {
  affiliation: string | null;
  reason: string | null;
  statusNote: string | null;
  createdAt: Date;
  updatedAt: Date;
}

/** Model instances → plain objects (dates stay Date, on SQLite as on PostgreSQL). */
function plain<T>(row: { get(options: { plain: true }): unknown } | null): T | null {
  return row ? (row.get({ plain: true }) as T) : null;
}

const ACCOUNT_ATTRIBUTES = ["id", "email", "name", "role", "status"] as const;
const PERSON_ATTRIBUTES = [...ACCOUNT_ATTRIBUTES, "affiliation", "reason", "statusNote", "createdAt", "updatedAt"] as const;

/** The account as the per-request session check needs it: its state and the time before which its sessions ended. */
export interface SessionAccount extends AccountState {
  sessionsValidAfter: Date | null;
}

export async function readSessionAccount({ userId }: { userId: number }): Promise<SessionAccount | null> {
  const { models } = await db();
  const row = await models.User.findByPk(userId, { attributes: [...ACCOUNT_ATTRIBUTES, "sessionsValidAfter"] });
  return plain<SessionAccount>(row);
}

export async function readPerson({ userId }: { userId: number }): Promise<PersonRow | null> {
  const { models } = await db();
  const row = await models.User.findByPk(userId, { attributes: [...PERSON_ATTRIBUTES] });
  return plain<PersonRow>(row);
}

/**
 * The only read that includes the password hash (the User model's withPassword scope): for the sign-in
 * check and for confirming the current password before a change. Nothing else may call it.
 */
export async function findCredentials(match: { email: string } | { userId: number }): Promise<(AccountState & { passwordHash: string }) | null> {
  const { models } = await db();
  const whereClause = "email" in match ? { email: match.email.trim().toLowerCase() } : { id: match.userId };
  const row = await models.User.scope("withPassword").findOne({ where: whereClause, attributes: [...ACCOUNT_ATTRIBUTES, "passwordHash"] });
  return plain<AccountState & { passwordHash: string }>(row);
}

/** Addresses of every active admin: who hears about new applications. */
export async function listActiveAdmins(): Promise<{ id: number; email: string; name: string }[]> {
  const { models } = await db();
  const rows = await models.User.findAll({ where: { role: "admin", status: "active" }, attributes: ["id", "email", "name"], order: [["id", "ASC"]] });
  return rows.map((row) => plain<{ id: number; email: string; name: string }>(row)!);
}

export interface PeoplePage {
  rows: PersonRow[];
  total: number;
  page: number;
  pageSize: number;
}

/**
 * One status's list for the admin people page, newest first. The search matches name, e-mail and
 * affiliation case-insensitively through lower() so it behaves the same on SQLite and PostgreSQL; a
 * `%` or `_` typed by the admin acts as a LIKE wildcard, which can only widen the list.
 */
export async function listPeople({ status, search, page, pageSize }: { status: AccountStatus; search: string; page: number; pageSize: number }): Promise<PeoplePage> {
  const { models } = await db();
  const conditions: WhereOptions[] = [{ status }];
  const term = search.trim().toLowerCase();
  if (term) {
    const pattern = `%${term}%`;
    conditions.push({
      [Op.or]: [
        sqlWhere(fn("lower", col("name")), Op.like, pattern),
        sqlWhere(fn("lower", col("email")), Op.like, pattern),
        sqlWhere(fn("lower", col("affiliation")), Op.like, pattern),
      ],
    });
  }
  const { rows, count } = await models.User.findAndCountAll({
    where: { [Op.and]: conditions },
    attributes: [...PERSON_ATTRIBUTES],
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return { rows: rows.map((row) => plain<PersonRow>(row)!), total: count, page, pageSize };
}

/** How many accounts are in each status, for the tabs of the people page. */
export async function countPeopleByStatus(): Promise<Record<AccountStatus, number>> {
  const { models } = await db();
  const rows = (await models.User.findAll({ attributes: ["status", [fn("count", col("id")), "count"]], group: ["status"], raw: true })) as unknown as { status: AccountStatus; count: number | string }[];
  const counts: Record<AccountStatus, number> = { pending: 0, active: 0, suspended: 0, declined: 0 };
  for (const row of rows) counts[row.status] = Number(row.count);
  return counts;
}

export interface CodedPaper {
  id: number;
  title: string;
  doi: string | null;
  ref: string | null;
  year: number | null;
  journal: string | null;
  state: EntryState;
  curatorComment: string | null;
  updatedAt: Date;
}

/**
 * The papers a person coded, for their workbench. Always filtered by the owner id taken from the
 * session; the curation feature may move this next to the other paper queries.
 */
export async function listPapersCodedBy({ userId, page, pageSize }: { userId: number; page: number; pageSize: number }): Promise<{ rows: CodedPaper[]; total: number }> {
  const { models } = await db();
  const { rows, count } = await models.Paper.findAndCountAll({
    where: { createdBy: userId },
    attributes: ["id", "title", "doi", "ref", "year", "journal", "state", "curatorComment", "updatedAt"],
    order: [["updatedAt", "DESC"], ["id", "DESC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return { rows: rows.map((row) => plain<CodedPaper>(row)!), total: count };
}
