import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { runStatements } from "@/lib/db/sqlite";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// Sequelize opens a new SQLite connection for every transaction, and SQLite's connection settings do not
// carry over from the default one (https://www.sqlite.org/pragma.html: busy_timeout, synchronous and
// cache_size belong to a connection). lib/db/sqlite.ts sets them on each connection as it opens.

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase({ share: false });
});
afterAll(async () => {
  await database.destroy();
});

async function settings(options: { transaction?: import("sequelize").Transaction } = {}) {
  const read = async (pragma: string) => {
    const [row] = await database.sequelize.query<Record<string, number>>(`PRAGMA ${pragma}`, { type: QueryTypes.SELECT, ...options });
    return Object.values(row)[0];
  };
  return { busyTimeout: await read("busy_timeout"), synchronous: await read("synchronous"), cacheSize: await read("cache_size"), journal: await read("journal_mode") };
}

describe("SQLite connection settings", () => {
  it("gives the shared connection WAL, a 10 s busy timeout, NORMAL sync and the default cache", async () => {
    // synchronous: 1 = NORMAL; cache_size −2000 = SQLite's default of about 2 MB
    expect(await settings()).toEqual({ busyTimeout: 10000, synchronous: 1, cacheSize: -2000, journal: "wal" });
  });

  it("gives each transaction's own connection the same timeout and sync, and a 64 MB page cache", async () => {
    const inside = await database.sequelize.transaction(async (transaction) => settings({ transaction }));
    expect(inside).toEqual({ busyTimeout: 10000, synchronous: 1, cacheSize: -65536, journal: "wal" });
    // a second transaction opens (and tunes) a connection of its own
    const again = await database.sequelize.transaction(async (transaction) => settings({ transaction }));
    expect(again.busyTimeout).toBe(10000);
  });

  it("runs queued statements in order on the transaction's connection and reports the first failure", async () => {
    await database.sequelize.query("CREATE TABLE queued (n INTEGER NOT NULL)");
    const seen = await database.sequelize.transaction(async (transaction) => {
      // the second statement fails (NOT NULL); the third, queued behind it, still runs inside the transaction
      const outcome = await runStatements(database.sequelize, transaction, ["INSERT INTO queued (n) VALUES (1), (2)", "INSERT INTO queued (n) VALUES (NULL)", "INSERT INTO queued (n) VALUES (3)"]).catch(
        (error: Error) => error.message,
      );
      const rows = await database.sequelize.query<{ n: number }>("SELECT n FROM queued ORDER BY rowid", { type: QueryTypes.SELECT, transaction });
      return { outcome, rows: rows.map((row) => row.n) };
    });
    expect(seen.outcome).toMatch(/NOT NULL constraint failed: queued\.n/);
    expect(seen.rows).toEqual([1, 2, 3]);
  });
});
