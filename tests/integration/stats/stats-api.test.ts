import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { GET } from "@/app/api/stats/route";
import { ENGINE_VERSION } from "@/lib/recheck";
import { wilsonInterval } from "@/lib/stats/wilson";
import { seedDemo } from "@/seeders/demo-seed";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// GET /api/stats on the demo corpus: every share is checked against counts made directly with
// Sequelize, and its interval against the Wilson formula (itself tested against Newcombe 1998).

// The JSON body, read field by field in the assertions below.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Body = Record<string, any>;

let database: TestDatabase;

async function stats(query = "") {
  const response = await GET(new Request(`http://fitledger.test/api/stats${query}`));
  return { status: response.status, body: (await response.json()) as Body };
}

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemo(database);
}, 120_000);
afterAll(async () => database.destroy());

describe("GET /api/stats", () => {
  it("states the snapshot: verified papers and comparisons, the engine version", async () => {
    const { status, body } = await stats();
    expect(status).toBe(200);
    const { models } = database;
    expect(body.snapshot.verifiedPapers).toBe(await models.Paper.count({ where: { state: "verified" } }));
    expect(body.snapshot.verifiedComparisons).toBe(await models.Comparison.count({ include: [{ model: models.Paper, as: "paper", attributes: [], where: { state: "verified" }, required: true }] }));
    expect(body.snapshot.engineVersion).toBe(ENGINE_VERSION);
    expect(body.snapshot.findingEngineVersions).toEqual([ENGINE_VERSION]);
  });

  it("gives each code's share of verified comparisons with its Wilson interval", async () => {
    const { body } = await stats();
    const { models } = database;
    const verified = { model: models.Paper, as: "paper", attributes: [], where: { state: "verified" }, required: true };
    const n = await models.Comparison.count({ include: [verified] });
    expect(body.prevalence.comparisons).toBe(n);
    for (const entry of body.prevalence.codes as { code: string; comparisons: { k: number; n: number; low: number | null; high: number | null } }[]) {
      const k = await models.Comparison.count({ include: [verified, { model: models.Flag, as: "flags", attributes: [], where: { code: entry.code }, required: true }], distinct: true, col: "id" });
      expect([entry.code, entry.comparisons.k, entry.comparisons.n]).toEqual([entry.code, k, n]);
      const { low, high } = wilsonInterval(k, n);
      expect(entry.comparisons.low).toBeCloseTo(low, 12);
      expect(entry.comparisons.high).toBeCloseTo(high, 12);
    }
  });

  it("counts the papers with at least one error-level finding", async () => {
    const { body } = await stats();
    const { models } = database;
    const papers = await models.Paper.count({ where: { state: "verified" }, include: [{ model: models.Comparison, as: "comparisons", attributes: [], required: true }], distinct: true, col: "id" });
    const withError = await models.Paper.count({ where: { state: "verified" }, include: [{ model: models.Flag, as: "flags", attributes: [], where: { severity: "error", comparisonId: { [Op.ne]: null } }, required: true }], distinct: true, col: "id" });
    expect(body.prevalence.papersWithError.n).toBe(papers);
    expect(body.prevalence.papersWithError.k).toBe(withError);
    expect(withError).toBeGreaterThan(0);
  });

  it("breaks a filtered part down by method with the same filters as the search", async () => {
    const { body } = await stats("?estimator=ML&year_from=2012");
    const { models } = database;
    for (const group of body.prevalence.byMethod as { value: string; comparisons: number; withError: { k: number } }[]) {
      const where = { method: group.value };
      const include = [
        { model: models.Paper, as: "paper", attributes: [], where: { state: "verified", year: { [Op.gte]: 2012 } }, required: true },
        { model: models.FitModel, as: "restrictedModel", attributes: [], required: true },
        { model: models.FitModel, as: "freeModel", attributes: [], required: true },
      ];
      const estimatorML = { [Op.or]: [{ "$restrictedModel.estimator$": "ML" }, { "$freeModel.estimator$": "ML" }] };
      const n = await models.Comparison.count({ where: { ...where, ...estimatorML }, include, distinct: true, col: "id" });
      expect([group.value, group.comparisons]).toEqual([group.value, n]);
    }
  });

  it("answers 400 naming a bad parameter", async () => {
    const { status, body } = await stats("?severity=fatal");
    expect(status).toBe(400);
    expect(body.error.fields.severity).toBeTruthy();
  });
});
