import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { FINDING_CODES } from "@/lib/recheck";
import { seedDemo, type SeedSummary } from "@/seeders/demo-seed";
import { DEMO_ACCOUNTS } from "@/seeders/demo/corpus";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

let database: TestDatabase;
let first: SeedSummary;

beforeAll(async () => {
  database = await createTestDatabase();
  first = await seedDemo(database);
}, 120_000);
afterAll(async () => database.destroy());

async function counts() {
  const { models } = database;
  const [users, papers, samples, fitModels, comparisons, flags, events] = await Promise.all([
    models.User.count(), models.Paper.count(), models.Sample.count(), models.FitModel.count(), models.Comparison.count(), models.Flag.count(), models.AuditEvent.count(),
  ]);
  return { users, papers, samples, fitModels, comparisons, flags, events };
}

describe("the demo corpus", () => {
  it("has about 150 papers and 600 comparisons and an account for every role and state", async () => {
    expect(first.papersCreated).toBeGreaterThanOrEqual(140);
    expect(first.comparisonsCreated).toBeGreaterThanOrEqual(550);
    const roles = new Set(DEMO_ACCOUNTS.map((account) => account.role));
    expect([...roles].sort()).toEqual(["admin", "contributor", "curator", "reader"]);
    expect(await database.models.User.count({ where: { status: "suspended" } })).toBe(1);
    expect(await database.models.User.count({ where: { status: "pending" } })).toBe(1);
  });

  it("mixes methods, estimators, group counts and entry states", async () => {
    const { models, sequelize } = database;
    const distinct = async (model: typeof models.Comparison | typeof models.FitModel | typeof models.Paper | typeof models.Sample, column: string) =>
      ((await (model as typeof models.Paper).findAll({ attributes: [[sequelize.fn("DISTINCT", sequelize.col(column)), "value"]], raw: true })) as unknown as { value: unknown }[]).map((row) => row.value);
    expect((await distinct(models.Comparison, "method")).sort()).toEqual(["ic", "invariance", "lrt", "scaled_lrt"]);
    expect(await distinct(models.FitModel, "estimator")).toEqual(expect.arrayContaining(["ML", "MLR", "MLM", "WLSMV"]));
    expect((await distinct(models.Sample, "groups")).length).toBeGreaterThanOrEqual(3);
    expect((await distinct(models.Paper, "state")).sort()).toEqual(["draft", "returned", "submitted", "verified"]);
  });

  it("raises every finding code of the recheck engine somewhere", async () => {
    const rows = (await database.models.Flag.findAll({ attributes: ["code"], group: ["code"], raw: true })) as { code: string }[];
    const raised = new Set(rows.map((row) => row.code));
    expect(FINDING_CODES.filter((code) => !raised.has(code))).toEqual([]);
  });

  it("has clean reports too: most comparisons raise no error-level finding", async () => {
    const withErrors = await database.models.Flag.count({ distinct: true, col: "comparison_id", where: { severity: "error" } });
    expect(withErrors / first.comparisonsCreated).toBeLessThan(0.35);
  });

  it("lets no coder verify their own paper", async () => {
    const verified = await database.models.Paper.findAll({ where: { state: "verified" }, attributes: ["createdBy", "verifiedBy"] });
    expect(verified.length).toBeGreaterThan(0);
    expect(verified.filter((paper) => paper.createdBy === paper.verifiedBy)).toEqual([]);
  });

  it("changes nothing when seeded a second time", async () => {
    const before = await counts();
    const again = await seedDemo(database);
    expect(again).toEqual({ accountsCreated: 0, papersCreated: 0, comparisonsCreated: 0, flagsWritten: 0 });
    expect(await counts()).toEqual(before);
  });
});
