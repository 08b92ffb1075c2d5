import { FINDING_CODES } from "@/lib/recheck/catalogue";
import { ESTIMATORS, METHODS, SEVERITIES } from "@/lib/recheck/types";
import { DEFAULT_PER_PAGE, DISPOSITION_VALUES, MAX_PER_PAGE, MAX_QUERY_LENGTH, SEARCH_STATES, SORT_VALUES } from "@/lib/validation/search";

// The OpenAPI 3.1 description served at /api/openapi.json: the public endpoints of Fitledger, built
// from the same value lists the schemas validate against, so the description cannot drift from them.

const list = (description: string, values: readonly string[]) => ({
  in: "query",
  required: false,
  description: `${description} Several values: comma-separated or repeated.`,
  schema: { type: "array", items: { type: "string", enum: [...values] } },
  style: "form",
  explode: false,
});

const FILTER_PARAMETERS = [
  { name: "q", in: "query", required: false, description: "Free text over titles, authors, journals, DOIs and model labels; each word must match (the word itself, a longer word it begins, or a spelling one or two slips away).", schema: { type: "string", maxLength: MAX_QUERY_LENGTH } },
  { name: "code", ...list("Finding codes (DESIGN §4.3).", FINDING_CODES) },
  { name: "severity", ...list("Finding severities.", SEVERITIES) },
  { name: "disposition", ...list("Curator's ruling on a finding; `none` when nobody has ruled. Code, severity and disposition are matched on the same finding.", DISPOSITION_VALUES) },
  { name: "method", ...list("Comparison methods.", METHODS) },
  { name: "estimator", ...list("Estimator of either model.", ESTIMATORS) },
  { name: "groups", in: "query", required: false, description: "Number of groups of the sample (comma-separated whole numbers).", schema: { type: "array", items: { type: "integer", minimum: 1 } }, style: "form", explode: false },
  { name: "year_from", in: "query", required: false, description: "Earliest publication year.", schema: { type: "integer", minimum: 1900, maximum: 2100 } },
  { name: "year_to", in: "query", required: false, description: "Latest publication year.", schema: { type: "integer", minimum: 1900, maximum: 2100 } },
  { name: "journal", in: "query", required: false, description: "Journal name, exactly as listed in the facets; repeat the parameter for several.", schema: { type: "array", items: { type: "string" } }, style: "form", explode: true },
  { name: "field", in: "query", required: false, description: "Discipline tag; repeat the parameter for several.", schema: { type: "array", items: { type: "string" } }, style: "form", explode: true },
  { name: "state", ...list("Entry states other than verified: curators and admins only (403 otherwise).", SEARCH_STATES) },
  { name: "mine", in: "query", required: false, description: "1: the signed-in contributor's own entries, in any state (401/403 otherwise).", schema: { type: "string", enum: ["1", "0"] } },
];

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const errorResponse = (description: string) => ({ description, content: { "application/json": { schema: ref("Error") } } });
const proportion = ref("Proportion");

