import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import { SEVERITIES, type Severity } from "@/lib/recheck/types";
import type { Comparison } from "./comparison";
import type { FitModel } from "./fit-model";
import type { Paper } from "./paper";

export const FLAG_SUBJECTS = ["comparison", "a", "b", "model"] as const;
export type FlagSubject = (typeof FLAG_SUBJECTS)[number];

/** One finding of the recheck engine, rewritten whenever the entry or the engine changes. */
export class Flag extends Model<InferAttributes<Flag>, InferCreationAttributes<Flag>> {
  declare id: CreationOptional<number>;
  declare paperId: ForeignKey<Paper["id"]>;
  declare comparisonId: ForeignKey<Comparison["id"]> | null;
  declare modelId: ForeignKey<FitModel["id"]> | null;
  declare subject: FlagSubject;
  declare code: string;
  declare severity: Severity;
  declare message: string;
  declare values: Record<string, unknown>;
  /** stable digest of code, subject and figures: a disposition applies while this is unchanged */
  declare fingerprint: string;
  declare engineVersion: string;
  declare createdAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    Flag.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        comparisonId: { type: DataTypes.INTEGER, allowNull: true },
        modelId: { type: DataTypes.INTEGER, allowNull: true },
        subject: { type: DataTypes.STRING(12), allowNull: false, validate: { isIn: [FLAG_SUBJECTS] } },
        code: { type: DataTypes.STRING(60), allowNull: false },
        severity: { type: DataTypes.STRING(10), allowNull: false, validate: { isIn: [SEVERITIES] } },
        message: { type: DataTypes.TEXT, allowNull: false },
        values: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
        fingerprint: { type: DataTypes.STRING(64), allowNull: false },
        engineVersion: { type: DataTypes.STRING(20), allowNull: false },
        createdAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "flags",
        underscored: true,
        updatedAt: false,
        indexes: [{ fields: ["code"] }, { fields: ["severity"] }, { fields: ["comparison_id"] }, { fields: ["paper_id"] }, { fields: ["model_id"] }],
      },
    );
  }
}
