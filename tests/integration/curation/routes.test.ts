import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { startDoiRegistry, type RunningRegistry } from "@/lib/fakes/doi-registry";
import { demoCorpus, demoRegistryRecords } from "@/seeders/demo/corpus";
import type { TestDatabase } from "../../support/test-db";

// The curation endpoints through their real route handlers and server actions: the guard, the JSON
// shapes, a save conflict over HTTP, the public paper read, the DOI lookup against the fake registry,
// and the correction form. The session is replaced at the test's edge (lib/auth/session.ts); accounts
// are real rows.

const caller = vi.hoisted(() => ({ userId: null as number | null, address: "198.51.100.7" }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => caller.address,
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

// the app reads DOI_RESOLVER_URL once, when lib/env loads: start the fake first, import the app after
const registry: RunningRegistry = await startDoiRegistry({ port: 0, records: demoRegistryRecords(), slowMs: 3000 });
process.env.DOI_RESOLVER_URL = registry.url;
process.env.DOI_TIMEOUT_MS = "500";

const { createTestDatabase } = await import("../../support/test-db");
const { db } = await import("@/lib/db");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { GET: getPaper } = await import("@/app/api/papers/[id]/route");
const { PUT: putCoding } = await import("@/app/api/curation/papers/[id]/route");
const { GET: lookUpDoi } = await import("@/app/api/doi/route");
const { POST: parseCitationRoute } = await import("@/app/api/curation/citations/route");
const { sendPaperCorrection } = await import("@/app/(public)/papers/[id]/actions");
const { createPaperFromForm } = await import("@/app/(workbench)/workbench/actions");
const { clearCorrectionLimits } = await import("@/lib/curation/corrections");
const { changeCorrectionStatus } = await import("@/app/(workbench)/review/corrections/actions");
const { listCorrections } = await import("@/lib/db/queries/corrections");
const { submitEntry, verifyEntry } = await import("@/lib/curation/workflow");
const { newDraft, person, save, savedDocument, twoModelDocument } = await import("./support");

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => {
  await database.destroy();
  await registry.close();
});
beforeEach(() => {
  caller.userId = null;
  clearCorrectionLimits();
});

const params = (id: string | number) => ({ params: Promise.resolve({ id: String(id) }) });
const json = (body: unknown) => ({ method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

function form(values: Record<string, string | number>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) data.set(key, String(value));
  return data;
}

async function verifiedPaper() {
  const coder = await person("contributor", "Aino Coder");
  const curator = await person("curator", "Carys Checker");
  const paperId = await newDraft(coder);
  // the coding of twoModelDocument, under the paper's own metadata (its DOI kept)
  await save(paperId, coder, { ...twoModelDocument(1, { dDf: "3" }), metadata: (await savedDocument(paperId)).metadata });
  await submitEntry({ paperId, actor: coder });
  await verifyEntry({ paperId, actor: curator });
  return { paperId, coder, curator };
}

describe("GET /api/papers/[id]", () => {
  it("answers a verified paper with its coding, findings and who coded and verified it", async () => {
    const { paperId } = await verifiedPaper();
    const response = await getPaper(new Request(`http://fitledger.test/api/papers/${paperId}`), params(paperId));
    expect(response.status).toBe(200);
    const body = await response.json();
    expect(body.paper).toMatchObject({ id: paperId, state: "verified", coderName: "Aino Coder", verifierName: "Carys Checker" });
    expect(body.paper.models.map((model: { figures: { chisq: string } }) => model.figures.chisq)).toEqual(["61.30", "48.20"]);
    expect(body.paper.findings.map((finding: { code: string }) => finding.code)).toContain("df-difference-mismatch");
    expect(body.paper.findings[0]).toHaveProperty("disposition", null);
    expect(body.caution).toMatch(/not evidence of misconduct/);
    expect(JSON.stringify(body)).not.toMatch(/@curation\.test|createdBy|passwordHash/);
  });

  it("answers a JSON 404 for an unverified or unknown paper", async () => {
    const coder = await person("contributor");
    const draft = await newDraft(coder);
    for (const id of [draft, 999_999, "abc"]) {
      const response = await getPaper(new Request(`http://fitledger.test/api/papers/${id}`), params(id));
      expect(response.status).toBe(404);
      expect((await response.json()).error.code).toBe("not_found");
    }
  });
});

describe("PUT /api/curation/papers/[id]", () => {
  it("saves, then answers 409 to a second save from the same version", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    caller.userId = coder.id;
    const first = await putCoding(new Request(`http://fitledger.test/api/curation/papers/${paperId}`, json({ document: twoModelDocument(1) })), params(paperId));
    expect(first.status).toBe(200);
    const saved = await first.json();
    expect(saved).toMatchObject({ version: 2, document: { version: 2 } });
    // the form carries on from the stored rows: new keys are replaced by the stored rows' keys
    expect(saved.document.models.map((model: { key: string }) => model.key)).toEqual([expect.stringMatching(/^m\d+$/), expect.stringMatching(/^m\d+$/)]);
    const stale = await putCoding(new Request(`http://fitledger.test/api/curation/papers/${paperId}`, json({ document: twoModelDocument(1, { dDf: "4" }) })), params(paperId));
    expect(stale.status).toBe(409);
    expect((await stale.json()).error).toMatchObject({ code: "conflict" });
    expect((await savedDocument(paperId)).comparisons[0].dDf).toBe("3");
  });

  it("names each bad cell in the error's fields", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    caller.userId = coder.id;
    const document = twoModelDocument(1);
    document.models[1].df = "twenty";
    const response = await putCoding(new Request(`http://fitledger.test/api/curation/papers/${paperId}`, json({ document })), params(paperId));
    expect(response.status).toBe(400);
    expect(Object.keys((await response.json()).error.fields)).toEqual(["models.1.df"]);
  });

  it("refuses another contributor's draft", async () => {
    const coder = await person("contributor");
    const other = await person("contributor");
    const paperId = await newDraft(coder);
    caller.userId = other.id;
    const response = await putCoding(new Request(`http://fitledger.test/api/curation/papers/${paperId}`, json({ document: twoModelDocument(1) })), params(paperId));
    expect(response.status).toBe(403);
  });
});

