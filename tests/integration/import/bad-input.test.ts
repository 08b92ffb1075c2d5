import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { AuditEvent, Comparison, FitModel, ImportBatch, ImportChunk, Paper, Sample } from "@/models";
import { createAccount, dryRun, importSheet } from "./support";

// Every bad input of issue 6: each gets a clear message, nothing is half-written, no row is silently
// dropped. Uploads go through the real route handler; the session is replaced at the test's edge.
const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.7",
}));

const { POST: upload } = await import("@/app/api/imports/route");
const { GET: rejectedRows } = await import("@/app/api/imports/[id]/rejected/route");

const HEADER = "doi,title,sample,n,comparison,method,d_chisq,d_df,a_label,a_chisq,a_df,b_label,b_chisq,b_df";
const GOOD = "10.5555/bad-input.1,An invented paper,S1,300,C1,lrt,9.20,2,Restricted,40.10,26,Free,30.90,24";

let database: TestDatabase;
let coder: number;
beforeAll(async () => {
  database = await createTestDatabase();
  coder = await createAccount("bad-input@import.test");
  caller.userId = coder;
});
afterAll(async () => {
  await database.destroy();
});

const stored = async () => [await Paper.count(), await Sample.count(), await FitModel.count(), await Comparison.count()];

async function refusedFile(sheet: string | Uint8Array): Promise<string> {
  const batch = await dryRun(coder, sheet);
  expect(batch.status).toBe("failed");
  expect(await stored()).toEqual([0, 0, 0, 0]);
  return batch.failure ?? "";
}

describe("files refused as a whole, with the reason", () => {
  it("an empty file", async () => {
    expect(await refusedFile("")).toMatch(/the file is empty \(no header row\)/);
  });
  it("a header without rows", async () => {
    expect(await refusedFile(`${HEADER}\r\n`)).toMatch(/header row but no data rows/);
  });
  it("a misspelt column, with the column it probably means", async () => {
    expect(await refusedFile(`${HEADER.replace("a_chisq", "a_chsiq")}\n${GOOD}\n`)).toMatch(/unknown column "a_chsiq" \(did you mean "a_chisq"\?\)/);
  });
  it("an unknown column", async () => {
    expect(await refusedFile(`${HEADER},coder_initials\n${GOOD},AQ\n`)).toMatch(/unknown column "coder_initials"/);
  });
  it("a required column missing", async () => {
    expect(await refusedFile(`${HEADER.replace(",method", "")}\n${GOOD.replace(",lrt", "")}\n`)).toMatch(/required column "method" missing/);
  });
  it("a binary file renamed .csv", async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52]);
    expect(await refusedFile(png)).toMatch(/not UTF-8 text/);
  });
  it("Latin-1 text, naming the byte and its offset", async () => {
    const text = `${HEADER}\n${GOOD.replace("An invented paper", "Müller's invented paper")}\n`;
    const latin1 = Uint8Array.from(Buffer.from(text, "latin1"));
    const offset = Buffer.from(text, "latin1").indexOf(0xfc);
    expect(await refusedFile(latin1)).toContain(`not UTF-8 text (byte 0xFC at offset ${offset}; Latin-1?)`);
  });
});

