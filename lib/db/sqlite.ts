// ---------------------------------------------------------------------------------------------------
// The one SQLite-specific module (DESIGN §10). Everything else goes through Sequelize's portable API,
// so the same code runs on PostgreSQL when DATABASE_URL points there.
// ---------------------------------------------------------------------------------------------------
import fs from "node:fs";
import path from "node:path";
import type { Sequelize } from "sequelize";

/** "sqlite:data/x.sqlite" → "data/x.sqlite"; "sqlite::memory:" → ":memory:"; null when not SQLite. */
export function sqliteStorage(databaseUrl: string): string | null {
  if (!databaseUrl.startsWith("sqlite:")) return null;
  const rest = databaseUrl.slice("sqlite:".length).replace(/^\/\//, "");
  return rest === ":memory:" || rest === "" ? ":memory:" : rest;
}

/**
 * Makes sure the database file can be created and written, with a message that says how to fix it.
 * Throws a plain Error whose message is one line, fit for the demo's preflight.
 */
export function ensureWritableStorage(storage: string): void {
  if (storage === ":memory:") return;
  const folder = path.dirname(path.resolve(storage));
  try {
    makeFolders(folder);
    fs.accessSync(folder, fs.constants.W_OK);
    if (fs.existsSync(storage)) fs.accessSync(storage, fs.constants.R_OK | fs.constants.W_OK);
  } catch {
    throw new Error(`The database path ${storage} is not writable: create its folder or set DATABASE_URL to a writable file (see .env.example).`);
  }
}

/** mkdir -p, one level at a time: `recursive: true` can spin forever on some virtual filesystems (/proc). */
function makeFolders(folder: string): void {
  if (fs.existsSync(folder)) return;
  makeFolders(path.dirname(folder));
  fs.mkdirSync(folder);
}

/**
 * WAL lets readers (the app) and a writer (an import, a script) work at once; busy_timeout makes a
 * second writer wait instead of failing with SQLITE_BUSY. Foreign keys are switched on by Sequelize.
 */
export async function tuneSqlite(sequelize: Sequelize): Promise<void> {
  if (sequelize.getDialect() !== "sqlite") return;
  await sequelize.query("PRAGMA journal_mode = WAL");
  await sequelize.query("PRAGMA busy_timeout = 10000");
  await sequelize.query("PRAGMA synchronous = NORMAL");
}
