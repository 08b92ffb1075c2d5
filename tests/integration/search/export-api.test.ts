import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { seedDemo } from "@/seeders/demo-seed";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// GET /api/export with the search's filters: the sheet holds exactly the comparisons the search finds
// (compared row by row with GET /api/comparisons on the same query), verified entries only unless
// mine=1, and mine=1 goes through the guard.

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.9",
}));

const { GET: exportGet } = await import("@/app/api/export/route");
const { GET: searchGet } = await import("@/app/api/comparisons/route");

let database: TestDatabase;

async function sheet(query: string) {
  const response = await exportGet(new Request(`http://fitledger.test/api/export?${query}`));
  const text = await response.text();
  return { status: response.status, type: response.headers.get("content-type"), rows: Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data, text };
}

async function searchKeys(query: string): Promise<string[]> {
  const keys: string[] = [];
  for (let page = 1; ; page += 1) {
    const body = (await (await searchGet(new Request(`http://fitledger.test/api/comparisons?${query}&per_page=200&page=${page}`))).json()) as { items: { label: string; sample: { label: string }; paper: { doi: string } }[]; pages: number };
    keys.push(...body.items.map((item) => `${item.paper.doi}|${item.sample.label}|${item.label}`));
    if (page >= body.pages) break;
  }
  return keys.sort();
}

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemo(database);
}, 120_000);
afterAll(async () => database.destroy());

describe("GET /api/export", () => {
  it.each(["code=just-identified-model", "method=invariance&year_from=2012", "estimator=MLR&severity=warning", "q=factor%20structure"])("writes exactly the comparisons the search finds (%s)", async (query) => {
    const exported = await sheet(`format=csv&${query}`);
    expect(exported.status).toBe(200);
    expect(exported.type).toContain("text/csv");
    const keys = exported.rows.map((row) => `${row.doi}|${row.sample}|${row.comparison}`).sort();
    const expected = await searchKeys(query);
    expect(expected.length).toBeGreaterThan(0);
    expect(keys).toEqual(expected);
  });

  it("exports no entry that is not verified", async () => {
    const { models } = database;
    const hidden = await models.Paper.findAll({ where: { state: ["draft", "submitted", "returned"] }, attributes: ["doi"], raw: true });
    const exported = await sheet("format=csv");
    const dois = new Set(exported.rows.map((row) => row.doi));
    expect(hidden.length).toBeGreaterThan(0);
    expect(hidden.filter((paper) => paper.doi && dois.has(paper.doi))).toEqual([]);
  });

  it("needs a signed-in contributor for mine=1, and then holds their own entries in every state", async () => {
    expect((await sheet("format=csv&mine=1")).status).toBe(401);
    const { models } = database;
    const reader = await models.User.findOne({ where: { role: "reader", status: "active" } });
    caller.userId = reader!.id;
    expect((await sheet("format=csv&mine=1")).status).toBe(403);
    const contributor = await models.User.findOne({ where: { email: "contributor@fitledger.test" } });
    caller.userId = contributor!.id;
    const own = await sheet("format=csv&mine=1");
    caller.userId = null;
    expect(own.status).toBe(200);
    const expected = await models.Comparison.count({ include: [{ model: models.Paper, as: "paper", attributes: [], where: { createdBy: contributor!.id }, required: true }] });
    expect(own.rows.length).toBe(expected);
  });

  it("answers 400 for an unknown format, naming it", async () => {
    const response = await exportGet(new Request("http://fitledger.test/api/export?format=xlsx"));
    expect(response.status).toBe(400);
    expect(((await response.json()) as { error: { fields: Record<string, string[]> } }).error.fields.format).toBeTruthy();
  });
});
