// `npm run seed:bench -- --comparisons 100000 [--database sqlite:data/bench.sqlite]`: a large synthetic
// corpus for the search and import benchmarks (about ten comparisons per paper, mostly verified),
// built from the demo designs and written in bulk. Its papers use DOIs 10.5555/bench.N, so running it
// again adds only what is missing.
import { parseArgs } from "node:util";
import { ENGINE_VERSION, recheck } from "@/lib/recheck";
import type { ComparisonInput, ModelInput } from "@/lib/recheck/types";
import { createDatabase } from "@/lib/db/connection";
import { migrateUp } from "@/lib/db/migrate";
import { recordEvents } from "@/lib/db/audit";
import { fingerprint } from "@/lib/db/flags";
import { oneLine } from "@/lib/cli/one-line";
import { COMPARISON_FIGURES, MODEL_FIGURES } from "@/models/figures";
import { generatePaper } from "./demo/corpus";
import { Random } from "./demo/random";
import type { DemoModel, DemoSample } from "./demo/types";
import { figureColumns, seedAccounts } from "./demo-seed";

const { values } = parseArgs({
  options: { comparisons: { type: "string", default: "100000" }, database: { type: "string", default: "sqlite:data/bench.sqlite" } },
});

function modelInput(model: DemoModel): ModelInput {
  return { label: model.label, estimator: model.estimator, meanStructure: model.meanStructure ? "yes" : "no", ...model.figures };
}

async function main() {
  const target = Number(values.comparisons);
  if (!Number.isInteger(target) || target < 1) throw new Error("--comparisons must be a positive whole number");
  const started = Date.now();
  const database = createDatabase(values.database);
  await database.ready;
  await migrateUp(database.sequelize);
  const { models, sequelize } = database;
  const { users } = await seedAccounts(database);
  const coders = [...users.values()];
  const existing = await models.Comparison.count({ include: [{ model: models.Paper, as: "paper", attributes: [], where: { ref: null }, required: true }] });
  const random = new Random(4242);
  const next = async (model: { max(column: string): Promise<unknown> }) => Number((await model.max("id")) ?? 0) + 1;
  let paperId = await next(models.Paper);
  let sampleId = await next(models.Sample);
  let modelId = await next(models.FitModel);
  let comparisonId = await next(models.Comparison);
  let written = 0;
  let flagCount = 0;
  let index = paperId;

  while (existing + written < target) {
    const papers: object[] = [];
    const samples: object[] = [];
    const fitModels: object[] = [];
    const comparisons: object[] = [];
    const flags: object[] = [];
    for (let batch = 0; batch < 300 && existing + written < target; batch += 1, index += 1) {
      const studies = [0, 1, 2].map((offset) => generatePaper(index * 3 + offset, random, []));
      const head = studies[0];
      const state = random.chance(0.8) ? "verified" : random.pick(["draft", "submitted", "returned"] as const);
      const coder = coders[index % coders.length];
      const verifier = coders[(index + 1) % coders.length];
      const id = paperId++;
      papers.push({
        id, doi: `10.5555/bench.${index}`, ref: null, title: head.title, authors: head.authors, journal: head.journal, year: head.year,
        volume: head.volume, issue: head.issue, pages: head.pages, csl: null, field: head.field, state, curatorComment: null,
        createdBy: coder, submittedAt: state === "draft" ? null : new Date(), verifiedBy: state === "verified" ? verifier : null,
        verifiedAt: state === "verified" ? new Date() : null, version: 1,
      });
      const allSamples: DemoSample[] = studies.flatMap((study, s) => study.samples.map((sample) => ({ ...sample, label: `${sample.label} (study ${s + 1})` })));
      for (const sample of allSamples) {
        const sid = sampleId++;
        samples.push({ id: sid, paperId: id, label: sample.label, n: sample.n, groups: sample.groups, groupNs: sample.groupNs });
        const ids = new Map<string, number>();
        for (const model of sample.models) {
          const mid = modelId++;
          ids.set(model.label, mid);
          fitModels.push({ id: mid, sampleId: sid, paperId: id, label: model.label, estimator: model.estimator, meanStructure: model.meanStructure, ...figureColumns(model.figures, MODEL_FIGURES) });
        }
        for (const comparison of sample.comparisons) {
          if (existing + written >= target) break;
          const cid = comparisonId++;
          written += 1;
          comparisons.push({
            id: cid, sampleId: sid, paperId: id, label: comparison.label, restrictedModelId: ids.get(comparison.restricted), freeModelId: ids.get(comparison.free),
            method: comparison.method, nested: comparison.nested, alphaText: null, alpha: null, location: comparison.location,
            preferred: comparison.preferred, invarianceClaimed: comparison.invarianceClaimed, notes: null, ...figureColumns(comparison.figures, COMPARISON_FIGURES),
          });
          const input: ComparisonInput = {
            label: comparison.label, method: comparison.method, nested: comparison.nested, preferred: comparison.preferred ?? undefined,
            invarianceClaimed: comparison.invarianceClaimed, ...comparison.figures,
            sample: { label: sample.label, n: String(sample.n), groups: String(sample.groups) },
            restricted: modelInput(sample.models.find((model) => model.label === comparison.restricted)!),
            free: modelInput(sample.models.find((model) => model.label === comparison.free)!),
          };
          const outcome = recheck(input);
          if (!outcome.ok) continue;
          for (const finding of outcome.result.findings) {
            flagCount += 1;
            flags.push({
              paperId: id, comparisonId: cid, modelId: finding.subject === "a" ? ids.get(comparison.restricted) : finding.subject === "b" ? ids.get(comparison.free) : null,
              subject: finding.subject, code: finding.code, severity: finding.severity, message: finding.message, values: finding.values,
              fingerprint: fingerprint(finding, `c${cid}`), engineVersion: ENGINE_VERSION,
            });
          }
        }
      }
    }
    await sequelize.transaction(async (transaction) => {
      // Synthetic bulk data: validation is skipped for speed; the rows come from the same generator as the demo.
      const bulk = { transaction, validate: false, hooks: false };
      await models.Paper.bulkCreate(papers as never[], bulk);
      await models.Sample.bulkCreate(samples as never[], bulk);
      await models.FitModel.bulkCreate(fitModels as never[], bulk);
      await models.Comparison.bulkCreate(comparisons as never[], bulk);
      for (let at = 0; at < flags.length; at += 2000) await models.Flag.bulkCreate(flags.slice(at, at + 2000) as never[], bulk);
      await recordEvents(
        [{ entity: "Paper", entityId: `${(papers[0] as { id: number }).id}-${(papers.at(-1) as { id: number }).id}`, action: "bench-seed", after: { papers: papers.length, comparisons: comparisons.length } }],
        { actorId: null, transaction },
      );
    });
    process.stdout.write(`\rseed:bench: ${existing + written} / ${target} comparisons`);
  }
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  console.log(`\nseed:bench: ${written} comparisons and ${flagCount} findings added to ${values.database} in ${seconds} s.`);
  await sequelize.close();
}

main().catch((error: unknown) => {
  console.error(`seed:bench failed: ${oneLine(error)}`);
  process.exit(1);
});
