import { Sequelize } from "sequelize";
import sqlite3 from "sqlite3";
import { env } from "@/lib/env";
import { initModels, models as chunkModels, type Models } from "@/models";
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
  const database = { sequelize, models, ready: tuneSqlite(sequelize) };
  // The first database a process opens becomes the shared one (scripts open exactly one).
  globalForDb.__fitledgerDb ??= database;
  return database;
}

// Next.js bundles route handlers, server components, server actions and instrumentation into separate
// chunks, each with its own copy of this module and of models/. The Sequelize instance lives on
// globalThis so every chunk shares one connection; each chunk's own model classes are initialised on
// that instance the first time the chunk asks for it, so `import { Paper } from "@/models"` and
// `getDatabase().models.Paper` are the same, working class within a chunk.
const globalForDb = globalThis as typeof globalThis & { __fitledgerDb?: Database };
let chunkDatabase: Database | undefined;

export function getDatabase(): Database {
  const shared = (globalForDb.__fitledgerDb ??= createDatabase());
  if (shared.models === chunkModels) return shared;
  if (chunkDatabase?.sequelize !== shared.sequelize) {
    initModels(shared.sequelize);
    chunkDatabase = { ...shared, models: chunkModels };
  }
  return chunkDatabase;
}

// A chunk loaded after the shared instance exists binds its classes at once.
if (globalForDb.__fitledgerDb) getDatabase();

/** Replaces the shared instance (tests point the app at a temp file). */
export function setDatabase(database: Database | undefined): void {
  globalForDb.__fitledgerDb = database;
  chunkDatabase = undefined;
}
