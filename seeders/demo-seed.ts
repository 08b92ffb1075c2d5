// Writes the demo corpus and the demo accounts. Idempotent: accounts are matched by e-mail and papers by
// DOI, so running it twice changes nothing. Every write goes through the audited helpers.
import bcrypt from "bcryptjs";
import type { CreationAttributes } from "sequelize";
import type { Comparison, FitModel } from "@/models";
import type { Database } from "@/lib/db/connection";
import { createAudited } from "@/lib/db/audit";
import { readRecheckSettings, rewriteFlagsForPaper } from "@/lib/db/flags";
import { figureColumns } from "@/lib/curation/figure-columns";
import { COMPARISON_FIGURES, MODEL_FIGURES } from "@/models/figures";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, demoCorpus } from "./demo/corpus";
import type { DemoPaper } from "./demo/types";

export { figureColumns };

export interface SeedSummary {
  accountsCreated: number;
  papersCreated: number;
  comparisonsCreated: number;
  flagsWritten: number;
}

/** Entry dates spread over the two years before the demo (mid-2024 to early 2026), never in the future. */
function dayOf(index: number, offsetDays: number): Date {
  return new Date(Date.UTC(2024, 5, 1) + (index * 4 + offsetDays) * 86_400_000);
}

async function seedPaper(database: Database, paper: DemoPaper, index: number, users: Map<string, number>, settings: Awaited<ReturnType<typeof readRecheckSettings>>): Promise<{ comparisons: number; flags: number }> {
  const { models, sequelize } = database;
  return sequelize.transaction(async (transaction) => {
    const context = { actorId: null, transaction, action: "seed" };
    const row = await createAudited(
      models.Paper,
      {
        doi: paper.doi,
        ref: null,
        title: paper.title,
        authors: paper.authors,
        journal: paper.journal,
        year: paper.year,
        volume: paper.volume,
        issue: paper.issue,
        pages: paper.pages,
        csl: null,
        field: paper.field,
        state: paper.state,
        curatorComment: paper.curatorComment,
        createdBy: users.get(paper.coder)!,
        submittedAt: paper.state === "draft" ? null : dayOf(index, 1),
        verifiedBy: paper.verifier ? users.get(paper.verifier)! : null,
        verifiedAt: paper.verifier ? dayOf(index, 3) : null,
      },
      context,
    );
    let comparisons = 0;
    for (const sample of paper.samples) {
      const sampleRow = await createAudited(models.Sample, { paperId: row.id, label: sample.label, n: sample.n, groups: sample.groups, groupNs: sample.groupNs }, context);
      const modelIds = new Map<string, number>();
      for (const model of sample.models) {
        const modelRow = await createAudited(
          models.FitModel,
          {
            sampleId: sampleRow.id,
            paperId: row.id,
            label: model.label,
            estimator: model.estimator,
            meanStructure: model.meanStructure,
            ...(figureColumns(model.figures, MODEL_FIGURES) as object),
          } as CreationAttributes<FitModel>,
          context,
        );
        modelIds.set(model.label, modelRow.id);
      }
      for (const comparison of sample.comparisons) {
        await createAudited(
          models.Comparison,
          {
            sampleId: sampleRow.id,
            paperId: row.id,
            label: comparison.label,
            restrictedModelId: modelIds.get(comparison.restricted)!,
            freeModelId: modelIds.get(comparison.free)!,
            method: comparison.method,
            nested: comparison.nested,
            alphaText: null,
            alpha: null,
            location: comparison.location,
            preferred: comparison.preferred,
            invarianceClaimed: comparison.invarianceClaimed,
            notes: comparison.notes,
            ...(figureColumns(comparison.figures, COMPARISON_FIGURES) as object),
          } as CreationAttributes<Comparison>,
          context,
        );
        comparisons += 1;
      }
    }
    const { flags } = await rewriteFlagsForPaper(row.id, { transaction, actorId: null, settings });
    return { comparisons, flags };
  });
}

/** The demo accounts (matched by e-mail), returning every account's id by e-mail. */
export async function seedAccounts(database: Database): Promise<{ users: Map<string, number>; created: number }> {
  const { models } = database;
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);
  const users = new Map<string, number>();
  let created = 0;
  for (const account of DEMO_ACCOUNTS) {
    const existing = await models.User.findOne({ where: { email: account.email }, attributes: ["id"] });
    if (existing) {
      users.set(account.email, existing.id);
      continue;
    }
    const row = await createAudited(models.User, { ...account, reason: "Demo account", passwordHash, statusNote: null }, { actorId: null, action: "seed" });
    users.set(account.email, row.id);
    created += 1;
  }
  return { users, created };
}

export async function seedDemo(database: Database): Promise<SeedSummary> {
  await database.ready;
  const { models } = database;
  const { users, created } = await seedAccounts(database);
  const summary: SeedSummary = { accountsCreated: created, papersCreated: 0, comparisonsCreated: 0, flagsWritten: 0 };
  const { papers } = demoCorpus();
  const existing = new Set((await models.Paper.findAll({ attributes: ["doi"], raw: true })).map((paper) => paper.doi));
  const settings = await readRecheckSettings();
  for (const [index, paper] of papers.entries()) {
    if (existing.has(paper.doi)) continue;
    const written = await seedPaper(database, paper, index, users, settings);
    summary.papersCreated += 1;
    summary.comparisonsCreated += written.comparisons;
    summary.flagsWritten += written.flags;
  }
  return summary;
}
