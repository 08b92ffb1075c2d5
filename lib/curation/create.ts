import "server-only";
import { db, createAudited } from "@/lib/db";
import { AppError } from "@/lib/errors";
import type { z } from "zod";
import type { newPaperSchema } from "@/lib/validation/curation";
import type { EntryState } from "@/models/paper";
import type { Actor } from "./rules";
import { explainDatabaseError } from "./errors";
import { makeRef, metadataColumns } from "./metadata";

export type NewPaperInput = z.output<typeof newPaperSchema>;

export type CreateOutcome = { created: true; paperId: number } | { created: false; existingPaperId: number; state: EntryState; createdBy: number };

/** A new draft paper; a DOI already in the corpus gives back the existing paper instead of a duplicate. */
export async function createPaper(input: NewPaperInput, actor: Actor): Promise<CreateOutcome> {
  const { models, sequelize } = await db();
  const columns = metadataColumns(input);
  if (columns.doi) {
    const existing = await models.Paper.findOne({ where: { doi: columns.doi }, attributes: ["id", "state", "createdBy"] });
    if (existing) return { created: false, existingPaperId: existing.id, state: existing.state, createdBy: existing.createdBy };
  }
  let csl: Record<string, unknown> | null = null;
  if (input.csl) {
    const { _graph, ...rest } = JSON.parse(input.csl) as Record<string, unknown>;
    void _graph; // citation-js's parse history: not part of the record
    csl = rest;
  }
  try {
    return await sequelize.transaction(async (transaction) => {
      const paper = await createAudited(
        models.Paper,
        { ...columns, ref: columns.doi ? columns.ref : (columns.ref ?? makeRef(columns)), csl, state: "draft", curatorComment: null, createdBy: actor.id, submittedAt: null, verifiedBy: null, verifiedAt: null },
        { actorId: actor.id, transaction },
      );
      return { created: true as const, paperId: paper.id };
    });
  } catch (error) {
    if (error instanceof AppError) throw error;
    explainDatabaseError(error);
  }
}