describe("rows refused one by one, the others still imported", () => {
  it("text in numeric cells, duplicate rows and a model with conflicting figures, each named by row and column", async () => {
    const sheet = [
      HEADER,
      GOOD,
      "10.5555/bad-input.1,An invented paper,S1,300,C2,lrt,about nine,2,Restricted,40.10,26,Free,30.90,24", // text in d_chisq
      GOOD, // the same comparison again
      "10.5555/bad-input.1,An invented paper,S1,300,C3,lrt,9.21,2,Restricted,40.11,26,Free,30.90,24", // Restricted's χ² differs from row 1
      "10.5555/bad-input.1,An invented paper,S1,300,C4,lrt,,,Restricted,40.10,26,Other,31.00,25",
    ].join("\n");
    const batch = await importSheet(coder, sheet);
    expect(batch.status).toBe("committed");
    expect([batch.totalRows, batch.acceptedRows, batch.rejectedRows]).toEqual([5, 2, 3]);
    expect(batch.rowErrors).toEqual([
      { row: 2, column: "d_chisq", message: expect.stringContaining('"about nine"') },
      { row: 3, column: "comparison", message: 'comparison "C1" of sample "S1" is already in row 1; each comparison belongs in one row per sheet' },
      { row: 4, column: "a_chisq", message: 'model "Restricted" has chisq "40.11" here but "40.10" in row 1; a model\'s figures must agree in every row that names it' },
    ]);
    expect(await Comparison.count()).toBe(2);
  });

  it("formula cells: a figure refused, a text cell kept as text with a note", async () => {
    const sheet = `${HEADER},notes\n10.5555/bad-input.2,"=1+1",S1,300,C1,lrt,=9.2,2,A,40.10,26,B,30.90,24,\n10.5555/bad-input.2,"=1+1",S1,300,C2,lrt,9.20,2,A,40.10,26,B,30.90,24,"@SUM(A1)"\n`;
    const batch = await dryRun(coder, sheet);
    expect(batch.rowErrors).toEqual([{ row: 1, column: "d_chisq", message: expect.stringContaining("=9.2") }]);
    const preview = await database.models.ImportRow.findOne({ where: { batchId: batch.id, row: 2 } });
    expect(preview?.details.notes).toEqual([
      'title starts with "=" like a spreadsheet formula; it is stored as text, never run, and exported with a leading apostrophe',
      'notes starts with "@" like a spreadsheet formula; it is stored as text, never run, and exported with a leading apostrophe',
    ]);
  });
});

describe("the rejected rows", () => {
  it("download as a sheet with an error column, and upload again as they are once fixed", async () => {
    const sheet = [HEADER, "10.5555/bad-input.3,Another invented paper,S1,300,C1,lrt,9.20,two,A,40.10,26,B,30.90,24", "10.5555/bad-input.3,Another invented paper,S1,300,C2,lrt,9.20,2,A,40.10,26,B,30.90,24"].join("\r\n");
    const batch = await importSheet(coder, sheet);
    expect(batch.rejectedRows).toBe(1);
    const response = await rejectedRows(new Request(`http://fitledger.test/api/imports/${batch.id}/rejected`), { params: Promise.resolve({ id: String(batch.id) }) });
    expect(response.status).toBe(200);
    const csv = await response.text();
    const lines = csv.split("\r\n").filter(Boolean);
    expect(lines).toHaveLength(2);
    expect(lines[0].endsWith(",error")).toBe(true);
    expect(lines[1]).toContain(",two,");
    expect(lines[1]).toMatch(/row 1: d_df: .*"two"/);
    const fixed = await importSheet(coder, csv.replace(",two,", ",2,"));
    expect(fixed.status).toBe("committed");
    expect([fixed.acceptedRows, fixed.rejectedRows, fixed.progress.new]).toEqual([1, 0, 1]);
    expect(await Comparison.count({ where: { paperId: (await Paper.findOne({ where: { doi: "10.5555/bad-input.3" } }))!.id } })).toBe(2);
  });
});

