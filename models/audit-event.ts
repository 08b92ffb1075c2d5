import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { User } from "./user";

/** Who changed what, when, with the row before and after. Written by lib/db/audit.ts only. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  /** null for the system (seeding, migrations, the sender loop) */
  declare actorId: ForeignKey<User["id"]> | null;
  declare entity: string;
  declare entityId: string;
  declare action: string;
  declare before: Record<string, unknown> | null;
  declare after: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    AuditEvent.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        actorId: { type: DataTypes.INTEGER, allowNull: true },
        entity: { type: DataTypes.STRING(40), allowNull: false },
        entityId: { type: DataTypes.STRING(64), allowNull: false },
        action: { type: DataTypes.STRING(40), allowNull: false },
        before: { type: DataTypes.JSON, allowNull: true },
        after: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "audit_events",
        underscored: true,
        updatedAt: false,
        indexes: [{ fields: ["entity", "entity_id"] }, { fields: ["actor_id"] }, { fields: ["created_at"] }],
      },
    );
  }
}
