import { DataTypes, type ModelAttributeColumnOptions, type QueryInterface } from "sequelize";

// The first schema (DESIGN §3). A migration is frozen once it has shipped: change the schema with a new
// numbered file, never by editing this one, and never with sync().

type Columns = Record<string, ModelAttributeColumnOptions>;

const id: ModelAttributeColumnOptions = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true, allowNull: false };
const timestamps: Columns = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const references = (table: string, onDelete: "CASCADE" | "RESTRICT" | "SET NULL", allowNull = false): ModelAttributeColumnOptions => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: table, key: "id" },
  onDelete,
  onUpdate: "CASCADE",
});
const text = (length: number, allowNull = true): ModelAttributeColumnOptions => ({ type: DataTypes.STRING(length), allowNull });

/** printed text + parsed value for each figure, as in models/figures.ts at the time of this migration */
function figureColumns(figures: string[]): Columns {
  const columns: Columns = {};
  for (const figure of figures) {
    columns[`${figure}_text`] = text(40);
    columns[figure] = { type: DataTypes.DOUBLE, allowNull: true };
  }
  return columns;
}
const MODEL_FIGURES = [
  "chisq", "df", "p", "chisq_scaled", "scaling", "cfi", "tli", "rmsea", "rmsea_lo", "rmsea_hi", "srmr",
  "aic", "bic", "loglik", "loglik_scaling", "npar", "n_observed", "n_fixed_x", "baseline_chisq", "baseline_df",
];
const COMPARISON_FIGURES = ["d_chisq", "d_df", "d_p", "d_cfi", "d_rmsea", "d_aic", "d_bic"];