describe("GET /api/doi", () => {
  it("fills the metadata from the registry for a DOI the corpus does not hold", async () => {
    const paper = demoCorpus().registryOnly[2];
    caller.userId = (await person("contributor")).id;
    const response = await lookUpDoi(new Request(`http://fitledger.test/api/doi?doi=${encodeURIComponent(paper.doi)}`), params(""));
    const body = await response.json();
    expect(body).toMatchObject({ found: true, metadata: { title: paper.title, year: String(paper.year) } });
  });

  it("points at the existing paper for a DOI already in the corpus", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder, { doi: "10.5555/route.existing" });
    caller.userId = coder.id;
    const body = await (await lookUpDoi(new Request("http://fitledger.test/api/doi?doi=10.5555/ROUTE.existing"), params(""))).json();
    expect(body.existing).toMatchObject({ id: paperId, href: `/workbench/papers/${paperId}` });
  });

  it("says why when the registry cannot help, and refuses a malformed DOI", async () => {
    caller.userId = (await person("contributor")).id;
    const unknown = await (await lookUpDoi(new Request("http://fitledger.test/api/doi?doi=10.5555/unknown.one"), params(""))).json();
    expect(unknown).toMatchObject({ found: false, reason: "not_found" });
    const slow = await (await lookUpDoi(new Request("http://fitledger.test/api/doi?doi=10.5555/fitledger.slow"), params(""))).json();
    expect(slow).toMatchObject({ found: false, reason: "timeout" });
    const malformed = await lookUpDoi(new Request("http://fitledger.test/api/doi?doi=not-a-doi"), params(""));
    expect(malformed.status).toBe(400);
    expect((await malformed.json()).error.fields.doi[0]).toMatch(/not a DOI/);
  });
});

describe("POST /api/curation/citations", () => {
  it("answers a field error for BibTeX that does not parse", async () => {
    caller.userId = (await person("contributor")).id;
    const response = await parseCitationRoute(new Request("http://fitledger.test/api/curation/citations", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ text: "@article{x, title = {unclosed" }) }), params(""));
    expect(response.status).toBe(400);
    expect((await response.json()).error.fields.text[0]).toMatch(/BibTeX/);
  });
});

describe("send a correction", () => {
  it("stores the correction and e-mails every active curator through the outbox", async () => {
    const { paperId, curator } = await verifiedPaper();
    const state = await sendPaperCorrection(IDLE_STATE, form({ paperId, name: "Ana Author", email: "ana@authors.test", message: "Table 2 prints Δdf = 4 in the published erratum." }));
    expect(state).toMatchObject({ ok: true });
    const { models } = await db();
    expect(await models.Correction.findOne({ where: { paperId }, attributes: ["name", "message", "addressHash"], raw: true })).toMatchObject({ name: "Ana Author", message: "Table 2 prints Δdf = 4 in the published erratum." });
    const mail = await models.OutboxMessage.findOne({ where: { to: curator.email, kind: "correction-received" } });
    expect(mail?.text).toContain("ana@authors.test");
  });

  it("is refused for an unverified paper and limited per address", async () => {
    const coder = await person("contributor");
    const draft = await newDraft(coder);
    expect(await sendPaperCorrection(IDLE_STATE, form({ paperId: draft, name: "X", email: "x@authors.test", message: "Something is wrong here." }))).toMatchObject({ ok: false, code: "not_found" });
    const { paperId } = await verifiedPaper();
    caller.address = "198.51.100.8";
    const outcomes = [];
    for (let attempt = 0; attempt < 6; attempt += 1) outcomes.push((await sendPaperCorrection(IDLE_STATE, form({ paperId, name: "Y", email: "y@authors.test", message: `Attempt number ${attempt} at a correction.` }))).code ?? "ok");
    // 5 an hour per address (lib/curation/corrections.ts)
    expect(outcomes).toEqual(["ok", "ok", "ok", "ok", "ok", "rate_limited"]);
  });
});

