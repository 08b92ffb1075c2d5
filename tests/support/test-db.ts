// A fresh, migrated SQLite file per test file: the real database through Sequelize, never a mock.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { createDatabase, setDatabase, type Database } from "@/lib/db/connection";
import { migrateUp } from "@/lib/db/migrate";

export interface TestDatabase extends Database {
  file: string;
  url: string;
  /** closes the connection, forgets the shared instance and deletes the file */
  destroy(): Promise<void>;
}

export async function createTestDatabase(options: { migrate?: boolean; share?: boolean } = {}): Promise<TestDatabase> {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), "fitledger-test-"));
  const file = path.join(folder, "test.sqlite");
  const url = `sqlite:${file}`;
  const database = createDatabase(url);
  await database.ready;
  if (options.migrate !== false) await migrateUp(database.sequelize);
  // By default the app's shared instance (lib/db getDatabase) points at this file, so route handlers
  // and queries imported by the test use it.
  if (options.share !== false) setDatabase(database);
  return {
    ...database,
    file,
    url,
    async destroy() {
      await database.sequelize.close();
      if (options.share !== false) setDatabase(undefined);
      fs.rmSync(folder, { recursive: true, force: true });
    },
  };
}
