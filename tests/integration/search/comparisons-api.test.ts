import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { Op, QueryTypes, type WhereOptions } from "sequelize";
import { seedDemo } from "@/seeders/demo-seed";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// GET /api/comparisons on the demo corpus in a real SQLite file. Expected values are counted directly
// in the database with Sequelize (and one plain SQL join), never taken from the search code. The
// session is replaced at the edge (lib/auth/session.ts) for the signed-in cases, as in the matrix test.

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.7",
}));

const { GET } = await import("@/app/api/comparisons/route");

// The JSON body, read field by field in the assertions below.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Body = Record<string, any>;

let database: TestDatabase;
const SESSION = { cookie: "next-auth.session-token=stand-in" };

async function get(query: string, headers: Record<string, string> = {}) {
  const response = await GET(new Request(`http://fitledger.test/api/comparisons${query}`, { headers }));
  return { status: response.status, body: (await response.json()) as Body };
}

/** verified comparisons with an optional extra condition, counted by Sequelize from the tables */
async function countVerified(where: { comparison?: WhereOptions; paper?: object; flag?: object } = {}) {
  const { models } = database;
  const include: object[] = [{ model: models.Paper, as: "paper", attributes: [], where: { state: "verified", ...(where.paper ?? {}) }, required: true }];
  if (where.flag) include.push({ model: models.Flag, as: "flags", attributes: [], where: where.flag, required: true });
  return models.Comparison.count({ where: where.comparison ?? {}, include, distinct: true, col: "id" });
}

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemo(database);
}, 120_000);
afterAll(async () => database.destroy());

