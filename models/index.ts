import type { Sequelize } from "sequelize";
import { AuditEvent } from "./audit-event";
import { Comparison } from "./comparison";
import { Correction } from "./correction";
import { DoiLookup } from "./doi-lookup";
import { FitModel } from "./fit-model";
import { Flag } from "./flag";
import { FlagDisposition } from "./flag-disposition";
import { ImportBatch } from "./import-batch";
import { ImportChunk } from "./import-chunk";
import { ImportRow } from "./import-row";
import { OutboxMessage } from "./outbox-message";
import { Paper } from "./paper";
import { PasswordResetToken } from "./password-reset-token";
import { Sample } from "./sample";
import { SavedSearch } from "./saved-search";
import { Setting } from "./setting";
import { User } from "./user";

export { AuditEvent, Comparison, Correction, DoiLookup, FitModel, Flag, FlagDisposition, ImportBatch, ImportChunk, ImportRow, OutboxMessage, Paper, PasswordResetToken, Sample, SavedSearch, Setting, User };

export const models = { AuditEvent, Comparison, Correction, DoiLookup, FitModel, Flag, FlagDisposition, ImportBatch, ImportChunk, ImportRow, OutboxMessage, Paper, PasswordResetToken, Sample, SavedSearch, Setting, User };
export type Models = typeof models;

/** Initialises every model on one Sequelize instance and wires the associations (DESIGN §3). */
export function initModels(sequelize: Sequelize): Models {
  for (const model of Object.values(models)) model.initialise(sequelize);

  User.hasMany(Paper, { foreignKey: "createdBy", as: "papers" });
  Paper.belongsTo(User, { foreignKey: "createdBy", as: "coder" });
  Paper.belongsTo(User, { foreignKey: "verifiedBy", as: "verifier" });

  Paper.hasMany(Sample, { foreignKey: "paperId", as: "samples", onDelete: "CASCADE" });
  Sample.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });

  Sample.hasMany(FitModel, { foreignKey: "sampleId", as: "models", onDelete: "CASCADE" });
  FitModel.belongsTo(Sample, { foreignKey: "sampleId", as: "sample" });
  Paper.hasMany(FitModel, { foreignKey: "paperId", as: "models" });
  FitModel.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });

  Sample.hasMany(Comparison, { foreignKey: "sampleId", as: "comparisons", onDelete: "CASCADE" });
  Comparison.belongsTo(Sample, { foreignKey: "sampleId", as: "sample" });
  Paper.hasMany(Comparison, { foreignKey: "paperId", as: "comparisons" });
  Comparison.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });
  Comparison.belongsTo(FitModel, { foreignKey: "restrictedModelId", as: "restrictedModel" });
  Comparison.belongsTo(FitModel, { foreignKey: "freeModelId", as: "freeModel" });

  Comparison.hasMany(Flag, { foreignKey: "comparisonId", as: "flags", onDelete: "CASCADE" });
  Flag.belongsTo(Comparison, { foreignKey: "comparisonId", as: "comparison" });
  FitModel.hasMany(Flag, { foreignKey: "modelId", as: "flags", onDelete: "CASCADE" });
  Flag.belongsTo(FitModel, { foreignKey: "modelId", as: "model" });
  Paper.hasMany(Flag, { foreignKey: "paperId", as: "flags" });
  Flag.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });

  Paper.hasMany(FlagDisposition, { foreignKey: "paperId", as: "dispositions" });
  FlagDisposition.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });
  FlagDisposition.belongsTo(User, { foreignKey: "curatorId", as: "curator" });

  AuditEvent.belongsTo(User, { foreignKey: "actorId", as: "actor" });
  Paper.hasMany(Correction, { foreignKey: "paperId", as: "corrections" });
  Correction.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });
  ImportBatch.belongsTo(User, { foreignKey: "uploaderId", as: "uploader" });
  ImportBatch.hasMany(ImportChunk, { foreignKey: "batchId", as: "chunks", onDelete: "CASCADE" });
  ImportBatch.hasMany(ImportRow, { foreignKey: "batchId", as: "rows", onDelete: "CASCADE" });
  DoiLookup.belongsTo(Paper, { foreignKey: "paperId", as: "paper" });
  User.hasMany(SavedSearch, { foreignKey: "userId", as: "savedSearches" });
  SavedSearch.belongsTo(User, { foreignKey: "userId", as: "user" });
  PasswordResetToken.belongsTo(User, { foreignKey: "userId", as: "user", onDelete: "CASCADE" });

  return models;
}
