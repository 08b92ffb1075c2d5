import { DataTypes, type QueryInterface } from "sequelize";

// The sheet importer (issue 6). An upload is kept in the database, in the order it arrived, so that the
// dry run and the commit read the same bytes on whichever app instance serves them (DESIGN §10); the
// preview keeps one line per sheet row; DOI lookups of newly imported papers are queued jobs whose
// failures stay listed until retried.

const id = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true, allowNull: false };
const batch = { type: DataTypes.INTEGER, allowNull: false, references: { model: "import_batches", key: "id" }, onDelete: "CASCADE", onUpdate: "CASCADE" };

export async function up({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.createTable("import_chunks", {
    id,
    batch_id: batch,
    seq: { type: DataTypes.INTEGER, allowNull: false },
    bytes: { type: DataTypes.BLOB, allowNull: false },
  });
  await queryInterface.addIndex("import_chunks", ["batch_id", "seq"], { unique: true });

  await queryInterface.createTable("import_rows", {
    id,
    batch_id: batch,
    row: { type: DataTypes.INTEGER, allowNull: false },
    outcome: { type: DataTypes.STRING(12), allowNull: false },
    paper: { type: DataTypes.STRING(300), allowNull: true },
    sample: { type: DataTypes.STRING(200), allowNull: true },
    comparison: { type: DataTypes.STRING(200), allowNull: true },
    details: { type: DataTypes.JSON, allowNull: false },
  });
  await queryInterface.addIndex("import_rows", ["batch_id", "row"]);

  await queryInterface.createTable("doi_lookups", {
    id,
    batch_id: { ...batch, allowNull: true, onDelete: "SET NULL" },
    paper_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "papers", key: "id" }, onDelete: "CASCADE", onUpdate: "CASCADE" },
    doi: { type: DataTypes.STRING(300), allowNull: false },
    status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "pending" },
    reason: { type: DataTypes.STRING(20), allowNull: true },
    message: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex("doi_lookups", ["batch_id"]);
  await queryInterface.addIndex("doi_lookups", ["status"]);
  await queryInterface.addIndex("doi_lookups", ["paper_id"]);
}

export async function down({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.dropTable("doi_lookups");
  await queryInterface.dropTable("import_rows");
  await queryInterface.dropTable("import_chunks");
}
