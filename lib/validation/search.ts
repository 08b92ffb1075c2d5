// The search filters of Explore, Insights and the public API (DESIGN §6), read from a URL query. One
// schema for the page (client) and the route handlers (server), so a shared address means the same
// search everywhere. Plain data only: this module is imported in the browser.
import { z } from "zod";
import { FINDING_CODES } from "@/lib/recheck/catalogue";
import { ESTIMATORS, METHODS, SEVERITIES } from "@/lib/recheck/types";
import type { Verdict } from "@/models/flag-disposition";
import type { EntryState } from "@/models/paper";

// Listed here rather than imported: the model files pull in Sequelize, which has no place in a browser
// bundle. The `satisfies` lines fail to compile if the models gain a value missing here.
export const SEARCH_STATES = ["draft", "submitted", "returned", "verified"] as const satisfies readonly EntryState[];
/** a curator's verdict, or `none` for a finding nobody has ruled on yet */
export const DISPOSITION_VALUES = ["confirmed", "coding_error", "explained", "engine_limitation", "none"] as const satisfies readonly (Verdict | "none")[];
type Complete<All, Listed> = Exclude<All, Listed> extends never ? true : never;
const statesComplete: Complete<EntryState, (typeof SEARCH_STATES)[number]> = true;
const verdictsComplete: Complete<Verdict, (typeof DISPOSITION_VALUES)[number]> = true;
void statesComplete;
void verdictsComplete;

export const SORT_KEYS = ["year", "journal", "title", "comparison", "method", "groups", "findings"] as const;
export type SortKey = (typeof SORT_KEYS)[number];
export const SORT_VALUES = SORT_KEYS.flatMap((key) => [key, `-${key}`] as const) as readonly `${"" | "-"}${SortKey}`[];
export type SortValue = (typeof SORT_VALUES)[number];
export const DEFAULT_SORT: SortValue = "-year";
export const MAX_PER_PAGE = 200;
export const DEFAULT_PER_PAGE = 25;
export const MAX_QUERY_LENGTH = 200;

/** the parameters of a search; enumerated lists may be comma-separated, journal and field repeat */
export const FILTER_PARAMS = ["q", "code", "severity", "disposition", "method", "estimator", "groups", "year_from", "year_to", "journal", "field", "state", "mine"] as const;
const LIST_PARAMS = new Set(["code", "severity", "disposition", "method", "estimator", "groups", "state"]);
const REPEATED_PARAMS = new Set(["journal", "field"]);

const enumList = <T extends readonly [string, ...string[]]>(values: T, what: string) =>
  z.array(z.enum(values, { error: (issue) => `unknown ${what} "${String(issue.input)}"` })).transform((list) => [...new Set(list)]);

const year = z.coerce
  .number({ error: "must be a year" })
  .int({ error: "must be a whole year" })
  .min(1900, { error: "must be 1900 or later" })
  .max(2100, { error: "must be 2100 or earlier" })
  .optional();

export const searchFiltersSchema = z
  .strictObject(
    {
      q: z.string().trim().max(MAX_QUERY_LENGTH, { error: `must be at most ${MAX_QUERY_LENGTH} characters` }).optional().transform((value) => value || undefined),
      code: enumList(FINDING_CODES as unknown as readonly [string, ...string[]], "finding code").default([]),
      severity: enumList(SEVERITIES, "severity").default([]),
      disposition: enumList(DISPOSITION_VALUES, "disposition").default([]),
      method: enumList(METHODS, "method").default([]),
      estimator: enumList(ESTIMATORS, "estimator").default([]),
      groups: z
        .array(z.coerce.number({ error: "must be whole numbers" }).int({ error: "must be whole numbers" }).min(1, { error: "must be 1 or more" }).max(1000))
        .transform((list) => [...new Set(list)].sort((a, b) => a - b))
        .default([]),
      year_from: year,
      year_to: year,
      journal: z.array(z.string().trim().min(1).max(300)).transform((list) => [...new Set(list)]).default([]),
      field: z.array(z.string().trim().min(1).max(100)).transform((list) => [...new Set(list)]).default([]),
      state: enumList(SEARCH_STATES, "entry state").default([]),
      mine: z.enum(["1", "0"], { error: "must be 1 or 0" }).optional().transform((value) => value === "1"),
    },
    { error: (issue) => (issue.code === "unrecognized_keys" ? `unknown parameter ${issue.keys.map((key) => `"${key}"`).join(", ")}` : undefined) },
  )
  .refine((value) => value.year_from === undefined || value.year_to === undefined || value.year_from <= value.year_to, {
    error: "year_from must not be after year_to",
    path: ["year_from"],
  });

