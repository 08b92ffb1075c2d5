import { afterEach, describe, expect, it } from "vitest";
import { migrateUp, migrator, pendingMigrations } from "@/lib/db/migrate";
import { migrations } from "@/migrations";
import { createTestDatabase, type TestDatabase } from "../support/test-db";

let database: TestDatabase | undefined;
afterEach(async () => {
  await database?.destroy();
  database = undefined;
});

describe("numbered migrations", () => {
  it("create every table of the data model on an empty SQLite file", async () => {
    database = await createTestDatabase({ migrate: false });
    expect(await pendingMigrations(database.sequelize)).toEqual(migrations.map((migration) => migration.name));
    await migrateUp(database.sequelize);
    const tables = (await database.sequelize.getQueryInterface().showAllTables()).map(String).sort();
    expect(tables).toEqual(
      expect.arrayContaining([
        "audit_events", "comparisons", "fit_models", "flag_dispositions", "flags", "import_batches",
        "outbox_messages", "papers", "samples", "saved_searches", "schema_migrations", "settings", "users",
      ]),
    );
    expect(await pendingMigrations(database.sequelize)).toEqual([]);
  });

  it("apply nothing the second time", async () => {
    database = await createTestDatabase();
    expect(await migrateUp(database.sequelize)).toEqual([]);
  });

  it("index the columns the search facets filter on", async () => {
    database = await createTestDatabase();
    const queryInterface = database.sequelize.getQueryInterface();
    const indexedColumns = async (table: string) => {
      const indexes = (await queryInterface.showIndex(table)) as { fields: { attribute: string }[] }[];
      return indexes.flatMap((index) => index.fields.map((field) => field.attribute));
    };
    expect(await indexedColumns("flags")).toEqual(expect.arrayContaining(["code", "severity", "comparison_id", "paper_id"]));
    expect(await indexedColumns("papers")).toEqual(expect.arrayContaining(["year", "journal", "state", "field", "doi"]));
    expect(await indexedColumns("fit_models")).toContain("estimator");
    expect(await indexedColumns("comparisons")).toContain("method");
  });

  it("0006 adds the session cutoff to users, and its down removes it keeping every person and every row that points at one", async () => {
    database = await createTestDatabase();
    const queryInterface = database.sequelize.getQueryInterface();
    expect(await queryInterface.describeTable("users")).toHaveProperty("sessions_valid_after");
    const { models } = database;
    const person = await models.User.create({ email: "kept@example.org", name: "Kept", affiliation: null, reason: null, passwordHash: "x", statusNote: null, sessionsValidAfter: new Date() });
    await models.PasswordResetToken.create({ userId: person.id, tokenHash: "a".repeat(64), expiresAt: new Date(), usedAt: null });

    await migrator(database.sequelize).down({ to: "0006-sessions-valid-after" });
    expect(await pendingMigrations(database.sequelize)).toEqual(["0006-sessions-valid-after"]);
    expect(await queryInterface.describeTable("users")).not.toHaveProperty("sessions_valid_after");
    // a table rebuild (DROP TABLE users) would have taken the reset token with it through ON DELETE CASCADE
    const [users] = await database.sequelize.query("SELECT email FROM users");
    const [tokens] = await database.sequelize.query("SELECT user_id FROM password_reset_tokens");
    expect(users).toEqual([{ email: "kept@example.org" }]);
    expect(tokens).toEqual([{ user_id: person.id }]);
    const indexes = (await queryInterface.showIndex("users")) as { unique: boolean; fields: { attribute: string }[] }[];
    expect(indexes.some((index) => index.unique && index.fields.some((field) => field.attribute === "email"))).toBe(true);

    expect(await migrateUp(database.sequelize)).toEqual(["0006-sessions-valid-after"]);
    expect(await queryInterface.describeTable("users")).toHaveProperty("sessions_valid_after");
  });
});