describe("the upload route", () => {
  it("refuses a declared 200 MB body before reading any of it", async () => {
    let pulled = 0;
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        pulled += 1;
        controller.enqueue(new Uint8Array(1 << 20));
      },
    });
    const request = new Request("http://fitledger.test/api/imports?name=huge.csv", { method: "POST", body, headers: { "content-type": "text/csv", "content-length": String(200 * 2 ** 20) }, duplex: "half" } as RequestInit);
    const response = await upload(request);
    expect(response.status).toBe(413);
    expect((await response.json()).error.message).toMatch(/larger than 50 MB \(200 MB\)/);
    expect(pulled).toBeLessThanOrEqual(1); // a stream may pre-pull one piece; nothing was read by the handler
    expect(await ImportBatch.count({ where: { fileName: "huge.csv" } })).toBe(0);
  });

  it("stops reading a 200 MB body without a length once it passes 50 MB, and keeps none of it", async () => {
    let sent = 0;
    const piece = new TextEncoder().encode(`${GOOD}\n`.repeat(2000));
    const body = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(new TextEncoder().encode(`${HEADER}\n`));
      },
      pull(controller) {
        if (sent >= 200 * 2 ** 20) return controller.close();
        sent += piece.byteLength;
        controller.enqueue(piece);
      },
    });
    const request = new Request("http://fitledger.test/api/imports?name=streamed.csv", { method: "POST", body, headers: { "content-type": "text/csv" }, duplex: "half" } as RequestInit);
    const response = await upload(request);
    expect(response.status).toBe(413);
    expect(sent).toBeLessThan(52 * 2 ** 20);
    const batch = await ImportBatch.findOne({ where: { fileName: "streamed.csv" } });
    expect(batch?.status).toBe("failed");
    expect(await ImportChunk.count({ where: { batchId: batch!.id } })).toBe(0);
  });

  it("refuses a file that is not .csv, and a form upload", async () => {
    const named = await upload(new Request("http://fitledger.test/api/imports?name=sheet.xlsx", { method: "POST", body: "x", headers: { "content-type": "text/csv" } }));
    expect(named.status).toBe(400);
    expect((await named.json()).error.message).toMatch(/must end in \.csv/);
    const form = new FormData();
    form.set("sheet", new Blob(["a"]), "a.csv");
    const multipart = await upload(new Request("http://fitledger.test/api/imports?name=a.csv", { method: "POST", body: form }));
    expect(multipart.status).toBe(415);
  });

  it("accepts a UTF-8 sheet with a byte order mark, ';' between cells and CRLF line ends", async () => {
    const sheet = "\uFEFF" + [HEADER, GOOD.replace("bad-input.1", "bad-input.4")].map((line) => line.replaceAll(",", ";")).join("\r\n") + "\r\n";
    const response = await upload(new Request("http://fitledger.test/api/imports?name=semicolons.csv", { method: "POST", body: sheet, headers: { "content-type": "text/csv" } }));
    expect(response.status).toBe(202);
    const { id } = await response.json();
    for (let i = 0; i < 100 && (await ImportBatch.findByPk(id))?.status === "validating"; i++) await new Promise((resolve) => setTimeout(resolve, 50));
    expect(await ImportBatch.findByPk(id)).toMatchObject({ status: "previewed", totalRows: 1, acceptedRows: 1, rejectedRows: 0 });
  });
});

describe("a commit that fails part-way", () => {
  /**
   * Imports `labels` as comparisons of one new paper while the database refuses any comparison labelled
   * "Boom" (a real write failure inside the transaction), and checks that nothing of it stayed.
   */
  async function importWithRefusedRow(doi: string, labels: string[]) {
    await database.sequelize.query("CREATE TRIGGER refuse_boom BEFORE INSERT ON comparisons WHEN NEW.label = 'Boom' BEGIN SELECT RAISE(ABORT, 'forced failure'); END");
    const before = [...(await stored()), await AuditEvent.count()];
    const rows = labels.map((label, i) => `${doi},A paper that fails,S${i},300,${label},lrt,9.20,2,A,40.10,26,B,30.90,24`);
    const batch = await importSheet(coder, [HEADER, ...rows].join("\n"));
    await database.sequelize.query("DROP TRIGGER refuse_boom");
    expect(batch.status).toBe("failed");
    expect(batch.failure).toMatch(/rolled back: nothing of this sheet was stored/);
    expect([...(await stored()), await AuditEvent.count()]).toEqual(before);
    expect(await Paper.count({ where: { doi } })).toBe(0);
  }

  it("leaves the database exactly as it was and says so on the batch", async () => {
    await importWithRefusedRow("10.5555/bad-input.5", ["C1", "C2", "Boom", "C4"]);
  });

  it("rolls back a failure in a batch written while the next rows are prepared", async () => {
    // 3 000 rows write in three batches; the second holds row 1 500, whose comparison the database refuses
    // while the importer already plans the rows after it
    await importWithRefusedRow("10.5555/bad-input.6", Array.from({ length: 3000 }, (_, i) => (i === 1499 ? "Boom" : `C${i}`)));
  });
});