export type SearchFiltersInput = z.input<typeof searchFiltersSchema>;

/** A parsed search: what is selected in every facet (empty list = no restriction). */
export interface SearchFilters {
  q?: string;
  code: string[];
  severity: string[];
  disposition: string[];
  method: string[];
  estimator: string[];
  groups: number[];
  yearFrom?: number;
  yearTo?: number;
  journal: string[];
  field: string[];
  state: string[];
  mine: boolean;
}

export const EMPTY_FILTERS: SearchFilters = { code: [], severity: [], disposition: [], method: [], estimator: [], groups: [], journal: [], field: [], state: [], mine: false };

export const pagingSchema = z.strictObject({
  page: z.coerce.number({ error: "must be a whole number" }).int({ error: "must be a whole number" }).min(1, { error: "must be 1 or more" }).max(100_000).default(1),
  per_page: z.coerce
    .number({ error: "must be a whole number" })
    .int({ error: "must be a whole number" })
    .min(1, { error: "must be 1 or more" })
    .max(MAX_PER_PAGE, { error: `must be at most ${MAX_PER_PAGE}` })
    .default(DEFAULT_PER_PAGE),
  sort: z.enum(SORT_VALUES as unknown as readonly [string, ...string[]], { error: `must be one of ${SORT_VALUES.join(", ")}` }).default(DEFAULT_SORT),
});

export interface Paging {
  page: number;
  perPage: number;
  sort: SortValue;
}

export type ParamProblems = Record<string, string[]>;

export type Parsed<T> = { ok: true; value: T } | { ok: false; problems: ParamProblems };

/**
 * URL query → the raw shape the schemas read: list parameters collected from repeats (and, for
 * enumerated values, from commas); single parameters keep their last value. `allowed` names the
 * parameters the caller reads besides the filters; any other parameter is refused by name.
 */
export function readQuery(params: URLSearchParams, extra: readonly string[] = []): { filters: Record<string, unknown>; rest: Record<string, string>; unknown: string[] } {
  const filters: Record<string, unknown> = {};
  const rest: Record<string, string> = {};
  const unknown: string[] = [];
  for (const key of new Set(params.keys())) {
    const values = params.getAll(key);
    if (LIST_PARAMS.has(key)) filters[key] = values.flatMap((value) => value.split(",")).map((value) => value.trim()).filter(Boolean);
    else if (REPEATED_PARAMS.has(key)) filters[key] = values.map((value) => value.trim()).filter(Boolean);
    else if ((FILTER_PARAMS as readonly string[]).includes(key)) filters[key] = values.at(-1);
    else if (extra.includes(key)) rest[key] = values.at(-1) ?? "";
    else unknown.push(key);
  }
  return { filters, rest, unknown };
}

function problemsOf(error: z.ZodError): ParamProblems {
  const problems: ParamProblems = {};
  for (const issue of error.issues) {
    const key = issue.code === "unrecognized_keys" ? issue.keys[0] : String(issue.path[0] ?? "query");
    (problems[key] ??= []).push(issue.message);
  }
  return problems;
}

export function toFilters(value: z.output<typeof searchFiltersSchema>): SearchFilters {
  return {
    q: value.q,
    code: value.code,
    severity: value.severity,
    disposition: value.disposition,
    method: value.method,
    estimator: value.estimator,
    groups: value.groups,
    yearFrom: value.year_from,
    yearTo: value.year_to,
    journal: value.journal,
    field: value.field,
    state: value.state,
    mine: value.mine,
  };
}

/** Reads the filters and, when asked, paging from a URL query; unknown parameters are problems. */
/** A page's searchParams (Next.js: a value, a list for a repeated key, or undefined) as URLSearchParams. */
export function searchParamsOf(record: Record<string, string | string[] | undefined>): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(record)) for (const item of Array.isArray(value) ? value : value === undefined ? [] : [value]) params.append(key, item);
  return params;
}

