import { describe, expect, it } from "vitest";
import { openApiDocument } from "@/lib/search/openapi";
import { FILTER_PARAMS, parseSearchQuery } from "@/lib/validation/search";

// The OpenAPI description and the parser must agree: every documented parameter of /api/comparisons is
// accepted with a value its schema allows, and an undocumented one is refused.

type Parameter = { name: string; schema: { type: string; enum?: string[]; items?: { type: string; enum?: string[] }; minimum?: number } };

function sample(parameter: Parameter): string {
  const schema = parameter.schema.items ?? parameter.schema;
  if (schema.enum) return schema.enum[0];
  if (parameter.name.startsWith("year")) return "2010";
  if (schema.type === "integer") return String((parameter.schema as { minimum?: number }).minimum ?? 1);
  return "bifactor";
}

describe("the OpenAPI description", () => {
  const document = openApiDocument("http://fitledger.test");

  it("describes the search, statistics, export, paper, recheck and health endpoints", () => {
    expect(Object.keys(document.paths).sort()).toEqual(["/api/comparisons", "/api/export", "/api/health", "/api/papers/{id}", "/api/recheck", "/api/stats"]);
  });

  it("documents exactly the parameters the search accepts", () => {
    const parameters = document.paths["/api/comparisons"].get.parameters as Parameter[];
    for (const parameter of parameters) {
      const parsed = parseSearchQuery(new URLSearchParams({ [parameter.name]: sample(parameter) }), { paging: true });
      expect([parameter.name, parsed.ok]).toEqual([parameter.name, true]);
    }
    expect(parameters.map((parameter) => parameter.name).sort()).toEqual([...FILTER_PARAMS, "page", "per_page", "sort"].sort());
    expect(parseSearchQuery(new URLSearchParams({ undocumented: "1" }), { paging: true }).ok).toBe(false);
  });
});
