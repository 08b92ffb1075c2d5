import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { resolveDoi } from "@/lib/doi";
import { MALFORMED_DOI, SLOW_DOI, startDoiRegistry, type RunningRegistry } from "@/lib/fakes/doi-registry";
import { demoCorpus, demoRegistryRecords } from "@/seeders/demo/corpus";

// DOI resolution through citation-js against the real fake registry (DESIGN §7), started on a free port.

let registry: RunningRegistry;
beforeAll(async () => {
  registry = await startDoiRegistry({ port: 0, records: demoRegistryRecords(), slowMs: 4000 });
});
afterAll(async () => {
  await registry.close();
});

describe("resolveDoi against the fake registry", () => {
  it("finds a DOI the registry knows and returns its CSL record", async () => {
    const paper = demoCorpus().registryOnly[0];
    const outcome = await resolveDoi(`https://doi.org/${paper.doi.toUpperCase()}`, { resolverUrl: registry.url });
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    // the expected values are the demo corpus's own record (seeders/demo/corpus.ts cslFor)
    expect(outcome.csl.title).toBe(paper.title);
    expect(outcome.csl.DOI).toBe(paper.doi);
    expect(outcome.csl.author?.map((name) => name.family)).toEqual(paper.authors.map((name) => name.family));
  });

  it("says plainly when the registry does not know the DOI", async () => {
    const outcome = await resolveDoi("10.5555/no-such-paper", { resolverUrl: registry.url });
    expect(outcome).toMatchObject({ ok: false, reason: "not_found" });
  });

  it("gives up after the timeout when the registry is slow", async () => {
    const started = Date.now();
    const outcome = await resolveDoi(SLOW_DOI, { resolverUrl: registry.url, timeoutMs: 300 });
    expect(outcome).toMatchObject({ ok: false, reason: "timeout" });
    expect(Date.now() - started).toBeLessThan(2000);
  });

  it("reports a malformed reply as such", async () => {
    const outcome = await resolveDoi(MALFORMED_DOI, { resolverUrl: registry.url });
    expect(outcome).toMatchObject({ ok: false, reason: "malformed" });
  });

  it("refuses a malformed DOI without asking the registry", async () => {
    const outcome = await resolveDoi("doi 10/abc", { resolverUrl: "http://127.0.0.1:1" });
    expect(outcome).toMatchObject({ ok: false, reason: "malformed" });
    if (!outcome.ok) expect(outcome.message).toMatch(/is not a DOI/);
  });

  it("reports an unreachable registry", async () => {
    const outcome = await resolveDoi("10.5555/anything", { resolverUrl: "http://127.0.0.1:9", timeoutMs: 2000 });
    expect(outcome).toMatchObject({ ok: false, reason: "unreachable" });
  });

  it("keeps concurrent lookups with different settings apart", async () => {
    const paper = demoCorpus().registryOnly[1];
    const [slow, fast] = await Promise.all([resolveDoi(SLOW_DOI, { resolverUrl: registry.url, timeoutMs: 200 }), resolveDoi(paper.doi, { resolverUrl: registry.url, timeoutMs: 3000 })]);
    expect(slow).toMatchObject({ ok: false, reason: "timeout" });
    expect(fast.ok).toBe(true);
  });
});
