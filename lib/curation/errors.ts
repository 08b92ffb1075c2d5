import { UniqueConstraintError, ValidationError } from "sequelize";
import { AppError } from "@/lib/errors";

/** Database refusals a form can explain, turned into the one error type; anything else is rethrown. */
export function explainDatabaseError(error: unknown, context: { doiField?: string } = {}): never {
  if (error instanceof UniqueConstraintError) {
    const fields = error.errors.map((item) => item.path ?? "");
    if (fields.includes("doi")) throw new AppError("conflict", "A paper with this DOI is already in the corpus.", { fields: { [context.doiField ?? "doi"]: ["A paper with this DOI is already in the corpus."] } });
    if (fields.includes("ref")) throw new AppError("conflict", "Another paper uses this reference.", { fields: { ref: ["Another paper uses this reference."] } });
    throw new AppError("conflict", "Two rows of this paper would have the same name; rename one and save again.");
  }
  if (error instanceof ValidationError) throw new AppError("validation_failed", error.errors[0]?.message ?? "Some fields need attention.");
  throw error;
}
