import { DataTypes, type QueryInterface } from "sequelize";

// Corrections sent from a public paper page (issue 5, DESIGN §9: authors get a way to send a correction).
// Stored so none is lost when mail fails; curators are told through the outbox. The sender's network
// address is kept only as a SHA-256 digest, for rate limiting and abuse review.

export async function up({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.createTable("corrections", {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true, allowNull: false },
    paper_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "papers", key: "id" }, onDelete: "CASCADE", onUpdate: "CASCADE" },
    name: { type: DataTypes.STRING(200), allowNull: false },
    email: { type: DataTypes.STRING(320), allowNull: false },
    message: { type: DataTypes.TEXT, allowNull: false },
    address_hash: { type: DataTypes.STRING(64), allowNull: true },
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "open" },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex("corrections", ["paper_id"]);
  await queryInterface.addIndex("corrections", ["status", "created_at"]);
}

export async function down({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.dropTable("corrections");
}
