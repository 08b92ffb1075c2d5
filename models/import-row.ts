import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { ImportBatch } from "./import-batch";

export const IMPORT_ROW_OUTCOMES = ["new", "updated", "unchanged", "rejected"] as const;
export type ImportRowOutcome = (typeof IMPORT_ROW_OUTCOMES)[number];

export interface ImportRowDetails {
  /** cells that stopped the row (rejected rows) */
  errors?: { column: string | null; message: string }[];
  /** what the recheck engine would say about the comparison (accepted rows) */
  findings?: { code: string; severity: string; message: string }[];
  /** a text cell that starts like a spreadsheet formula: kept as text, never evaluated */
  notes?: string[];
}

/** The dry run's verdict on one sheet row, for the preview (the first rows of a batch; see lib/import). */
export class ImportRow extends Model<InferAttributes<ImportRow>, InferCreationAttributes<ImportRow>> {
  declare id: CreationOptional<number>;
  declare batchId: ForeignKey<ImportBatch["id"]>;
  declare row: number;
  declare outcome: ImportRowOutcome;
  declare paper: string | null;
  declare sample: string | null;
  declare comparison: string | null;
  declare details: ImportRowDetails;

  static initialise(sequelize: Sequelize) {
    ImportRow.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        batchId: { type: DataTypes.INTEGER, allowNull: false },
        row: { type: DataTypes.INTEGER, allowNull: false },
        outcome: { type: DataTypes.STRING(12), allowNull: false, validate: { isIn: [IMPORT_ROW_OUTCOMES] } },
        paper: { type: DataTypes.STRING(300), allowNull: true },
        sample: { type: DataTypes.STRING(200), allowNull: true },
        comparison: { type: DataTypes.STRING(200), allowNull: true },
        details: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
      },
      { sequelize, tableName: "import_rows", underscored: true, timestamps: false, indexes: [{ fields: ["batch_id", "row"] }] },
    );
  }
}
