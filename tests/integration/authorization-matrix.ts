// The authorization matrix: who may call each API route handler and each server action. One row per
// exported HTTP method of every app/api/**/route.ts and per export of every app/**/actions.ts.
// tests/integration/authorization-matrix.test.ts walks those files and fails when a handler has no row
// here, a row names nothing, or a handler does not answer each kind of caller as its row says.
//
// A feature that adds a route or an action adds its row here. `access` is the least role allowed
// ("public": anyone, signed in or not). A public handler without the guard's mark must say why in
// `unguarded`. Probes are sent by every kind of caller, so choose ones that change nothing: an empty
// body is refused by validation, which the guard only reaches after the session and role checks.

import type { Access } from "@/lib/auth/guard";

export type HttpMethod = "GET" | "HEAD" | "POST" | "PUT" | "PATCH" | "DELETE" | "OPTIONS";
export const HTTP_METHODS: HttpMethod[] = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"];

export const CALLERS = ["anonymous", "reader", "contributor", "curator", "admin", "suspended"] as const;
export type Caller = (typeof CALLERS)[number];

export interface RouteRow {
  /** the route file, relative to app/api */
  file: string;
  method: HttpMethod;
  access: Access;
  /** a concrete address for the probe request, with its dynamic segment values */
  path: string;
  params?: Record<string, string | string[]>;
  /** JSON body of the probe (default: none) */
  body?: unknown;
  /** for a public handler that does not go through the guard: why that is safe */
  unguarded?: string;
}

export interface ActionRow {
  /** the actions file, relative to app */
  file: string;
  /** the exported action */
  name: string;
  access: Access;
}

const CATCH_ALL = "answers a JSON 404 for API addresses without a handler; reads and writes nothing";

export const ROUTE_MATRIX: RouteRow[] = [
  { file: "health/route.ts", method: "GET", access: "public", path: "/api/health", unguarded: "liveness probe; read-only" },
  { file: "recheck/route.ts", method: "POST", access: "public", path: "/api/recheck", body: {}, unguarded: "stateless recheck of the posted numbers; touches no stored data" },
  ...(["GET", "POST", "PUT", "PATCH", "DELETE"] as const).map(
    (method): RouteRow => ({ file: "[...path]/route.ts", method, access: "public", path: "/api/no-such-endpoint", params: { path: ["no-such-endpoint"] }, unguarded: CATCH_ALL }),
  ),
  {
    file: "auth/[...nextauth]/route.ts",
    method: "GET",
    access: "public",
    path: "/api/auth/csrf",
    params: { nextauth: ["csrf"] },
    unguarded: "next-auth's own endpoints (CSRF token, session); each checks what it needs",
  },
  {
    file: "auth/[...nextauth]/route.ts",
    method: "POST",
    access: "public",
    path: "/api/auth/callback/credentials",
    params: { nextauth: ["callback", "credentials"] },
    unguarded: "the sign-in itself: CSRF token and password checked by next-auth, rate-limited in front",
  },
  { file: "account/apply/route.ts", method: "POST", access: "public", path: "/api/account/apply", body: {} },
  { file: "account/password-reset/route.ts", method: "POST", access: "public", path: "/api/account/password-reset", body: {} },
  // curation (issue 5)
  { file: "doi/route.ts", method: "GET", access: "contributor", path: "/api/doi" },
  { file: "curation/citations/route.ts", method: "POST", access: "contributor", path: "/api/curation/citations", body: {} },
  { file: "curation/papers/[id]/route.ts", method: "PUT", access: "contributor", path: "/api/curation/papers/999999", params: { id: "999999" }, body: {} },
  { file: "papers/[id]/route.ts", method: "GET", access: "public", path: "/api/papers/999999", params: { id: "999999" }, unguarded: "read-only; answers verified papers only, names of coder and verifier but no account details" },
  { file: "admin/recheck/route.ts", method: "GET", access: "admin", path: "/api/admin/recheck" },
  { file: "admin/recheck/route.ts", method: "POST", access: "admin", path: "/api/admin/recheck", body: {} },
  { file: "comparisons/route.ts", method: "GET", access: "public", path: "/api/comparisons", unguarded: "read-only search of verified entries; mine=1 and other entry states go through the guard (lib/search/scope.ts)" },
  { file: "stats/route.ts", method: "GET", access: "public", path: "/api/stats", unguarded: "read-only statistics of verified entries; wider scopes go through the guard (lib/search/scope.ts)" },
  { file: "export/route.ts", method: "GET", access: "public", path: "/api/export?format=json", unguarded: "read-only download of verified entries; mine=1 goes through the guard (lib/search/scope.ts)" },
  { file: "openapi.json/route.ts", method: "GET", access: "public", path: "/api/openapi.json", unguarded: "a static description of the API; reads no data" },
  // sheet import (issue 6): an allowed caller without a file name or with an unknown import id is refused after the guard
  { file: "imports/route.ts", method: "POST", access: "contributor", path: "/api/imports" },
  { file: "imports/[id]/route.ts", method: "GET", access: "contributor", path: "/api/imports/999999", params: { id: "999999" } },
  { file: "imports/[id]/commit/route.ts", method: "POST", access: "contributor", path: "/api/imports/999999/commit", params: { id: "999999" } },
  { file: "imports/[id]/rejected/route.ts", method: "GET", access: "contributor", path: "/api/imports/999999/rejected", params: { id: "999999" } },
  { file: "imports/[id]/doi-retry/route.ts", method: "POST", access: "contributor", path: "/api/imports/999999/doi-retry", params: { id: "999999" } },
  { file: "imports/own-entries/route.ts", method: "GET", access: "contributor", path: "/api/imports/own-entries?format=csv" },
  {
    file: "imports/files/[name]/route.ts",
    method: "GET",
    access: "public",
    path: "/api/imports/files/CODEBOOK.md",
    params: { name: "CODEBOOK.md" },
    unguarded: "the sheet template, codebook and invented example sheets of imports/; a fixed list of files, read-only",
  },
];

