import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type ModelAttributeColumnOptions, type Sequelize } from "sequelize";
import { ESTIMATORS, type Estimator } from "@/lib/recheck/types";
import { MODEL_FIGURES, textAttribute, type ModelFigure } from "./figures";
import type { Paper } from "./paper";
import type { Sample } from "./sample";

/** `chisq` (parsed number) and `chisqText` (as printed) for every reported figure. */
export type FigureColumns<F extends string> = { [K in F]: number | null } & { [K in F as `${K}Text`]: string | null };

export function figureAttributes<F extends string>(figures: readonly F[]): Record<F | `${F}Text`, ModelAttributeColumnOptions> {
  const attributes: Record<string, ModelAttributeColumnOptions> = {};
  for (const figure of figures) {
    attributes[textAttribute(figure)] = { type: DataTypes.STRING(40), allowNull: true };
    attributes[figure] = { type: DataTypes.DOUBLE, allowNull: true };
  }
  return attributes as Record<F | `${F}Text`, ModelAttributeColumnOptions>;
}

// The figure columns are declared through an interface merged with the class, so the twenty printed
// figures are typed without being spelled out twice.
// eslint-disable-next-line @typescript-eslint/no-unsafe-declaration-merging, @typescript-eslint/no-empty-object-type
export interface FitModel extends FigureColumns<ModelFigure> {}

/** A reported fitted model ("Model" in DESIGN §3; renamed so it never shadows Sequelize's Model). */
// eslint-disable-next-line @typescript-eslint/no-unsafe-declaration-merging
export class FitModel extends Model<InferAttributes<FitModel>, InferCreationAttributes<FitModel>> {
  declare id: CreationOptional<number>;
  declare sampleId: ForeignKey<Sample["id"]>;
  /** denormalised from the sample, for per-paper reads and the identity key of §5 */
  declare paperId: ForeignKey<Paper["id"]>;
  declare label: string;
  declare estimator: Estimator | null;
  declare meanStructure: boolean | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    FitModel.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        sampleId: { type: DataTypes.INTEGER, allowNull: false },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        label: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        estimator: { type: DataTypes.STRING(10), allowNull: true, validate: { isIn: [ESTIMATORS] } },
        meanStructure: { type: DataTypes.BOOLEAN, allowNull: true },
        ...figureAttributes(MODEL_FIGURES),
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "fit_models",
        underscored: true,
        indexes: [{ unique: true, fields: ["sample_id", "label"] }, { fields: ["estimator"] }, { fields: ["paper_id"] }],
      },
    );
  }
}
