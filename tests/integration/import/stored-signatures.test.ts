import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { encodeSignature } from "@/lib/import/entry";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute } from "@/models/figures";
import { loadExisting } from "@/lib/import/existing";
import { Comparison, FitModel, Paper } from "@/models";
import { createAccount, importSheet } from "./support";

// A re-import compares each row with what is stored through signatures, and the database builds the
// stored rows' signatures in SQL (lib/import/existing.ts). They must be exactly the strings
// encodeSignature gives for the same coding (the parts in lib/import/entry.ts valuesModelSignature and
// valuesComparisonSignature order), empty cells, booleans and non-ASCII text included.
const sheets = ["example-several-papers.csv", "example-invariance-steps.csv"].map((name) => fs.readFileSync(new URL(`../../../imports/${name}`, import.meta.url), "utf8"));

type Row = Record<string, unknown>;
const text = (row: Row, figure: string) => (row[textAttribute(figure)] as string | null) ?? null;

/** A stored model's parts, read in JavaScript: estimator, mean structure as yes/no, every printed figure. */
function modelParts(model: Row): (string | null)[] {
  const means = model.meanStructure === null ? null : model.meanStructure ? "yes" : "no";
  return [(model.estimator as string | null) ?? null, means, ...MODEL_FIGURES.map((figure) => text(model, figure))];
}

/** A stored comparison's parts, with its models' labels. */
function comparisonParts(c: Row, restrictedLabel: string, freeLabel: string): (string | null)[] {
  const head = ["method", "nested", "alphaText", "location", "preferred", "invarianceClaimed", "notes"].map((name) => (c[name] as string | null) ?? null);
  return [...head, restrictedLabel, freeLabel, ...COMPARISON_FIGURES.map((figure) => text(c, figure))];
}

let database: TestDatabase;

beforeAll(async () => {
  database = await createTestDatabase();
  const coder = await createAccount("signatures@import.test");
  for (const sheet of sheets) expect((await importSheet(coder, sheet)).status).toBe("committed");
  // every reading of the mean structure, and text a quote or a non-ASCII letter in it
  const models = await FitModel.findAll({ order: [["id", "ASC"]], limit: 3 });
  await models[0].update({ meanStructure: true, estimator: "MLR" });
  await models[1].update({ meanStructure: false, aicText: null });
  await models[2].update({ meanStructure: null, srmrText: "0.05'" });
  await (await Comparison.findOne({ order: [["id", "ASC"]] }))!.update({ notes: "Δχ² from Table 2, \"scaled\"", location: null });
});
afterAll(async () => {
  await database.destroy();
});

describe("stored signatures built by the database", () => {
  it("equal the JavaScript encoding of every stored model and comparison", async () => {
    const papers = await Paper.findAll({ attributes: ["doi", "ref"], raw: true });
    const state = await loadExisting({ dois: papers.flatMap((p) => (p.doi ? [p.doi] : [])), refs: papers.flatMap((p) => (p.ref ? [p.ref] : [])) });

    const models = await FitModel.findAll({ raw: true });
    expect(models.length).toBeGreaterThan(6);
    // raw rows, as the earlier JavaScript loading read them: SQLite gives booleans as 1 and 0
    expect(new Set(models.map((m) => (m.meanStructure === null ? null : Boolean(m.meanStructure))))).toEqual(new Set([true, false, null]));
    const labels = new Map(models.map((m) => [m.id, m.label]));
    for (const model of models) {
      const loaded = [...state.models.values()].find((m) => m.id === model.id);
      expect(loaded?.signature, `model ${model.id}`).toBe(encodeSignature(modelParts(model as unknown as Row)));
    }

    const comparisons = await Comparison.findAll({ raw: true });
    expect(comparisons.length).toBeGreaterThan(3);
    expect(comparisons.some((c) => c.notes?.includes("Δχ²"))).toBe(true);
    for (const comparison of comparisons) {
      const loaded = [...state.comparisons.values()].find((c) => c.id === comparison.id);
      const expected = encodeSignature(comparisonParts(comparison as unknown as Row, labels.get(comparison.restrictedModelId)!, labels.get(comparison.freeModelId)!));
      expect(loaded?.signature, `comparison ${comparison.id}`).toBe(expected);
    }
  });
});
