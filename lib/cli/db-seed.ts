// `npm run db:seed`: migrates, then writes the demo accounts and corpus (idempotent).
import { createDatabase } from "@/lib/db/connection";
import { migrateUp } from "@/lib/db/migrate";
import { seedDemo } from "@/seeders/demo-seed";
import { oneLine } from "./one-line";

async function main() {
  const database = createDatabase();
  await database.ready;
  await migrateUp(database.sequelize);
  const started = Date.now();
  const summary = await seedDemo(database);
  console.log(
    `Seeded ${summary.accountsCreated} account(s), ${summary.papersCreated} paper(s), ${summary.comparisonsCreated} comparison(s), ${summary.flagsWritten} finding(s) in ${((Date.now() - started) / 1000).toFixed(1)} s.`,
  );
  await database.sequelize.close();
}

main().catch((error: unknown) => {
  console.error(`db:seed failed: ${oneLine(error)}`);
  process.exit(1);
});
