import { Sequelize } from "sequelize";
import sqlite3 from "sqlite3";
import { env } from "@/lib/env";
import { initModels, type Models } from "@/models";
import { ensureWritableStorage, sqliteStorage, tuneSqlite } from "./sqlite";

export interface Database {
  sequelize: Sequelize;
  models: Models;
  /** resolves once pragmas are applied; await before the first query */
  ready: Promise<void>;
}

/** Creates a Sequelize instance with every model initialised. Scripts and tests use this directly. */
export function createDatabase(databaseUrl: string = env.DATABASE_URL): Database {
  const storage = sqliteStorage(databaseUrl);
  let sequelize: Sequelize;
  if (storage !== null) {
    ensureWritableStorage(storage);
    // dialectModule: the bundler must not have to resolve sqlite3 itself (STACK.md).
    sequelize = new Sequelize({ dialect: "sqlite", storage, logging: false, dialectModule: sqlite3 });
  } else {
    sequelize = new Sequelize(databaseUrl, { logging: false });
  }
  const models = initModels(sequelize);
  return { sequelize, models, ready: tuneSqlite(sequelize) };
}

// Next.js may bundle route handlers and server components into separate chunks, each with its own copy
// of this module: the instance and its initialised models live on globalThis so every chunk shares them.
const globalForDb = globalThis as typeof globalThis & { __fitledgerDb?: Database };

export function getDatabase(): Database {
  if (!globalForDb.__fitledgerDb) globalForDb.__fitledgerDb = createDatabase();
  return globalForDb.__fitledgerDb;
}

/** Replaces the shared instance (tests point the app at a temp file). */
export function setDatabase(database: Database | undefined): void {
  globalForDb.__fitledgerDb = database;
}
