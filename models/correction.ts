import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { Paper } from "./paper";

export const CORRECTION_STATUSES = ["open", "closed"] as const;
export type CorrectionStatus = (typeof CORRECTION_STATUSES)[number];

/** A correction sent by anyone from a verified paper's public page (DESIGN §9). */
export class Correction extends Model<InferAttributes<Correction>, InferCreationAttributes<Correction>> {
  declare id: CreationOptional<number>;
  declare paperId: ForeignKey<Paper["id"]>;
  declare name: string;
  declare email: string;
  declare message: string;
  /** SHA-256 of the sender's network address, never the address itself */
  declare addressHash: string | null;
  declare status: CreationOptional<CorrectionStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    Correction.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        email: { type: DataTypes.STRING(320), allowNull: false, validate: { isEmail: true } },
        message: { type: DataTypes.TEXT, allowNull: false, validate: { len: [1, 5000] } },
        addressHash: { type: DataTypes.STRING(64), allowNull: true },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "open", validate: { isIn: [CORRECTION_STATUSES] } },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "corrections", underscored: true, indexes: [{ fields: ["paper_id"] }, { fields: ["status", "created_at"] }] },
    );
  }
}
