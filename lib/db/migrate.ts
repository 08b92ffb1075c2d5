import { SequelizeStorage, Umzug } from "umzug";
import type { Sequelize } from "sequelize";
import { migrations } from "@/migrations";

/** The schema comes only from the numbered migrations in migrations/ (never from sync()). */
export function migrator(sequelize: Sequelize) {
  return new Umzug({
    migrations,
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: undefined,
  });
}

export async function migrateUp(sequelize: Sequelize): Promise<string[]> {
  const applied = await migrator(sequelize).up();
  return applied.map((migration) => migration.name);
}

export async function pendingMigrations(sequelize: Sequelize): Promise<string[]> {
  const pending = await migrator(sequelize).pending();
  return pending.map((migration) => migration.name);
}
