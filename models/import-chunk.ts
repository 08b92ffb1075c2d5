import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { ImportBatch } from "./import-batch";

/** One piece of an uploaded sheet, in arrival order (`seq`), so the dry run and the commit read the same bytes. */
export class ImportChunk extends Model<InferAttributes<ImportChunk>, InferCreationAttributes<ImportChunk>> {
  declare id: CreationOptional<number>;
  declare batchId: ForeignKey<ImportBatch["id"]>;
  declare seq: number;
  declare bytes: Buffer;

  static initialise(sequelize: Sequelize) {
    ImportChunk.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        batchId: { type: DataTypes.INTEGER, allowNull: false },
        seq: { type: DataTypes.INTEGER, allowNull: false },
        bytes: { type: DataTypes.BLOB, allowNull: false },
      },
      { sequelize, tableName: "import_chunks", underscored: true, timestamps: false, indexes: [{ unique: true, fields: ["batch_id", "seq"] }] },
    );
  }
}
