import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../support/test-db";
import { ACTION_MATRIX, CALLERS, HTTP_METHODS, ROUTE_MATRIX, type ActionRow, type Caller, type RouteRow } from "./authorization-matrix";

// Every kind of caller against every route handler and server action (see authorization-matrix.ts).
// The session is replaced at the test's edge (lib/auth/session.ts); the accounts, their roles and
// statuses are real rows in a temp database, read by the real guard.

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.99",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

const { guardOf } = await import("@/lib/auth/guard");
const { hasRole } = await import("@/lib/auth/roles");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { clearRateLimits } = await import("@/lib/auth/limits");
const { hashPassword } = await import("@/lib/auth/password");
const { db } = await import("@/lib/db");

const appDir = fileURLToPath(new URL("../../app", import.meta.url));
const apiDir = path.join(appDir, "api");

function filesNamed(folder: string, name: string, skip: string[] = []): string[] {
  const found: string[] = [];
  for (const entry of fs.readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory() && !skip.includes(full)) found.push(...filesNamed(full, name, skip));
    else if (entry.isFile() && entry.name === name) found.push(full);
  }
  return found;
}

const relative = (from: string, file: string) => path.relative(from, file).split(path.sep).join("/");
const routeFiles = filesNamed(apiDir, "route.ts").map((file) => relative(apiDir, file)).sort();
const actionFiles = filesNamed(appDir, "actions.ts", [apiDir]).map((file) => relative(appDir, file)).sort();

type Handler = (request: Request, context: { params: Promise<Record<string, unknown>> }) => Promise<Response>;
type Action = (previous: typeof IDLE_STATE, formData: FormData) => Promise<{ ok: boolean; code?: string }>;
const routeModules = new Map<string, Record<string, unknown>>();
const actionModules = new Map<string, Record<string, unknown>>();
for (const file of routeFiles) routeModules.set(file, await import(/* @vite-ignore */ path.join(apiDir, file)));
for (const file of actionFiles) actionModules.set(file, await import(/* @vite-ignore */ path.join(appDir, file)));

const callerIds = new Map<Caller, number | null>();
let database: TestDatabase;

beforeAll(async () => {
  database = await createTestDatabase();
  const { models } = await db();
  const passwordHash = await hashPassword("matrix-caller-password");
  callerIds.set("anonymous", null);
  for (const kind of CALLERS) {
    if (kind === "anonymous") continue;
    const role = kind === "suspended" ? "contributor" : kind;
    const user = await models.User.create({ email: `${kind}@matrix.test`, name: `Matrix ${kind}`, affiliation: null, reason: null, passwordHash, role, status: kind === "suspended" ? "suspended" : "active", statusNote: null });
    callerIds.set(kind, user.id);
  }
});
afterAll(async () => {
  await database.destroy();
});

/** What the matrix promises this caller: allowed through, or refused with 401 / 403. */
function expected(access: RouteRow["access"], kind: Caller): "allow" | 401 | 403 {
  if (access === "public") return "allow";
  if (kind === "anonymous" || kind === "suspended") return 401;
  return hasRole(kind, access) ? "allow" : 403;
}

const routeKey = (file: string, method: string) => `${method} ${file}`;
const actionKey = (file: string, name: string) => `${file}#${name}`;

describe("the matrix covers every handler, and only those", () => {
  it("finds the app's route files and action files", () => {
    expect(routeFiles).toContain("health/route.ts");
    expect(actionFiles).toContain("(admin)/admin/people/actions.ts");
  });

  it("every exported HTTP method of every app/api route has exactly one row", () => {
    const exported = routeFiles.flatMap((file) => HTTP_METHODS.filter((method) => typeof routeModules.get(file)![method] === "function").map((method) => routeKey(file, method)));
    const rows = ROUTE_MATRIX.map((row) => routeKey(row.file, row.method));
    expect(new Set(rows).size).toBe(rows.length);
    expect(exported.filter((key) => !rows.includes(key))).toEqual([]); // handlers without a row
    expect(rows.filter((key) => !exported.includes(key))).toEqual([]); // rows without a handler
  });

  it("every export of every actions.ts has exactly one row", () => {
    const exported = actionFiles.flatMap((file) => Object.keys(actionModules.get(file)!).map((name) => actionKey(file, name)));
    const rows = ACTION_MATRIX.map((row) => actionKey(row.file, row.name));
    expect(new Set(rows).size).toBe(rows.length);
    expect(exported.filter((key) => !rows.includes(key))).toEqual([]);
    expect(rows.filter((key) => !exported.includes(key))).toEqual([]);
  });

  it("every route that is not public, and every action, goes through the guard with the row's access", () => {
    const problems: string[] = [];
    for (const row of ROUTE_MATRIX) {
      const mark = guardOf(routeModules.get(row.file)?.[row.method]);
      if (row.access !== "public" && mark?.access !== row.access) problems.push(`${routeKey(row.file, row.method)}: guard ${mark?.access ?? "missing"}, row says ${row.access}`);
      if (row.access === "public" && mark && mark.access !== "public") problems.push(`${routeKey(row.file, row.method)}: guarded as ${mark.access} but the row says public`);
      if (row.access === "public" && !mark && !row.unguarded) problems.push(`${routeKey(row.file, row.method)}: public without the guard needs a reason in \`unguarded\``);
    }
    for (const row of ACTION_MATRIX) {
      const mark = guardOf(actionModules.get(row.file)?.[row.name]);
      if (mark?.access !== row.access) problems.push(`${actionKey(row.file, row.name)}: guard ${mark?.access ?? "missing"}, row says ${row.access}`);
    }
    expect(problems).toEqual([]);
  });
});

async function probeRoute(row: RouteRow): Promise<Response> {
  const handler = routeModules.get(row.file)![row.method] as Handler;
  const init: RequestInit = { method: row.method, headers: { "x-forwarded-for": "203.0.113.98" } };
  if (row.body !== undefined) {
    init.body = JSON.stringify(row.body);
    init.headers = { ...init.headers, "content-type": "application/json" };
  }
  return handler(new Request(`http://fitledger.test${row.path}`, init), { params: Promise.resolve(row.params ?? {}) });
}

describe.each(ROUTE_MATRIX.map((row) => [`${row.method} ${row.path} (${row.access})`, row] as const))("%s", (_name, row) => {
  it.each(CALLERS.map((kind) => [kind, expected(row.access, kind)] as const))("%s: %s", async (kind, outcome) => {
    clearRateLimits();
    caller.userId = callerIds.get(kind) ?? null;
    const response = await probeRoute(row);
    if (outcome === "allow") {
      expect([401, 403]).not.toContain(response.status);
    } else {
      expect(response.status).toBe(outcome);
      expect((await response.json()).error.code).toBe(outcome === 401 ? "unauthenticated" : "forbidden");
    }
  });
});

describe.each(ACTION_MATRIX.map((row: ActionRow) => [`${row.file} ${row.name} (${row.access})`, row] as const))("%s", (_name, row) => {
  it.each(CALLERS.map((kind) => [kind, expected(row.access, kind)] as const))("%s: %s", async (kind, outcome) => {
    clearRateLimits();
    caller.userId = callerIds.get(kind) ?? null;
    const action = actionModules.get(row.file)![row.name] as Action;
    // an empty form: an allowed caller reaches validation and is refused there, so nothing changes
    const state = await action(IDLE_STATE, new FormData());
    if (outcome === "allow") expect(state).toMatchObject({ ok: false, code: "validation_failed" });
    else expect(state).toMatchObject({ ok: false, code: outcome === 401 ? "unauthenticated" : "forbidden" });
  });
});
