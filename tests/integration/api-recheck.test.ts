// POST /api/recheck: the route handler called directly with a Request, no server.
import { describe, expect, it } from "vitest";
import { POST } from "@/app/api/recheck/route";
import { ENGINE_VERSION, type RecheckResult } from "@/lib/recheck";

const URL_ = "http://fitledger.test/api/recheck";

function post(body: string, contentType: string | null = "application/json"): Promise<Response> {
  const headers = new Headers();
  if (contentType) headers.set("content-type", contentType);
  return POST(new Request(URL_, { method: "POST", headers, body }));
}

// One factor vs three factors on the Holzinger & Swineford (1939) data, N = 301, as lavaan 0.6.14 fits
// them (../shared/reference/lavaan-holzinger-swineford.json, comparison hs1_vs_hs3_ML), rounded as a
// paper would print them; the printed Δdf of 2 is a planted error (27 − 24 = 3).
const FLAT = {
  comparison: "One vs three factors",
  method: "lrt",
  nested: "yes",
  n: 301,
  d_chisq: "226.96",
  d_df: "2",
  d_p: "< .001",
  a_label: "One factor",
  a_estimator: "ML",
  a_chisq: "312.26",
  a_df: 27,
  a_p: "< .001",
  a_cfi: ".677",
  a_rmsea: ".187",
  b_label: "Three factors",
  b_estimator: "ML",
  b_chisq: "85.31",
  b_df: 24,
  b_p: "< .001",
  b_cfi: ".931",
  b_rmsea: ".092",
};

const STRUCTURED = {
  label: "One vs three factors",
  method: "lrt",
  nested: "yes",
  dChisq: "226.96",
  dDf: "2",
  dP: "< .001",
  sample: { n: "301" },
  restricted: { label: "One factor", estimator: "ML", chisq: "312.26", df: "27", p: "< .001", cfi: ".677", rmsea: ".187" },
  free: { label: "Three factors", estimator: "ML", chisq: "85.31", df: "24", p: "< .001", cfi: ".931", rmsea: ".092" },
};

