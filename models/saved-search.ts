import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { User } from "./user";

export class SavedSearch extends Model<InferAttributes<SavedSearch>, InferCreationAttributes<SavedSearch>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<User["id"]>;
  declare name: string;
  /** the same URL query string the Explore page uses */
  declare query: string;
  declare alerts: CreationOptional<boolean>;
  declare lastNotifiedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    SavedSearch.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        userId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        query: { type: DataTypes.STRING(2000), allowNull: false },
        alerts: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        lastNotifiedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "saved_searches", underscored: true, indexes: [{ fields: ["user_id"] }] },
    );
  }
}
