import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { Paper } from "./paper";

export class Sample extends Model<InferAttributes<Sample>, InferCreationAttributes<Sample>> {
  declare id: CreationOptional<number>;
  declare paperId: ForeignKey<Paper["id"]>;
  declare label: string;
  /** total N over all groups, as printed */
  declare n: number | null;
  declare groups: CreationOptional<number>;
  declare groupNs: number[] | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    Sample.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        paperId: { type: DataTypes.INTEGER, allowNull: false },
        label: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "Sample 1", validate: { len: [1, 200] } },
        n: { type: DataTypes.INTEGER, allowNull: true, validate: { min: 1 } },
        groups: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1, validate: { min: 1 } },
        groupNs: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "samples",
        underscored: true,
        indexes: [{ unique: true, fields: ["paper_id", "label"] }],
      },
    );
  }
}
