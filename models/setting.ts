import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** Admin-configurable settings (recheck alpha and cutoffs, DESIGN §4.4), one JSON value per key. */
export class Setting extends Model<InferAttributes<Setting>, InferCreationAttributes<Setting>> {
  declare key: string;
  declare value: unknown;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    Setting.init(
      {
        key: { type: DataTypes.STRING(100), primaryKey: true },
        value: { type: DataTypes.JSON, allowNull: false },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "settings", underscored: true, createdAt: false },
    );
  }
}