describe("curators deal with corrections", () => {
  it("lists an open correction, closes it with an audit event, and lists it under dealt with", async () => {
    const { paperId, curator } = await verifiedPaper();
    caller.address = "198.51.100.9";
    await sendPaperCorrection(IDLE_STATE, form({ paperId, name: "Bo Reader", email: "bo@readers.test", message: "The N of Table 1 is 412, not 421." }));
    const open = await listCorrections({ status: "open", page: 1, pageSize: 100 });
    const mine = open.items.find((item) => item.paperId === paperId && item.name === "Bo Reader");
    expect(mine).toMatchObject({ status: "open", message: "The N of Table 1 is 412, not 421." });

    caller.userId = curator.id;
    expect(await changeCorrectionStatus(IDLE_STATE, form({ correctionId: mine!.id, status: "closed" }))).toMatchObject({ ok: true, message: "Marked as dealt with." });
    const closed = await listCorrections({ status: "closed", page: 1, pageSize: 100 });
    expect(closed.items.map((item) => item.id)).toContain(mine!.id);
    const { models } = await db();
    const event = await models.AuditEvent.findOne({ where: { entity: "Correction", entityId: String(mine!.id), action: "close" } });
    expect(event?.actorId).toBe(curator.id);
    expect(event?.after).toEqual({ status: "closed" });
  });

  it("answers a clear not-found for a correction that does not exist, changing nothing", async () => {
    caller.userId = (await person("curator")).id;
    expect(await changeCorrectionStatus(IDLE_STATE, form({ correctionId: 999_999, status: "closed" }))).toMatchObject({ ok: false, code: "not_found" });
  });
});

describe("new paper from the form", () => {
  async function redirectOf(work: Promise<unknown>): Promise<string> {
    try {
      await work;
    } catch (error) {
      const digest = (error as { digest?: string }).digest ?? "";
      if (digest.startsWith("NEXT_REDIRECT")) return digest.split(";")[2];
      throw error;
    }
    throw new Error("expected a redirect");
  }

  it("creates a draft and opens its entry form", async () => {
    const coder = await person("contributor");
    caller.userId = coder.id;
    const target = await redirectOf(createPaperFromForm(IDLE_STATE, form({ doi: "10.5555/form.new", title: "A paper from the form", authors: "de la Cruz, María" })));
    expect(target).toMatch(/^\/workbench\/papers\/\d+$/);
  });

  it("a verified paper's DOI opens its public page; another contributor's draft is named, not opened", async () => {
    const { paperId } = await verifiedPaper();
    const { models } = await db();
    const verifiedDoi = (await models.Paper.findByPk(paperId, { attributes: ["doi"] }))!.doi!;
    const someoneElse = await person("contributor");
    caller.userId = someoneElse.id;
    expect(await redirectOf(createPaperFromForm(IDLE_STATE, form({ doi: verifiedDoi.toUpperCase(), title: "Typed again" })))).toBe(`/papers/${paperId}`);

    const owner = await person("contributor");
    await newDraft(owner, { doi: "10.5555/form.someone-elses-draft" });
    const state = await createPaperFromForm(IDLE_STATE, form({ doi: "10.5555/form.someone-elses-draft", title: "Typed again" }));
    expect(state).toMatchObject({ ok: false, code: "conflict" });
    expect(state.fieldErrors.doi?.[0]).toMatch(/another contributor is coding/);
  });

  it("a malformed DOI is refused next to the DOI field and nothing is created", async () => {
    caller.userId = (await person("contributor")).id;
    const { models } = await db();
    const before = await models.Paper.count();
    const state = await createPaperFromForm(IDLE_STATE, form({ doi: "10.5555 /with space", title: "A paper" }));
    expect(state).toMatchObject({ ok: false, code: "validation_failed" });
    expect(state.fieldErrors.doi?.[0]).toMatch(/not a DOI/);
    expect(await models.Paper.count()).toBe(before);
  });
});
