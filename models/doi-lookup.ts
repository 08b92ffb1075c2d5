import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { ImportBatch } from "./import-batch";
import type { Paper } from "./paper";

export const DOI_LOOKUP_STATUSES = ["pending", "resolved", "failed"] as const;
export type DoiLookupStatus = (typeof DOI_LOOKUP_STATUSES)[number];

/** A background lookup of a newly imported paper's DOI metadata; a failure stays listed until retried. */
export class DoiLookup extends Model<InferAttributes<DoiLookup>, InferCreationAttributes<DoiLookup>> {
  declare id: CreationOptional<number>;
  declare batchId: ForeignKey<ImportBatch["id"]> | null;
  declare paperId: ForeignKey<Paper["id"]>;
  declare doi: string;
  declare status: CreationOptional<DoiLookupStatus>;
  /** not_found | timeout | malformed | unreachable (lib/doi), or "error" for anything else */
  declare reason: string | null;
  declare message: string | null;
  declare attempts: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    DoiLookup.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        batchId: { type: DataTypes.INTEGER, allowNull: true },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        doi: { type: DataTypes.STRING(300), allowNull: false },
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "pending", validate: { isIn: [DOI_LOOKUP_STATUSES] } },
        reason: { type: DataTypes.STRING(20), allowNull: true },
        message: { type: DataTypes.TEXT, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "doi_lookups", underscored: true, indexes: [{ fields: ["batch_id"] }, { fields: ["status"] }, { fields: ["paper_id"] }] },
    );
  }
}
