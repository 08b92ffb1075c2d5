import "server-only";
import { db } from "@/lib/db";
import { AuditEvent, initModels } from "@/models";

// WORKAROUND, to be removed when lib/db/audit.ts takes AuditEvent from the shared database instance
// (getDatabase().models) instead of importing the class. Next bundles route handlers, server actions
// and instrumentation into separate chunks, each with its own copy of models/; only the copy that
// created the shared instance (lib/db/connection.ts) is initialised, so in every other chunk
// audit.ts's AuditEvent is an uninitialised class and every audited write fails ("reading 'options'").
// Initialising this chunk's copy on the same Sequelize instance makes it usable; Model.init replaces
// the registry entry of the same name, and the other chunk's classes keep working.

export async function bindLocalModels(): Promise<void> {
  const database = await db();
  if (AuditEvent.sequelize !== database.sequelize) initModels(database.sequelize);
}
