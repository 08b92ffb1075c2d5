import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { UniqueConstraintError, ForeignKeyConstraintError, ValidationError } from "sequelize";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

let database: TestDatabase;
let userId: number;

beforeAll(async () => {
  database = await createTestDatabase();
  const user = await database.models.User.create({ email: "Coder@Example.org", name: "A. Coder", affiliation: null, reason: null, passwordHash: "x", statusNote: null });
  userId = user.id;
});
afterAll(async () => database.destroy());

const paper = (doi: string | null, ref: string | null = null) => ({
  doi, ref, title: "An invented paper", authors: [], journal: null, year: 2020, volume: null, issue: null, pages: null, csl: null,
  field: null, curatorComment: null, createdBy: userId, submittedAt: null, verifiedBy: null, verifiedAt: null,
});

describe("database constraints", () => {
  it("store e-mail addresses lower-cased and refuse a second account with the same address", async () => {
    const stored = await database.models.User.findByPk(userId);
    expect(stored?.email).toBe("coder@example.org");
    await expect(database.models.User.create({ email: "CODER@example.org", name: "Twin", affiliation: null, reason: null, passwordHash: "x", statusNote: null })).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it("never return the password hash from a default query", async () => {
    const stored = await database.models.User.findByPk(userId);
    expect(stored?.get("passwordHash")).toBeUndefined();
  });

  it("normalise a DOI (resolver prefix, case) and refuse the same DOI twice", async () => {
    const first = await database.models.Paper.create(paper("https://doi.org/10.5555/ABC.1"));
    expect(first.doi).toBe("10.5555/abc.1");
    await expect(database.models.Paper.create(paper("10.5555/abc.1"))).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it("refuse a malformed DOI and a paper with neither DOI nor curator reference, with a readable message", async () => {
    await expect(database.models.Paper.create(paper("not-a-doi"))).rejects.toThrow(/A DOI looks like 10\.5555/);
    await expect(database.models.Paper.create(paper(null, null))).rejects.toThrow(/needs a DOI or a curator reference/);
  });

  it("refuse an unknown entry state, estimator or method (enums are validated)", async () => {
    await expect(database.models.Paper.create({ ...paper(null, "REF-ENUM"), state: "published" as never })).rejects.toBeInstanceOf(ValidationError);
    const host = await database.models.Paper.create(paper("10.5555/enum.1"));
    const sample = await database.models.Sample.create({ paperId: host.id, label: "Sample 1", n: 300, groupNs: null });
    await expect(database.models.FitModel.create({ sampleId: sample.id, paperId: host.id, label: "M1", estimator: "MLX" as never, meanStructure: null } as never)).rejects.toBeInstanceOf(ValidationError);
  });

  it("refuse a dangling reference to a paper that does not exist", async () => {
    await expect(database.models.Sample.create({ paperId: 999_999, label: "Orphan", n: 100, groupNs: null })).rejects.toBeInstanceOf(ForeignKeyConstraintError);
  });

  it("refuse a second sample, model or comparison with the same label in one paper (the sheet's identity keys)", async () => {
    const host = await database.models.Paper.create(paper("10.5555/identity.1"));
    const sample = await database.models.Sample.create({ paperId: host.id, label: "Sample 1", n: 300, groupNs: null });
    await expect(database.models.Sample.create({ paperId: host.id, label: "Sample 1", n: 200, groupNs: null })).rejects.toBeInstanceOf(UniqueConstraintError);
    const a = await database.models.FitModel.create({ sampleId: sample.id, paperId: host.id, label: "One factor", estimator: "ML", meanStructure: null } as never);
    const b = await database.models.FitModel.create({ sampleId: sample.id, paperId: host.id, label: "Two factors", estimator: "ML", meanStructure: null } as never);
    await expect(database.models.FitModel.create({ sampleId: sample.id, paperId: host.id, label: "One factor", estimator: "ML", meanStructure: null } as never)).rejects.toBeInstanceOf(UniqueConstraintError);
    const comparison = { sampleId: sample.id, paperId: host.id, label: "1 vs 2", restrictedModelId: a.id, freeModelId: b.id, method: "lrt" as const, alphaText: null, alpha: null, location: null, preferred: null, notes: null };
    await database.models.Comparison.create(comparison as never);
    await expect(database.models.Comparison.create(comparison as never)).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it("refuse a comparison of a model with itself", async () => {
    const host = await database.models.Paper.create(paper("10.5555/self.1"));
    const sample = await database.models.Sample.create({ paperId: host.id, label: "Sample 1", n: 300, groupNs: null });
    const a = await database.models.FitModel.create({ sampleId: sample.id, paperId: host.id, label: "M", estimator: "ML", meanStructure: null } as never);
    await expect(
      database.models.Comparison.create({ sampleId: sample.id, paperId: host.id, label: "M vs M", restrictedModelId: a.id, freeModelId: a.id, method: "lrt", alphaText: null, alpha: null, location: null, preferred: null, notes: null } as never),
    ).rejects.toThrow(/two different models/);
  });
});
