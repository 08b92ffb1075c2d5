import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import { DOI_PATTERN, stripDoi } from "@/lib/doi/normalise";
import type { User } from "./user";

export const ENTRY_STATES = ["draft", "submitted", "returned", "verified"] as const;
export type EntryState = (typeof ENTRY_STATES)[number];

/** A CSL name: family/given, or a literal for organisations. */
export interface CslName {
  family?: string;
  given?: string;
  literal?: string;
  "non-dropping-particle"?: string;
  "dropping-particle"?: string;
  suffix?: string;
}

export { DOI_PATTERN, normaliseDoi } from "@/lib/doi/normalise";

export class Paper extends Model<InferAttributes<Paper>, InferCreationAttributes<Paper>> {
  declare id: CreationOptional<number>;
  declare doi: string | null;
  declare ref: string | null;
  declare title: string;
  declare authors: CslName[];
  declare journal: string | null;
  declare year: number | null;
  declare volume: string | null;
  declare issue: string | null;
  declare pages: string | null;
  declare csl: Record<string, unknown> | null;
  declare field: string | null;
  declare state: CreationOptional<EntryState>;
  declare curatorComment: string | null;
  declare createdBy: ForeignKey<User["id"]>;
  declare submittedAt: Date | null;
  declare verifiedBy: ForeignKey<User["id"]> | null;
  declare verifiedAt: Date | null;
  /** optimistic concurrency: bumped on every save of the paper's coding */
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initialise(sequelize: Sequelize) {
    Paper.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        doi: {
          type: DataTypes.STRING(300),
          allowNull: true,
          unique: true,
          set(value: string | null) {
            // stored in normal form; a value that is not a DOI is kept as typed, so validation names it
            this.setDataValue("doi", value ? stripDoi(value) : null);
          },
          validate: { is: { args: DOI_PATTERN, msg: "A DOI looks like 10.5555/abc-123" } },
        },
        ref: { type: DataTypes.STRING(100), allowNull: true, unique: true },
        title: { type: DataTypes.TEXT, allowNull: false, validate: { len: [1, 2000] } },
        authors: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        journal: { type: DataTypes.STRING(300), allowNull: true },
        year: { type: DataTypes.INTEGER, allowNull: true, validate: { min: 1900, max: 2100 } },
        volume: { type: DataTypes.STRING(40), allowNull: true },
        issue: { type: DataTypes.STRING(40), allowNull: true },
        pages: { type: DataTypes.STRING(40), allowNull: true },
        csl: { type: DataTypes.JSON, allowNull: true },
        field: { type: DataTypes.STRING(100), allowNull: true },
        state: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "draft", validate: { isIn: [ENTRY_STATES] } },
        curatorComment: { type: DataTypes.TEXT, allowNull: true },
        createdBy: { type: DataTypes.INTEGER, allowNull: false },
        submittedAt: { type: DataTypes.DATE, allowNull: true },
        verifiedBy: { type: DataTypes.INTEGER, allowNull: true },
        verifiedAt: { type: DataTypes.DATE, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: "papers",
        underscored: true,
        validate: {
          doiOrRef(this: Paper) {
            if (!this.doi && !this.ref) throw new Error("A paper needs a DOI or a curator reference (ref)");
          },
        },
      },
    );
  }
}
