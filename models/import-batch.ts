import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { User } from "./user";

export const IMPORT_STATUSES = ["validating", "previewed", "committing", "committed", "failed"] as const;
export type ImportStatus = (typeof IMPORT_STATUSES)[number];

export interface ImportRowError {
  row: number;
  column: string | null;
  message: string;
}

export class ImportBatch extends Model<InferAttributes<ImportBatch>, InferCreationAttributes<ImportBatch>> {
  declare id: CreationOptional<number>;
  declare uploaderId: ForeignKey<User["id"]>;
  declare fileName: string;
  declare status: CreationOptional<ImportStatus>;
  declare totalRows: CreationOptional<number>;
  declare acceptedRows: CreationOptional<number>;
  declare rejectedRows: CreationOptional<number>;
  declare rowErrors: CreationOptional<ImportRowError[]>;
  /** counts and progress of the phases (read, validated, stored), for the progress display */
  declare progress: CreationOptional<Record<string, number>>;
  declare failure: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    ImportBatch.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        uploaderId: { type: DataTypes.INTEGER, allowNull: false },
        fileName: { type: DataTypes.STRING(300), allowNull: false },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "validating", validate: { isIn: [IMPORT_STATUSES] } },
        totalRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        acceptedRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        rejectedRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        rowErrors: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        progress: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
        failure: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "import_batches", underscored: true, indexes: [{ fields: ["uploader_id"] }] },
    );
  }
}
