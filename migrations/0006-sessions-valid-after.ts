import { DataTypes, type QueryInterface } from "sequelize";

// Ending sessions (DESIGN §2): a JWT whose session began before users.sessions_valid_after counts as
// signed out. Set by a password reset or change, a suspension and a decline; null while nothing has
// ended a person's sessions.

export async function up({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.addColumn("users", "sessions_valid_after", { type: DataTypes.DATE, allowNull: true });
}

export async function down({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  // Not removeColumn: on SQLite it rebuilds the table (copy, DROP TABLE users, create, copy back), and
  // dropping users cascades into every table that references it. DROP COLUMN is plain SQL on SQLite
  // 3.35+ and on PostgreSQL.
  await queryInterface.sequelize.query("ALTER TABLE users DROP COLUMN sessions_valid_after");
}