export async function up({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.createTable("users", {
    id,
    email: { ...text(320, false), unique: true },
    name: text(200, false),
    affiliation: text(300),
    reason: { type: DataTypes.TEXT, allowNull: true },
    password_hash: text(100, false),
    role: { ...text(20, false), defaultValue: "contributor" },
    status: { ...text(20, false), defaultValue: "pending" },
    status_note: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await queryInterface.addIndex("users", ["status"]);

  await queryInterface.createTable("papers", {
    id,
    doi: { ...text(300), unique: true },
    ref: { ...text(100), unique: true },
    title: { type: DataTypes.TEXT, allowNull: false },
    authors: { type: DataTypes.JSON, allowNull: false },
    journal: text(300),
    year: { type: DataTypes.INTEGER, allowNull: true },
    volume: text(40),
    issue: text(40),
    pages: text(40),
    csl: { type: DataTypes.JSON, allowNull: true },
    field: text(100),
    state: { ...text(20, false), defaultValue: "draft" },
    curator_comment: { type: DataTypes.TEXT, allowNull: true },
    created_by: references("users", "RESTRICT"),
    submitted_at: { type: DataTypes.DATE, allowNull: true },
    verified_by: references("users", "SET NULL", true),
    verified_at: { type: DataTypes.DATE, allowNull: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    ...timestamps,
  });
  for (const column of ["state", "year", "journal", "field", "created_by"]) await queryInterface.addIndex("papers", [column]);

  await queryInterface.createTable("samples", {
    id,
    paper_id: references("papers", "CASCADE"),
    label: text(200, false),
    n: { type: DataTypes.INTEGER, allowNull: true },
    groups: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    group_ns: { type: DataTypes.JSON, allowNull: true },
    ...timestamps,
  });
  await queryInterface.addIndex("samples", ["paper_id", "label"], { unique: true });
  await queryInterface.addIndex("samples", ["groups"]);

  await queryInterface.createTable("fit_models", {
    id,
    sample_id: references("samples", "CASCADE"),
    paper_id: references("papers", "CASCADE"),
    label: text(200, false),
    estimator: text(10),
    mean_structure: { type: DataTypes.BOOLEAN, allowNull: true },
    ...figureColumns(MODEL_FIGURES),
    ...timestamps,
  });
  await queryInterface.addIndex("fit_models", ["sample_id", "label"], { unique: true });
  await queryInterface.addIndex("fit_models", ["estimator"]);
  await queryInterface.addIndex("fit_models", ["paper_id"]);

  await queryInterface.createTable("comparisons", {
    id,
    sample_id: references("samples", "CASCADE"),
    paper_id: references("papers", "CASCADE"),
    label: text(200, false),
    restricted_model_id: references("fit_models", "RESTRICT"),
    free_model_id: references("fit_models", "RESTRICT"),
    method: text(20, false),
    nested: { ...text(10, false), defaultValue: "unknown" },
    alpha_text: text(20),
    alpha: { type: DataTypes.DOUBLE, allowNull: true },
    location: text(300),
    ...figureColumns(COMPARISON_FIGURES),
    preferred: text(10),
    invariance_claimed: { ...text(10, false), defaultValue: "n/a" },
    notes: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await queryInterface.addIndex("comparisons", ["sample_id", "label"], { unique: true });
  await queryInterface.addIndex("comparisons", ["method"]);
  await queryInterface.addIndex("comparisons", ["paper_id"]);

  await queryInterface.createTable("flags", {
    id,
    paper_id: references("papers", "CASCADE"),
    comparison_id: references("comparisons", "CASCADE", true),
    model_id: references("fit_models", "CASCADE", true),
    subject: text(12, false),
    code: text(60, false),
    severity: text(10, false),
    message: { type: DataTypes.TEXT, allowNull: false },
    values: { type: DataTypes.JSON, allowNull: false },
    fingerprint: text(64, false),
    engine_version: text(20, false),
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  for (const column of ["code", "severity", "comparison_id", "paper_id", "model_id"]) await queryInterface.addIndex("flags", [column]);

  await queryInterface.createTable("flag_dispositions", {
    id,
    paper_id: references("papers", "CASCADE"),
    comparison_id: references("comparisons", "CASCADE", true),
    fingerprint: text(64, false),
    code: text(60, false),
    verdict: text(20, false),
    note: { type: DataTypes.TEXT, allowNull: true },
    link: text(1000),
    curator_id: references("users", "RESTRICT"),
    ...timestamps,
  });
  await queryInterface.addIndex("flag_dispositions", ["paper_id", "fingerprint"], { unique: true });
  await queryInterface.addIndex("flag_dispositions", ["verdict"]);

  await queryInterface.createTable("audit_events", {
    id,
    actor_id: references("users", "SET NULL", true),
    entity: text(40, false),
    entity_id: text(64, false),
    action: text(40, false),
    before: { type: DataTypes.JSON, allowNull: true },
    after: { type: DataTypes.JSON, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex("audit_events", ["entity", "entity_id"]);
  await queryInterface.addIndex("audit_events", ["actor_id"]);
  await queryInterface.addIndex("audit_events", ["created_at"]);

  await queryInterface.createTable("import_batches", {
    id,
    uploader_id: references("users", "RESTRICT"),
    file_name: text(300, false),
    status: { ...text(20, false), defaultValue: "validating" },
    total_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    accepted_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    rejected_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    row_errors: { type: DataTypes.JSON, allowNull: false },
    progress: { type: DataTypes.JSON, allowNull: false },
    failure: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await queryInterface.addIndex("import_batches", ["uploader_id"]);

  await queryInterface.createTable("outbox_messages", {
    id,
    to: text(320, false),
    subject: text(300, false),
    text: { type: DataTypes.TEXT, allowNull: false },
    html: { type: DataTypes.TEXT, allowNull: true },
    kind: text(40, false),
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    last_error: { type: DataTypes.TEXT, allowNull: true },
    next_attempt_at: { type: DataTypes.DATE, allowNull: false },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await queryInterface.addIndex("outbox_messages", ["sent_at", "next_attempt_at"]);

  await queryInterface.createTable("saved_searches", {
    id,
    user_id: references("users", "CASCADE"),
    name: text(200, false),
    query: text(2000, false),
    alerts: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    last_notified_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await queryInterface.addIndex("saved_searches", ["user_id"]);

  await queryInterface.createTable("settings", {
    key: { type: DataTypes.STRING(100), primaryKey: true, allowNull: false },
    value: { type: DataTypes.JSON, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  for (const table of [
    "settings", "saved_searches", "outbox_messages", "import_batches", "audit_events", "flag_dispositions",
    "flags", "comparisons", "fit_models", "samples", "papers", "users",
  ]) {
    await queryInterface.dropTable(table);
  }
}
