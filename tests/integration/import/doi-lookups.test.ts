import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { startDoiRegistry, type RunningRegistry } from "@/lib/fakes/doi-registry";
import { resolveDoi } from "@/lib/doi";
import { lookupCounts, resolvePendingLookups, retryFailedLookups } from "@/lib/import/doi-jobs";
import { DoiLookup, Paper } from "@/models";
import { createAccount, importSheet } from "./support";

// New DOIs of an import get their metadata in the background from the (fake) DOI registry; a failure is
// listed with its reason, can be retried, and never undoes the import.
const HEADER = "doi,title,comparison,method,a_label,a_chisq,a_df,b_label,b_chisq,b_df";
const KNOWN = "10.5555/doi-jobs.known";
const UNKNOWN = "10.5555/doi-jobs.unknown";

let database: TestDatabase;
let registry: RunningRegistry;
let coder: number;

beforeAll(async () => {
  database = await createTestDatabase();
  coder = await createAccount("doi@import.test");
  const record = { DOI: KNOWN, type: "article-journal", title: "Resolved invented title", author: [{ family: "Okafor", given: "Jude" }], "container-title": "Annals of Made-up Methods", issued: { "date-parts": [[2018]] }, volume: "7", page: "1-9" };
  registry = await startDoiRegistry({ port: 0, records: new Map([[KNOWN, record]]) });
});
afterAll(async () => {
  await registry.close();
  await database.destroy();
});

const resolve = (doi: string) => resolveDoi(doi, { resolverUrl: registry.url, timeoutMs: 3000 });

describe("DOI metadata after an import", () => {
  it("queues one lookup per new DOI, fills what the sheet left empty, and lists the failures", async () => {
    const sheet = [HEADER, `${KNOWN},,C1,lrt,A,40.1,26,B,30.9,24`, `${UNKNOWN},A title typed by the coder,C1,lrt,A,40.1,26,B,30.9,24`].join("\n");
    const batch = await importSheet(coder, sheet);
    expect(batch.status).toBe("committed");
    expect(await lookupCounts(batch.id)).toMatchObject({ pending: 2, resolved: 0, failed: 0 });
    // until the lookup is done, the DOI stands in for the missing title
    expect((await Paper.findOne({ where: { doi: KNOWN } }))?.title).toBe(KNOWN);

    expect(await resolvePendingLookups({ batchId: batch.id, resolve })).toEqual({ resolved: 1, failed: 1 });
    const known = await Paper.findOne({ where: { doi: KNOWN } });
    expect([known?.title, known?.journal, known?.year, known?.volume, known?.pages]).toEqual(["Resolved invented title", "Annals of Made-up Methods", 2018, "7", "1-9"]);
    expect(known?.authors).toEqual([{ family: "Okafor", given: "Jude" }]);
    expect(known?.csl).toMatchObject({ title: "Resolved invented title" });
    // the coder's own title is kept; the failure says why
    expect((await Paper.findOne({ where: { doi: UNKNOWN } }))?.title).toBe("A title typed by the coder");
    const counts = await lookupCounts(batch.id);
    expect(counts).toMatchObject({ pending: 0, resolved: 1, failed: 1 });
    expect(counts.failures).toEqual([{ doi: UNKNOWN, reason: "not_found", message: expect.any(String), attempts: 1 }]);
  });

  it("queues the failed lookups again on retry, for the uploader only", async () => {
    const job = await DoiLookup.findOne({ where: { doi: UNKNOWN } });
    await expect(retryFailedLookups({ batchId: job!.batchId!, uploaderId: coder + 1000 })).rejects.toThrow(/no such import/);
    expect(await retryFailedLookups({ batchId: job!.batchId!, uploaderId: coder })).toBe(1);
    expect((await DoiLookup.findByPk(job!.id))?.status).toBe("pending");
    await resolvePendingLookups({ batchId: job!.batchId!, resolve });
    expect(await DoiLookup.findByPk(job!.id)).toMatchObject({ status: "failed", attempts: 2 });
  });
});