export function openApiDocument(serverUrl: string) {
  return {
    openapi: "3.1.0",
    info: {
      title: "Fitledger API",
      version: "1.0.0",
      description:
        "Verified model comparisons from published SEM/CFA papers, every test recomputed from the printed numbers. A finding is a possible inconsistency computed from the numbers as printed and as coded; it is not evidence of misconduct. Only verified entries are public.",
    },
    servers: [{ url: serverUrl }],
    paths: {
      "/api/comparisons": {
        get: {
          summary: "Search verified comparisons",
          parameters: [
            ...FILTER_PARAMETERS,
            { name: "page", in: "query", required: false, schema: { type: "integer", minimum: 1, default: 1 } },
            { name: "per_page", in: "query", required: false, schema: { type: "integer", minimum: 1, maximum: MAX_PER_PAGE, default: DEFAULT_PER_PAGE } },
            { name: "sort", in: "query", required: false, description: "A key, descending with a leading '-'; ties are ordered by comparison id.", schema: { type: "string", enum: [...SORT_VALUES], default: "-year" } },
          ],
          responses: {
            "200": { description: "One page of results, the total, and the facet counts", content: { "application/json": { schema: ref("SearchResult") } } },
            "400": errorResponse("A parameter is unknown or invalid; `error.fields` names it"),
            "401": errorResponse("`mine` or `state` need a signed-in account"),
            "403": errorResponse("`mine` or `state` need a higher role"),
          },
        },
      },
      "/api/stats": {
        get: {
          summary: "Prevalence of findings in the verified corpus or a filtered part of it",
          parameters: FILTER_PARAMETERS,
          responses: { "200": { description: "Shares with Wilson (1927) 95 % intervals, and the corpus snapshot to cite", content: { "application/json": { schema: ref("Stats") } } }, "400": errorResponse("A parameter is unknown or invalid") },
        },
      },
      "/api/export": {
        get: {
          summary: "Download the results of a search",
          parameters: [{ name: "format", in: "query", required: false, schema: { type: "string", enum: ["csv", "json", "bibtex", "ris"], default: "csv" }, description: "csv: the comparison sheet (one row per comparison, the import format); json; bibtex or ris: the papers" }, ...FILTER_PARAMETERS],
          responses: {
            "200": { description: "The file, streamed", content: { "text/csv": {}, "application/json": {}, "application/x-bibtex": {}, "application/x-research-info-systems": {} } },
            "400": errorResponse("A parameter is unknown or invalid"),
            "401": errorResponse("`mine=1` needs a signed-in account"),
          },
        },
      },
      "/api/papers/{id}": {
        get: {
          summary: "One verified paper with its samples, models, comparisons and findings",
          parameters: [{ name: "id", in: "path", required: true, schema: { type: "integer" } }],
          responses: { "200": { description: "The paper", content: { "application/json": { schema: { type: "object" } } } }, "404": errorResponse("No verified paper with this id") },
        },
      },
      "/api/recheck": {
        post: {
          summary: "Recheck one comparison (stateless)",
          requestBody: { required: true, content: { "application/json": { schema: { type: "object", description: "The sheet's flat columns (method, n, a_chisq, a_df, …) or {method, sample, restricted, free}; figures as printed text." } } } },
          responses: { "200": { description: "The engine's findings, skipped checks and recomputed values", content: { "application/json": { schema: { type: "object" } } } }, "400": errorResponse("Cells that cannot be read, keyed by sheet column") },
        },
      },
      "/api/health": {
        get: {
          summary: "Liveness",
          responses: { "200": { description: "The app answers and the database takes a query", content: { "application/json": { schema: { type: "object", properties: { status: { const: "ok" }, db: { const: "ok" } } } } } }, "503": { description: "The database is unreachable" } },
        },
      },
    },
    components: {
      schemas: {
        Error: { type: "object", required: ["error"], properties: { error: { type: "object", required: ["code", "message"], properties: { code: { type: "string" }, message: { type: "string" }, fields: { type: "object", additionalProperties: { type: "array", items: { type: "string" } } } } } } },
        FacetValue: { type: "object", required: ["value", "count"], properties: { value: { type: ["string", "integer"] }, count: { type: "integer", description: "results if this value alone were chosen in its facet" } } },
        Comparison: {
          type: "object",
          properties: {
            id: { type: "integer" },
            label: { type: "string" },
            method: { type: ["string", "null"], enum: [...METHODS, null] },
            sample: { type: "object", properties: { label: { type: "string" }, n: { type: ["integer", "null"] }, groups: { type: "integer" } } },
            restricted: { type: "object", properties: { label: { type: "string" }, estimator: { type: ["string", "null"] } } },
            free: { type: "object", properties: { label: { type: "string" }, estimator: { type: ["string", "null"] } } },
            paper: { type: "object", properties: { id: { type: "integer" }, title: { type: "string" }, authors: { type: "string" }, year: { type: ["integer", "null"] }, journal: { type: ["string", "null"] }, field: { type: ["string", "null"] }, doi: { type: ["string", "null"] }, state: { type: "string" } } },
            findings: { type: "array", items: { type: "object", properties: { code: { type: "string" }, severity: { type: "string", enum: [...SEVERITIES] }, disposition: { type: "string", enum: [...DISPOSITION_VALUES] } } } },
            href: { type: "string", description: "the paper page at this comparison, with the finding of interest highlighted" },
          },
        },
        SearchResult: {
          type: "object",
          required: ["items", "total", "facets"],
          properties: {
            items: { type: "array", items: ref("Comparison") },
            total: { type: "integer" },
            papers: { type: "integer" },
            page: { type: "integer" },
            per_page: { type: "integer" },
            pages: { type: "integer" },
            sort: { type: "string" },
            facets: { type: "object", additionalProperties: { type: "array", items: ref("FacetValue") } },
          },
        },
        Proportion: { type: "object", properties: { k: { type: "integer" }, n: { type: "integer" }, share: { type: ["number", "null"] }, low: { type: ["number", "null"] }, high: { type: ["number", "null"] } }, description: "k of n, with the Wilson 95 % score interval [low, high]" },
        Group: { type: "object", properties: { value: { type: ["string", "integer"] }, comparisons: { type: "integer" }, withError: proportion, flagged: proportion, papers: proportion } },
        Stats: {
          type: "object",
          properties: {
            snapshot: { type: "object", properties: { computedAt: { type: "string", format: "date-time" }, lastVerifiedAt: { type: ["string", "null"], format: "date-time" }, verifiedPapers: { type: "integer" }, verifiedComparisons: { type: "integer" }, engineVersion: { type: "string" }, findingEngineVersions: { type: "array", items: { type: "string" } } } },
            prevalence: {
              type: "object",
              properties: {
                comparisons: { type: "integer" },
                papers: { type: "integer" },
                comparisonsWithError: proportion,
                comparisonsFlagged: proportion,
                papersWithError: proportion,
                codes: { type: "array", items: { type: "object", properties: { code: { type: "string" }, title: { type: "string" }, severity: { type: "string" }, comparisons: proportion } } },
                byYear: { type: "array", items: ref("Group") },
                byJournal: { type: "array", items: ref("Group") },
                byEstimator: { type: "array", items: ref("Group") },
                byMethod: { type: "array", items: ref("Group") },
                trends: { type: "array", items: { type: "object", properties: { code: { type: "string" }, byYear: { type: "array", items: { type: "object", properties: { year: { type: "integer" }, share: proportion } } } } } },
              },
            },
          },
        },
      },
    },
  };
}
