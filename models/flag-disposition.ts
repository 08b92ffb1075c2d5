import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { Comparison } from "./comparison";
import type { Paper } from "./paper";
import type { User } from "./user";

export const VERDICTS = ["confirmed", "coding_error", "explained", "engine_limitation"] as const;
export type Verdict = (typeof VERDICTS)[number];

/**
 * A curator's verdict on a finding. Flags are rewritten on every recheck, so the verdict is keyed by
 * the finding's fingerprint (code, subject, figures), not by a flag row: it survives a recheck as long
 * as the finding itself is unchanged.
 */
export class FlagDisposition extends Model<InferAttributes<FlagDisposition>, InferCreationAttributes<FlagDisposition>> {
  declare id: CreationOptional<number>;
  declare paperId: ForeignKey<Paper["id"]>;
  declare comparisonId: ForeignKey<Comparison["id"]> | null;
  declare fingerprint: string;
  declare code: string;
  declare verdict: Verdict;
  declare note: string | null;
  declare link: string | null;
  declare curatorId: ForeignKey<User["id"]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    FlagDisposition.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        comparisonId: { type: DataTypes.INTEGER, allowNull: true },
        fingerprint: { type: DataTypes.STRING(64), allowNull: false },
        code: { type: DataTypes.STRING(60), allowNull: false },
        verdict: { type: DataTypes.STRING(20), allowNull: false, validate: { isIn: [VERDICTS] } },
        note: { type: DataTypes.TEXT, allowNull: true },
        link: { type: DataTypes.STRING(1000), allowNull: true, validate: { isUrl: true } },
        curatorId: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "flag_dispositions",
        underscored: true,
        indexes: [{ unique: true, fields: ["paper_id", "fingerprint"] }, { fields: ["verdict"] }],
      },
    );
  }
}
