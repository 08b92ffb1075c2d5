import "server-only";
import { Op } from "sequelize";
import { createAudited, db, destroyAudited, updateAudited } from "@/lib/db";
import { AppError } from "@/lib/errors";

// A reader's saved Explore views (DESIGN §3 SavedSearch). Every read and write is by id *and* owner,
// so one person can never list, change or delete another's search.

export interface SavedSearchView {
  id: number;
  name: string;
  /** the Explore URL query, without "?" */
  query: string;
  alerts: boolean;
  lastNotifiedAt: Date | null;
  createdAt: Date;
}

const ATTRIBUTES = ["id", "name", "query", "alerts", "lastNotifiedAt", "createdAt"] as const;
export const MAX_SAVED_SEARCHES = 50;

export async function listSavedSearches({ userId }: { userId: number }): Promise<SavedSearchView[]> {
  const { models } = await db();
  const rows = await models.SavedSearch.findAll({ where: { userId }, attributes: [...ATTRIBUTES], order: [["createdAt", "DESC"], ["id", "DESC"]], raw: true });
  return rows.map((row) => ({ ...row, alerts: Boolean(row.alerts) }) as SavedSearchView);
}

export async function createSavedSearch({ userId, name, query, alerts }: { userId: number; name: string; query: string; alerts: boolean }): Promise<SavedSearchView> {
  const { models, sequelize } = await db();
  return sequelize.transaction(async (transaction) => {
    const count = await models.SavedSearch.count({ where: { userId }, transaction });
    if (count >= MAX_SAVED_SEARCHES) throw new AppError("conflict", `You can keep at most ${MAX_SAVED_SEARCHES} saved searches; delete one first.`);
    // alerts start from now: the first digest lists what is verified after the search was saved
    const row = await createAudited(models.SavedSearch, { userId, name, query, alerts, lastNotifiedAt: alerts ? new Date() : null }, { actorId: userId, transaction });
    return { id: row.id, name: row.name, query: row.query, alerts: row.alerts, lastNotifiedAt: row.lastNotifiedAt, createdAt: row.createdAt };
  });
}

export async function deleteSavedSearch({ userId, id }: { userId: number; id: number }): Promise<void> {
  const { models, sequelize } = await db();
  await sequelize.transaction(async (transaction) => {
    const row = await models.SavedSearch.findOne({ where: { id, userId }, transaction });
    if (!row) throw new AppError("not_found", "That saved search does not exist (or is not yours).");
    await destroyAudited(row, { actorId: userId, transaction });
  });
}

export async function setSavedSearchAlerts({ userId, id, alerts }: { userId: number; id: number; alerts: boolean }): Promise<void> {
  const { models, sequelize } = await db();
  await sequelize.transaction(async (transaction) => {
    const row = await models.SavedSearch.findOne({ where: { id, userId }, transaction });
    if (!row) throw new AppError("not_found", "That saved search does not exist (or is not yours).");
    await updateAudited(row, { alerts, lastNotifiedAt: alerts && !row.alerts ? new Date() : row.lastNotifiedAt }, { actorId: userId, transaction });
  });
}

export interface AlertSubscription {
  id: number;
  name: string;
  query: string;
  lastNotifiedAt: Date | null;
  createdAt: Date;
  user: { id: number; email: string; name: string };
}

/** Saved searches with alerts whose owner is active and that were last sent before `before`. */
export async function listDueAlerts({ before }: { before: Date }): Promise<AlertSubscription[]> {
  const { models } = await db();
  const rows = await models.SavedSearch.findAll({
    where: { alerts: true, [Op.or]: [{ lastNotifiedAt: null }, { lastNotifiedAt: { [Op.lt]: before } }] },
    attributes: [...ATTRIBUTES],
    include: [{ model: models.User, as: "user", attributes: ["id", "email", "name"], where: { status: "active" }, required: true }],
    order: [["id", "ASC"]],
  });
  return rows.map((row) => {
    const user = row.get("user") as { id: number; email: string; name: string };
    return { id: row.id, name: row.name, query: row.query, lastNotifiedAt: row.lastNotifiedAt, createdAt: row.createdAt, user: { id: user.id, email: user.email, name: user.name } };
  });
}
