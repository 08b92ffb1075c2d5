import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import { INVARIANCE_CLAIMS, METHODS, NESTED_VALUES, PREFERRED_VALUES, type InvarianceClaim, type Method, type Nested, type Preferred } from "@/lib/recheck/types";
import { COMPARISON_FIGURES, type ComparisonFigure } from "./figures";
import { figureAttributes, type FigureColumns, type FitModel } from "./fit-model";
import type { Paper } from "./paper";
import type { Sample } from "./sample";

// eslint-disable-next-line @typescript-eslint/no-unsafe-declaration-merging, @typescript-eslint/no-empty-object-type
export interface Comparison extends FigureColumns<ComparisonFigure> {}

// eslint-disable-next-line @typescript-eslint/no-unsafe-declaration-merging
export class Comparison extends Model<InferAttributes<Comparison>, InferCreationAttributes<Comparison>> {
  declare id: CreationOptional<number>;
  declare sampleId: ForeignKey<Sample["id"]>;
  declare paperId: ForeignKey<Paper["id"]>;
  declare label: string;
  /** model A: the restricted model (more df) */
  declare restrictedModelId: ForeignKey<FitModel["id"]>;
  /** model B: the free model (fewer df) */
  declare freeModelId: ForeignKey<FitModel["id"]>;
  declare method: Method;
  declare nested: CreationOptional<Nested>;
  declare alphaText: string | null;
  declare alpha: number | null;
  declare location: string | null;
  declare preferred: Preferred | null;
  declare invarianceClaimed: CreationOptional<InvarianceClaim>;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    Comparison.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        sampleId: { type: DataTypes.INTEGER, allowNull: false },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        label: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        restrictedModelId: { type: DataTypes.INTEGER, allowNull: false },
        freeModelId: { type: DataTypes.INTEGER, allowNull: false },
        method: { type: DataTypes.STRING(20), allowNull: false, validate: { isIn: [METHODS] } },
        nested: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "unknown", validate: { isIn: [NESTED_VALUES] } },
        alphaText: { type: DataTypes.STRING(20), allowNull: true },
        alpha: { type: DataTypes.DOUBLE, allowNull: true },
        location: { type: DataTypes.STRING(300), allowNull: true },
        ...figureAttributes(COMPARISON_FIGURES),
        preferred: { type: DataTypes.STRING(10), allowNull: true, validate: { isIn: [PREFERRED_VALUES] } },
        invarianceClaimed: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "n/a", validate: { isIn: [INVARIANCE_CLAIMS] } },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "comparisons",
        underscored: true,
        indexes: [{ unique: true, fields: ["sample_id", "label"] }, { fields: ["method"] }, { fields: ["paper_id"] }],
        validate: {
          twoDifferentModels(this: Comparison) {
            if (this.restrictedModelId === this.freeModelId) throw new Error("A comparison needs two different models");
          },
        },
      },
    );
  }
}
