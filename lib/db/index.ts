import "server-only";
import { getDatabase } from "./connection";

export { getDatabase, createDatabase, setDatabase, type Database } from "./connection";
export { createAudited, updateAudited, destroyAudited, recordEvent, recordEvents, auditValues, type WriteContext } from "./audit";

/** The shared database, ready for queries (pragmas applied). */
export async function db() {
  const database = getDatabase();
  await database.ready;
  return database;
}