describe("GET /api/comparisons", () => {
  it("lists every verified comparison and no draft, submitted or returned one", async () => {
    const { status, body } = await get("?per_page=200");
    expect(status).toBe(200);
    const verified = await countVerified();
    expect(verified).toBeGreaterThan(200);
    expect(body.total).toBe(verified);
    const hidden = await database.models.Comparison.findAll({ attributes: ["id"], include: [{ model: database.models.Paper, as: "paper", attributes: [], where: { state: { [Op.ne]: "verified" } }, required: true }], raw: true });
    expect(hidden.length).toBeGreaterThan(50);
    const hiddenIds = new Set(hidden.map((row) => row.id));
    const seen: number[] = [];
    for (let page = 1; page <= body.pages; page += 1) seen.push(...(await get(`?per_page=200&page=${page}`)).body.items.map((item: { id: number }) => item.id));
    expect(seen.length).toBe(verified);
    expect(seen.filter((id) => hiddenIds.has(id))).toEqual([]);
    expect(body.facets.state).toBeUndefined();
  });

  it("refuses entry states other than verified to the public, and answers curators", async () => {
    expect((await get("?state=draft")).status).toBe(401);
    const { models } = database;
    const curator = await models.User.findOne({ where: { role: "curator", status: "active" } });
    const reader = await models.User.findOne({ where: { role: "reader", status: "active" } });
    caller.userId = reader!.id;
    expect((await get("?state=draft", SESSION)).status).toBe(403);
    caller.userId = curator!.id;
    const drafts = await get("?state=draft,returned", SESSION);
    caller.userId = null;
    expect(drafts.status).toBe(200);
    const expected = await models.Comparison.count({ include: [{ model: models.Paper, as: "paper", attributes: [], where: { state: ["draft", "returned"] }, required: true }] });
    expect(drafts.body.total).toBe(expected);
    const stateCounts = Object.fromEntries(drafts.body.facets.state.map((facet: { value: string; count: number }) => [facet.value, facet.count]));
    expect(stateCounts.verified).toBe(await countVerified());
  });

  it("gives each facet value the count a direct count in the database gives", async () => {
    const { body } = await get("?year_from=2010&year_to=2020");
    const inYears = { year: { [Op.between]: [2010, 2020] } };
    expect(body.total).toBe(await countVerified({ paper: inYears }));
    for (const facet of body.facets.code as { value: string; count: number }[]) expect([facet.value, facet.count]).toEqual([facet.value, await countVerified({ paper: inYears, flag: { code: facet.value } })]);
    for (const facet of body.facets.method as { value: string; count: number }[]) expect([facet.value, facet.count]).toEqual([facet.value, await countVerified({ paper: inYears, comparison: { method: facet.value } })]);
    for (const facet of body.facets.journal as { value: string; count: number }[]) expect([facet.value, facet.count]).toEqual([facet.value, await countVerified({ paper: { ...inYears, journal: facet.value } })]);
    // the year facet ignores the year range itself: each year counts as if only it were chosen
    for (const facet of body.facets.year as { value: number; count: number }[]) expect([facet.value, facet.count]).toEqual([facet.value, await countVerified({ paper: { year: facet.value } })]);
    // estimator: either model's; a plain SQL join as a second, independent count
    const [row] = await database.sequelize.query<{ n: number }>(
      `SELECT COUNT(DISTINCT c.id) AS n FROM comparisons c JOIN papers p ON p.id = c.paper_id JOIN fit_models a ON a.id = c.restricted_model_id JOIN fit_models b ON b.id = c.free_model_id
       WHERE p.state = 'verified' AND p.year BETWEEN 2010 AND 2020 AND (a.estimator = 'MLR' OR b.estimator = 'MLR')`,
      { type: QueryTypes.SELECT },
    );
    expect(body.facets.estimator.find((facet: { value: string }) => facet.value === "MLR").count).toBe(Number(row.n));
  });

  it("counts a finding filter on the same finding: code and severity together", async () => {
    const { body } = await get("?code=just-identified-model&severity=error");
    expect(body.total).toBe(await countVerified({ flag: { code: "just-identified-model", severity: "error" } }));
    expect(body.total).toBeGreaterThan(0);
    for (const item of body.items) expect(item.findings.some((finding: { code: string }) => finding.code === "just-identified-model")).toBe(true);
    expect(body.items[0].href).toMatch(new RegExp(`^/papers/${body.items[0].paper.id}\\?finding=just-identified-model#comparison-${body.items[0].id}$`));
  });

  it("pages through sorting ties without losing or repeating a row", async () => {
    const all: number[] = [];
    let pages = 1;
    for (let page = 1; page <= pages; page += 1) {
      const { body } = await get(`?sort=method&per_page=37&page=${page}`);
      pages = body.pages;
      all.push(...body.items.map((item: { id: number }) => item.id));
    }
    expect(all.length).toBe(await countVerified());
    expect(new Set(all).size).toBe(all.length);
  });

  it("finds a paper from its title with a typo in a word", async () => {
    const paper = await database.models.Paper.findOne({ where: { state: "verified", title: { [Op.like]: "%Invariance%" } }, attributes: ["id", "title"] });
    expect(paper).not.toBeNull();
    const word = paper!.title.split(/\s+/).find((part) => part.length >= 8 && /^[A-Za-z]+$/.test(part))!;
    const slipped = word.slice(0, 2) + word[3] + word[2] + word.slice(4); // two letters swapped
    const { body } = await get(`?q=${encodeURIComponent(slipped)}&per_page=200`);
    expect(body.total).toBeGreaterThan(0);
    const exact = await get(`?q=${encodeURIComponent(word)}&per_page=200`);
    expect(body.total).toBe(exact.body.total);
  });

  it("answers 400 naming the parameter for invalid input", async () => {
    for (const [query, name] of [["?per_page=201", "per_page"], ["?year_from=19x", "year_from"], ["?sort=colour", "sort"], ["?method=anova", "method"], ["?unknown=1", "unknown"]] as const) {
      const { status, body } = await get(query);
      expect(status).toBe(400);
      expect(body.error.message).toContain(name);
      expect(Object.keys(body.error.fields)).toContain(name);
    }
  });

  it("shows a newly verified paper: to curators at once, to the public once the index is rebuilt", async () => {
    const { models } = database;
    const before = (await get("")).body.total;
    const paper = await models.Paper.findOne({ where: { state: "submitted" }, include: [{ model: models.Comparison, as: "comparisons", attributes: ["id"], required: true }] });
    const count = await models.Comparison.count({ where: { paperId: paper!.id } });
    await paper!.update({ state: "verified", verifiedAt: new Date() }); // a plain update, not audited: the signature still sees it
    const curator = await models.User.findOne({ where: { role: "curator", status: "active" } });
    caller.userId = curator!.id;
    expect((await get("", SESSION)).body.total).toBe(before + count);
    caller.userId = null;
    // the public may be answered from the previous index while the new one is built, never from a newer-than-true one
    const seen: number[] = [];
    for (let attempt = 0; attempt < 100; attempt += 1) {
      const total = (await get("")).body.total as number;
      seen.push(total);
      if (total === before + count) break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect(seen.at(-1)).toBe(before + count);
    expect(seen.every((total) => total === before || total === before + count)).toBe(true);
  });

  it("never answers the public from an index that still holds a verified entry returned for a correction", async () => {
    const { models } = database;
    const { returnEntry } = await import("@/lib/curation/workflow");
    const before = (await get("")).body.total as number; // the public's index is built and current
    const paper = await models.Paper.findOne({ where: { state: "verified" }, include: [{ model: models.Comparison, as: "comparisons", attributes: ["id"], required: true }] });
    const ids = new Set((await models.Comparison.findAll({ where: { paperId: paper!.id }, attributes: ["id"], raw: true })).map((row) => row.id));
    const curator = await models.User.findOne({ where: { role: "curator", status: "active" } });
    await returnEntry({ paperId: paper!.id, comment: "An erratum changes Table 3.", actor: { id: curator!.id, role: "curator" } });
    // the very next public answer, with no wait for a rebuild
    const { body } = await get("?per_page=200");
    expect(body.total).toBe(before - ids.size);
    expect(body.items.filter((item: { id: number }) => ids.has(item.id))).toEqual([]);
  });
});