export const ACTION_MATRIX: ActionRow[] = [
  { file: "(auth)/actions.ts", name: "submitApplication", access: "public" },
  { file: "(auth)/actions.ts", name: "requestResetLink", access: "public" },
  { file: "(auth)/actions.ts", name: "setPasswordFromLink", access: "public" },
  { file: "(account)/account/actions.ts", name: "saveProfile", access: "reader" },
  { file: "(account)/account/actions.ts", name: "changeOwnPassword", access: "reader" },
  { file: "(admin)/admin/people/actions.ts", name: "approveApplicant", access: "admin" },
  { file: "(admin)/admin/people/actions.ts", name: "declineApplicant", access: "admin" },
  { file: "(admin)/admin/people/actions.ts", name: "suspendAccount", access: "admin" },
  { file: "(admin)/admin/people/actions.ts", name: "reactivateAccount", access: "admin" },
  { file: "(admin)/admin/people/actions.ts", name: "changeAccountRole", access: "admin" },
  { file: "(admin)/admin/outbox/actions.ts", name: "retryOutboxMessage", access: "admin" },
  // curation (issue 5)
  { file: "(workbench)/workbench/actions.ts", name: "createPaperFromForm", access: "contributor" },
  { file: "(workbench)/workbench/actions.ts", name: "submitForVerification", access: "contributor" },
  { file: "(workbench)/review/actions.ts", name: "verifyPaperEntry", access: "curator" },
  { file: "(workbench)/review/actions.ts", name: "returnPaperEntry", access: "curator" },
  { file: "(workbench)/review/actions.ts", name: "recordFindingVerdict", access: "curator" },
  { file: "(workbench)/review/corrections/actions.ts", name: "changeCorrectionStatus", access: "curator" },
  { file: "(public)/papers/[id]/actions.ts", name: "sendPaperCorrection", access: "public" },
  { file: "(public)/explore/actions.ts", name: "saveSearch", access: "reader" },
  { file: "(public)/explore/actions.ts", name: "removeSavedSearch", access: "reader" },
  { file: "(public)/explore/actions.ts", name: "changeSearchAlerts", access: "reader" },
];
