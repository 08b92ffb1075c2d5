import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const ROLES = ["reader", "contributor", "curator", "admin"] as const;
export type Role = (typeof ROLES)[number];
export const ACCOUNT_STATUSES = ["pending", "active", "suspended", "declined"] as const;
export type AccountStatus = (typeof ACCOUNT_STATUSES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  declare affiliation: string | null;
  declare reason: string | null;
  declare passwordHash: string;
  declare role: CreationOptional<Role>;
  declare status: CreationOptional<AccountStatus>;
  declare statusNote: string | null;
  /** sessions that began before this instant count as signed out (lib/auth/session-cutoff.ts) */
  declare sessionsValidAfter: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: {
          type: DataTypes.STRING(320),
          allowNull: false,
          unique: true,
          validate: { isEmail: true },
          set(value: string) {
            this.setDataValue("email", value.trim().toLowerCase());
          },
        },
        name: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        affiliation: { type: DataTypes.STRING(300), allowNull: true },
        reason: { type: DataTypes.TEXT, allowNull: true },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "contributor", validate: { isIn: [ROLES] } },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "pending", validate: { isIn: [ACCOUNT_STATUSES] } },
        statusNote: { type: DataTypes.TEXT, allowNull: true },
        sessionsValidAfter: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "users",
        underscored: true,
        // A password hash must never leave lib/db by accident (STYLE habit 2).
        defaultScope: { attributes: { exclude: ["passwordHash"] } },
        scopes: { withPassword: { attributes: { include: ["passwordHash"] } } },
      },
    );
  }
}
