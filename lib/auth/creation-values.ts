import type { Model } from "sequelize";
import type { MakeNullishOptional } from "sequelize/types/utils";

/**
 * Checks creation values the way Model.create does (optional id and timestamps) and hands them to
 * createAudited, whose parameter type lacks Sequelize's MakeNullishOptional wrapper.
 */
export function creationValues<M extends Model>(values: MakeNullishOptional<M["_creationAttributes"]>): M["_creationAttributes"] {
  return values as M["_creationAttributes"];
}