export function parseSearchQuery(params: URLSearchParams, options: { paging?: boolean; extra?: readonly string[] } = {}): Parsed<{ filters: SearchFilters; paging: Paging; rest: Record<string, string> }> {
  const pagingKeys = options.paging ? ["page", "per_page", "sort"] : [];
  const { filters: raw, rest, unknown } = readQuery(params, [...pagingKeys, ...(options.extra ?? [])]);
  const problems: ParamProblems = {};
  for (const key of unknown) problems[key] = [`unknown parameter "${key}"`];
  const parsedFilters = searchFiltersSchema.safeParse(raw);
  if (!parsedFilters.success) Object.assign(problems, problemsOf(parsedFilters.error));
  const pagingRaw = Object.fromEntries(pagingKeys.filter((key) => key in rest).map((key) => [key, rest[key]]));
  const parsedPaging = pagingSchema.safeParse(pagingRaw);
  if (!parsedPaging.success) Object.assign(problems, problemsOf(parsedPaging.error));
  if (Object.keys(problems).length > 0 || !parsedFilters.success || !parsedPaging.success) return { ok: false, problems };
  const others = Object.fromEntries(Object.entries(rest).filter(([key]) => !pagingKeys.includes(key)));
  return {
    ok: true,
    value: { filters: toFilters(parsedFilters.data), paging: { page: parsedPaging.data.page, perPage: parsedPaging.data.per_page, sort: parsedPaging.data.sort as SortValue }, rest: others },
  };
}

/**
 * Filters (and paging, when given) → the canonical URL query: a fixed parameter order, enumerated
 * lists comma-joined in catalogue order, defaults left out. The same search always gives the same text.
 */
export function filtersToQuery(filters: SearchFilters, paging?: Partial<Paging>): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.q) params.set("q", filters.q);
  const ordered = (values: string[], order: readonly string[]) => [...values].sort((a, b) => order.indexOf(a) - order.indexOf(b)).join(",");
  if (filters.code.length) params.set("code", ordered(filters.code, FINDING_CODES));
  if (filters.severity.length) params.set("severity", ordered(filters.severity, SEVERITIES));
  if (filters.disposition.length) params.set("disposition", ordered(filters.disposition, DISPOSITION_VALUES));
  if (filters.method.length) params.set("method", ordered(filters.method, METHODS));
  if (filters.estimator.length) params.set("estimator", ordered(filters.estimator, ESTIMATORS));
  if (filters.groups.length) params.set("groups", [...filters.groups].sort((a, b) => a - b).join(","));
  if (filters.yearFrom !== undefined) params.set("year_from", String(filters.yearFrom));
  if (filters.yearTo !== undefined) params.set("year_to", String(filters.yearTo));
  for (const journal of [...filters.journal].sort()) params.append("journal", journal);
  for (const field of [...filters.field].sort()) params.append("field", field);
  if (filters.state.length) params.set("state", ordered(filters.state, SEARCH_STATES));
  if (filters.mine) params.set("mine", "1");
  if (paging?.sort && paging.sort !== DEFAULT_SORT) params.set("sort", paging.sort);
  if (paging?.page && paging.page > 1) params.set("page", String(paging.page));
  if (paging?.perPage && paging.perPage !== DEFAULT_PER_PAGE) params.set("per_page", String(paging.perPage));
  return params;
}

export function hasAnyFilter(filters: SearchFilters): boolean {
  return filtersToQuery(filters).size > 0;
}

// ---- saved searches ------------------------------------------------------------------------------

/** a saved Explore view: its name, its query (the Explore URL's, without page), e-mail alerts or not */
export const saveSearchSchema = z.object({
  name: z.string({ error: "Give the search a name." }).trim().min(1, { error: "Give the search a name." }).max(200, { error: "At most 200 characters." }),
  query: z
    .string({ error: "There is no search to save." })
    .max(2000, { error: "This search is too long to save." })
    .transform((value, context) => {
      const parsed = parseSearchQuery(new URLSearchParams(value.replace(/^\?/, "")), { paging: true, extra: ["cols"] });
      if (!parsed.ok) {
        context.addIssue({ code: "custom", message: `The search has a parameter we cannot read: ${Object.keys(parsed.problems).join(", ")}.` });
        return z.NEVER;
      }
      // pages are not part of a saved view; the sort and the columns are
      const params = filtersToQuery(parsed.value.filters, { sort: parsed.value.paging.sort, perPage: parsed.value.paging.perPage });
      if (parsed.value.rest.cols !== undefined) params.set("cols", parsed.value.rest.cols);
      return params.toString();
    }),
  alerts: z
    .union([z.literal("on"), z.literal("true"), z.literal("1"), z.literal("off"), z.literal("false"), z.literal("0"), z.boolean()])
    .optional()
    .transform((value) => value === true || value === "on" || value === "true" || value === "1"),
});

export const savedSearchIdSchema = z.object({ id: z.coerce.number({ error: "Which saved search?" }).int().positive({ error: "Which saved search?" }) });

export const savedSearchAlertsSchema = savedSearchIdSchema.extend({
  alerts: z.enum(["on", "off"], { error: "Choose on or off." }).transform((value) => value === "on"),
});
