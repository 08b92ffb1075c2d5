// ---------------------------------------------------------------------------------------------------
// The one SQLite-specific module (DESIGN §10). Everything else goes through Sequelize's portable API,
// so the same code runs on PostgreSQL when DATABASE_URL points there.
// ---------------------------------------------------------------------------------------------------
import fs from "node:fs";
import path from "node:path";
import type { Sequelize, Transaction } from "sequelize";

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

/** What every connection gets. */
const CONNECTION_PRAGMAS = [
  // a second writer waits for the lock instead of failing with SQLITE_BUSY at once
  "PRAGMA busy_timeout = 10000",
  // with WAL, NORMAL is durable against application crashes and syncs far less often than FULL
  "PRAGMA synchronous = NORMAL",
];
/**
 * Transactions (an import's commit writes ~800 000 rows in one) get a 64 MB page cache (negative =
 * KiB) instead of the default 2 MB, which spills the dirty index pages of a large transaction to the
 * WAL again and again. Measured on bench:import (shared machine, so single runs vary by ±2 s): the
 * 100 000-row commit 29 s → 24 s, 50 000-row commits 18.3 / 16.5 s → 14.9 / 16.8 s; a re-import that
 * writes nothing did not gain. A transaction's connection is closed at its end, and its cache with it;
 * the long-lived default connection keeps 2 MB.
 */
const TRANSACTION_PRAGMAS = ["PRAGMA cache_size = -65536"];

interface RawConnection {
  run(sql: string, callback: (error: Error | null) => void): void;
  serialize(work: () => void): void;
}

function runOn(connection: RawConnection, sql: string): Promise<void> {
  return new Promise((resolve, reject) => connection.run(sql, (error) => (error ? reject(error) : resolve())));
}

/**
 * WAL lets readers (the app) and a writer (an import, a script) work at once. Sequelize opens a new
 * SQLite connection for every transaction besides its default one, and connection-level settings
 * (busy_timeout, synchronous, cache_size) do not carry over: so they are set on each connection as it
 * is opened, by wrapping the dialect's getConnection. Foreign keys are switched on by Sequelize itself.
 */
export async function tuneSqlite(sequelize: Sequelize): Promise<void> {
  if (sequelize.getDialect() !== "sqlite") return;
  const manager = sequelize.connectionManager as unknown as { getConnection(options?: unknown): Promise<RawConnection> };
  const getConnection = manager.getConnection.bind(manager);
  const tuned = new WeakSet<RawConnection>();
  manager.getConnection = async (options?: unknown) => {
    // Sequelize's own rule: a transaction passes its id as uuid, everything else shares "default"
    const shared = !(options as { uuid?: string } | undefined)?.uuid || (options as { uuid: string }).uuid === "default";
    const connection = await getConnection(options);
    if (!tuned.has(connection)) {
      tuned.add(connection);
      const pragmas = shared ? CONNECTION_PRAGMAS : [...CONNECTION_PRAGMAS, ...TRANSACTION_PRAGMAS];
      for (const pragma of pragmas) await runOn(connection, pragma);
    }
    return connection;
  };
  await sequelize.query("PRAGMA journal_mode = WAL");
}

/**
 * Runs statements that return no rows (bulk INSERTs of a few megabytes each) on the transaction's own
 * SQLite connection, in order with the statements Sequelize runs there, and settles once every one has
 * ended (with the first failure, if any): the caller's transaction never ends while one still runs.
 * They are queued together, so SQLite's thread runs them back to back while this thread prepares the
 * next ones; awaiting each in turn left that thread idle until this one next yielded.
 * Sequelize's query() is bypassed because it lower-cases the whole SQL text two or three times to
 * classify it (abstract/query.js isShowOrDescribeQuery and others): for the ~250 MB of SQL a
 * 100 000-row import writes, that is most of a gigabyte of garbage strings.
 * Returns false when the database is not SQLite (the caller then goes through sequelize.query).
 */
export async function runStatements(sequelize: Sequelize, transaction: Transaction, statements: readonly string[]): Promise<boolean> {
  if (sequelize.getDialect() !== "sqlite") return false;
  const connection = (transaction as unknown as { connection?: RawConnection }).connection;
  if (!connection) return false;
  if (statements.length === 0) return true;
  await new Promise<void>((resolve, reject) => {
    let pending = statements.length;
    let failure: Error | null = null;
    const ended = (error: Error | null) => {
      failure = failure ?? error;
      pending -= 1;
      if (pending === 0) {
        if (failure) reject(failure);
        else resolve();
      }
    };
    connection.serialize(() => {
      for (const sql of statements) connection.run(sql, ended);
    });
  });
  return true;
}
