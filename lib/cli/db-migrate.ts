// `npm run db:migrate`: applies pending numbered migrations to DATABASE_URL.
import { createDatabase } from "@/lib/db/connection";
import { migrateUp } from "@/lib/db/migrate";
import { oneLine } from "./one-line";

async function main() {
  const database = createDatabase();
  await database.ready;
  const applied = await migrateUp(database.sequelize);
  console.log(applied.length ? `Applied ${applied.length} migration(s): ${applied.join(", ")}` : "The database schema is up to date.");
  await database.sequelize.close();
}

main().catch((error: unknown) => {
  console.error(`db:migrate failed: ${oneLine(error)}`);
  process.exit(1);
});