describe("POST /api/recheck", () => {
  it("answers 200 with the engine's result for a flat body of sheet columns", async () => {
    const response = await post(JSON.stringify(FLAT));
    expect(response.status).toBe(200);
    const result = (await response.json()) as RecheckResult;
    expect(result.engineVersion).toBe(ENGINE_VERSION);
    expect(Array.isArray(result.findings)).toBe(true);
    expect(Array.isArray(result.skipped)).toBe(true);
  });

  it("gives a flat body and the same comparison in structured form the same findings", async () => {
    const [flat, structured] = await Promise.all([post(JSON.stringify(FLAT)), post(JSON.stringify(STRUCTURED))]);
    expect(structured.status).toBe(200);
    const a = (await flat.json()) as RecheckResult;
    const b = (await structured.json()) as RecheckResult;
    expect(a.findings.length).toBeGreaterThan(0);
    expect(b).toEqual(a);
  });

  it("finds the planted Δdf error: printed 2, but 27 − 24 = 3", async () => {
    const result = (await (await post(JSON.stringify(FLAT))).json()) as RecheckResult;
    expect(result.findings.map((f) => f.code)).toContain("df-difference-mismatch");
  });

  it("answers 400 validation_failed naming the column of an unreadable figure", async () => {
    const response = await post(JSON.stringify({ ...FLAT, a_chisq: "312,26" }));
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: { code: string; message: string; fields: Record<string, string[]> } };
    expect(body.error.code).toBe("validation_failed");
    expect(Object.keys(body.error.fields)).toEqual(["a_chisq"]);
    expect(body.error.fields.a_chisq[0]).toMatch(/312,26/);
  });

  it("names the sheet column for a bad figure in a structured body too (restricted.df → a_df)", async () => {
    const response = await post(JSON.stringify({ ...STRUCTURED, restricted: { ...STRUCTURED.restricted, df: true } }));
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: { fields: Record<string, string[]> } };
    expect(body.error.fields).toEqual({ a_df: ["must be the figure as printed (text) or a number"] });
  });

  it("refuses an unknown flat key with the column it was probably meant to be", async () => {
    const response = await post(JSON.stringify({ ...FLAT, a_chisqq: "1" }));
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: { fields: Record<string, string[]> } };
    expect(body.error.fields).toEqual({ a_chisqq: ['unknown column "a_chisqq" (did you mean "a_chisq"?)'] });
  });

  it("refuses an unknown structured key with the nearest field of that object", async () => {
    const response = await post(JSON.stringify({ ...STRUCTURED, free: { ...STRUCTURED.free, rmsae: ".1" } }));
    const body = (await response.json()) as { error: { fields: Record<string, string[]> } };
    expect(body.error.fields).toEqual({ "free.rmsae": ['unknown field "rmsae" (did you mean "rmsea"?)'] });
  });

  it("turns figures sent as JSON numbers into text, so 0.05 and \"0.05\" give the same result", async () => {
    const asText = await (await post(JSON.stringify({ ...FLAT, alpha: "0.05" }))).json();
    const asNumber = await (await post(JSON.stringify({ ...FLAT, alpha: 0.05 }))).json();
    expect(asNumber).toEqual(asText);
  });

  it("reads null as not reported, like an empty sheet cell", async () => {
    const { b_rmsea: _omitted, ...withoutRmsea } = FLAT;
    const asNull = await (await post(JSON.stringify({ ...FLAT, b_rmsea: null }))).json();
    const absent = await (await post(JSON.stringify(withoutRmsea))).json();
    expect(_omitted).toBe(".092");
    expect(asNull).toEqual(absent);
  });

  it("asks for both models in a structured body", async () => {
    const { free: _free, ...onlyRestricted } = STRUCTURED;
    const response = await post(JSON.stringify(onlyRestricted));
    expect(_free.label).toBe("Three factors");
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: { fields: Record<string, string[]> } };
    expect(Object.keys(body.error.fields)).toEqual(["free"]);
  });

  it("answers 400 for a body that is not valid JSON, and for JSON that is not an object", async () => {
    const broken = await post("{method: lrt");
    expect(broken.status).toBe(400);
    expect(((await broken.json()) as { error: { code: string } }).error.code).toBe("bad_request");
    const array = await post("[1, 2]");
    expect(array.status).toBe(400);
    expect(((await array.json()) as { error: { code: string } }).error.code).toBe("validation_failed");
  });

  it("answers 415 for a body that is not JSON by its content type", async () => {
    for (const type of ["text/csv", "application/x-www-form-urlencoded", null]) {
      const response = await post(JSON.stringify(FLAT), type);
      expect(response.status).toBe(415);
      expect(((await response.json()) as { error: { code: string } }).error.code).toBe("unsupported_media_type");
    }
  });

  it("accepts application/json with a charset parameter", async () => {
    expect((await post(JSON.stringify(FLAT), "application/json; charset=utf-8")).status).toBe(200);
  });

  it("answers 413 for a body over 64 KB, whether or not Content-Length says so", async () => {
    const oversize = JSON.stringify({ ...FLAT, notes: "x".repeat(70 * 1024) });
    const declared = await post(oversize);
    expect(declared.status).toBe(413);
    expect(((await declared.json()) as { error: { code: string } }).error.code).toBe("payload_too_large");

    // a streamed body carries no Content-Length: the limit must hold while reading
    const bytes = new TextEncoder().encode(oversize);
    const stream = new ReadableStream<Uint8Array>({
      start(controller) {
        for (let i = 0; i < bytes.length; i += 8192) controller.enqueue(bytes.subarray(i, i + 8192));
        controller.close();
      },
    });
    const request = new Request(URL_, { method: "POST", headers: { "content-type": "application/json" }, body: stream, duplex: "half" } as RequestInit);
    expect(request.headers.get("content-length")).toBeNull();
    expect((await POST(request)).status).toBe(413);
  });
});
