import { describe, expect, it } from "vitest";
import { EMPTY_FILTERS, filtersToQuery, parseSearchQuery, saveSearchSchema, searchParamsOf } from "@/lib/validation/search";

const parse = (query: string, paging = true) => parseSearchQuery(new URLSearchParams(query), { paging });

describe("search filters in the URL", () => {
  it("reads comma lists and repeated parameters, and drops duplicates", () => {
    const parsed = parse("code=just-identified-model,negative-df&code=negative-df&journal=A%2C%20B&journal=C&groups=3,1&year_from=2001&year_to=2010&q=%20factor%20");
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.value.filters).toMatchObject({ q: "factor", code: ["just-identified-model", "negative-df"], journal: ["A, B", "C"], groups: [1, 3], yearFrom: 2001, yearTo: 2010 });
  });

  it("writes a canonical query that reads back to the same search", () => {
    const filters = { ...EMPTY_FILTERS, q: "bifactor", code: ["negative-df", "just-identified-model"], method: ["ic", "lrt"], journal: ["Zeta, Journal of", "Alpha"], yearFrom: 1999 };
    const query = filtersToQuery(filters, { sort: "title", page: 3, perPage: 50 });
    // catalogue order for codes and methods, alphabetical journals, defaults left out
    expect(query.toString()).toBe("q=bifactor&code=just-identified-model%2Cnegative-df&method=lrt%2Cic&year_from=1999&journal=Alpha&journal=Zeta%2C+Journal+of&sort=title&page=3&per_page=50");
    const again = parseSearchQuery(query, { paging: true });
    expect(again.ok && again.value.filters).toEqual({ ...filters, code: ["just-identified-model", "negative-df"], method: ["lrt", "ic"], journal: ["Alpha", "Zeta, Journal of"] });
    expect(again.ok && again.value.paging).toEqual({ page: 3, perPage: 50, sort: "title" });
  });

  it("names every bad parameter: unknown names, unknown values, out-of-range numbers", () => {
    const parsed = parse("colour=red&code=no-such-code&per_page=500&year_from=abc&sort=height");
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    expect(Object.keys(parsed.problems).sort()).toEqual(["code", "colour", "per_page", "sort", "year_from"]);
    expect(parsed.problems.per_page[0]).toMatch(/200/);
    expect(parsed.problems.code[0]).toMatch(/no-such-code/);
  });

  it("refuses a year range that runs backwards, and accepts per_page = 200", () => {
    const backwards = parse("year_from=2012&year_to=2001");
    expect(backwards.ok).toBe(false);
    expect(!backwards.ok && backwards.problems.year_from).toBeTruthy();
    expect(parse("per_page=200").ok).toBe(true);
  });

  it("saves a view without its page number but with its sort and columns", () => {
    const saved = saveSearchSchema.safeParse({ name: " Just-identified ", query: "?code=just-identified-model&page=4&sort=title&cols=year", alerts: "on" });
    expect(saved.success).toBe(true);
    expect(saved.data).toEqual({ name: "Just-identified", query: "code=just-identified-model&sort=title&cols=year", alerts: true });
    expect(saveSearchSchema.safeParse({ name: "x", query: "bogus=1" }).success).toBe(false);
  });
});

describe("searchParamsOf", () => {
  it("turns a page's searchParams into URLSearchParams, repeated keys in order, undefined left out", () => {
    const params = searchParamsOf({ code: ["zero-df-difference", "halved-p"], q: "invariance", page: undefined });
    expect(params.getAll("code")).toEqual(["zero-df-difference", "halved-p"]);
    expect(params.get("q")).toBe("invariance");
    expect(params.has("page")).toBe(false);
  });
});
