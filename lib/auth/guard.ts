import "server-only";
import { unstable_rethrow } from "next/navigation";
import { z } from "zod";
import { AppError, isAppError, type FieldErrors } from "@/lib/errors";
import { respond } from "@/lib/http/respond";
import type { ActionState, FormAction } from "./action-state";
import { readAccount } from "./account-cache";
import { db } from "@/lib/db";
import type { SessionUser } from "./current-user";
import { hasRole, type Role } from "./roles";
import { readClientAddress, readSession } from "./session";

// The one guard in front of every server action and every mutating route handler (STYLE habit 4):
// session → account status → role → zod validation, in that order, before the handler runs. The proxy
// only redirects pages; this is the check that counts. Each guarded function carries a mark naming its
// access level, which the authorization matrix test compares with its table.

export type Access = Role | "public";
export const GUARD_MARK = Symbol.for("fitledger.guard");
export interface GuardMark {
  kind: "route" | "action";
  access: Access;
}

function mark<F extends object>(target: F, guard: GuardMark): F {
  Object.defineProperty(target, GUARD_MARK, { value: guard, enumerable: false });
  return target;
}

export function guardOf(value: unknown): GuardMark | undefined {
  if (typeof value !== "function") return undefined;
  return (value as unknown as Record<symbol, GuardMark | undefined>)[GUARD_MARK];
}

/** Session, then status, then role. Throws 401 for no session or an inactive account, 403 for a low role. */
export async function authorizeCaller(role: Role): Promise<SessionUser> {
  const session = await readSession();
  if (!session) throw new AppError("unauthenticated", "Sign in to do this.");
  const account = await readAccount(session.userId);
  if (!account || account.status !== "active") {
    // a non-active account's session counts as signed out (issue 4)
    const why = account?.status === "suspended" ? "This account is suspended; you have been signed out." : "Sign in to do this.";
    throw new AppError("unauthenticated", why);
  }
  if (!hasRole(account.role, role)) throw new AppError("forbidden", `Only a signed-in ${role}${role === "admin" ? "" : " or above"} can do this.`);
  return account as SessionUser;
}

type Schema = z.ZodType | null;
type InputOf<S extends Schema> = S extends z.ZodType ? z.output<S> : undefined;

function validate<S extends Schema>(schema: S, raw: unknown): InputOf<S> {
  if (!schema) return undefined as InputOf<S>;
  const parsed = schema.safeParse(raw);
  if (parsed.success) return parsed.data as InputOf<S>;
  const flat = z.flattenError(parsed.error);
  const message = flat.formErrors[0] ?? "Some fields need attention.";
  throw new AppError("validation_failed", message, { fields: flat.fieldErrors as FieldErrors });
}

// ---- route handlers ------------------------------------------------------------------------------

export type RouteContext = { params: Promise<Record<string, string | string[] | undefined>> };
export type RouteHandler = (request: Request, context: RouteContext) => Promise<Response>;

const MAX_BODY_BYTES = 1_000_000;

/** Query parameters for GET/HEAD, else the JSON or form body; an absent body is an empty object. */
async function readRouteInput(request: Request): Promise<unknown> {
  if (request.method === "GET" || request.method === "HEAD") return Object.fromEntries(new URL(request.url).searchParams);
  const length = Number(request.headers.get("content-length") ?? "0");
  if (length > MAX_BODY_BYTES) throw new AppError("payload_too_large", "The request body is larger than this endpoint accepts.");
  const type = request.headers.get("content-type") ?? "";
  if (type.includes("application/json")) {
    const text = await request.text();
    if (!text.trim()) return {};
    try {
      return JSON.parse(text);
    } catch {
      throw new AppError("bad_request", "The request body is not valid JSON.");
    }
  }
  if (type.includes("application/x-www-form-urlencoded") || type.includes("multipart/form-data")) return Object.fromEntries(await request.formData());
  return {};
}

/** e.g. `export const POST = withRole("curator", verifySchema, async (input, user) => Response.json(…))` */
export function withRole<S extends Schema>(
  role: Role,
  schema: S,
  handler: (input: InputOf<S>, user: SessionUser, request: Request, context: RouteContext) => Promise<Response>,
): RouteHandler {
  const guarded: RouteHandler = (request, context) =>
    respond(async () => {
      await db(); // binds this chunk's model classes to the shared instance (lib/db/connection.ts)
      const user = await authorizeCaller(role);
      const input = validate(schema, await readRouteInput(request));
      return handler(input, user, request, context);
    });
  return mark(guarded, { kind: "route", access: role });
}

/** A mutating route anyone may call (apply, reset request): no session, but the same validation. */
export function withPublicInput<S extends Schema>(schema: S, handler: (input: InputOf<S>, request: Request, context: RouteContext) => Promise<Response>): RouteHandler {
  const guarded: RouteHandler = (request, context) =>
    respond(async () => {
      await db(); // binds this chunk's model classes to the shared instance (lib/db/connection.ts)
      return handler(validate(schema, await readRouteInput(request)), request, context);
    });
  return mark(guarded, { kind: "route", access: "public" });
}

// ---- server actions ------------------------------------------------------------------------------

export { IDLE_STATE, type ActionState, type FormAction } from "./action-state";

export interface ActionContext {
  address: string;
}

function formInput(formData: FormData): { raw: Record<string, unknown>; echo: Record<string, string> } {
  const raw: Record<string, unknown> = {};
  const echo: Record<string, string> = {};
  for (const [key, value] of formData.entries()) {
    if (key.startsWith("$ACTION")) continue; // React's own fields for progressive enhancement
    raw[key] = value;
    if (typeof value === "string" && !/password|token/i.test(key)) echo[key] = value.slice(0, 5000);
  }
  return { raw, echo };
}

async function runAction(work: () => Promise<string | void>, echo: Record<string, string>): Promise<ActionState> {
  try {
    const message = await work();
    return { ok: true, message: message ?? null, fieldErrors: {} };
  } catch (error) {
    unstable_rethrow(error); // redirect() and notFound() must reach Next
    if (isAppError(error)) return { ok: false, code: error.code, message: error.message, fieldErrors: error.fields ?? {}, values: echo };
    console.error("[action] unhandled error", error);
    return { ok: false, code: "internal", message: "Something went wrong on our side. The error has been logged; nothing was changed.", fieldErrors: {}, values: echo };
  }
}

/** e.g. `export const approvePerson = actionWithRole("admin", approveSchema, async (input, user) => "Approved.")` */
export function actionWithRole<S extends Schema>(role: Role, schema: S, handler: (input: InputOf<S>, user: SessionUser, context: ActionContext) => Promise<string | void>): FormAction {
  const guarded: FormAction = async (_previous, formData) => {
    const { raw, echo } = formInput(formData);
    return runAction(async () => {
      await db(); // binds this chunk's model classes to the shared instance (lib/db/connection.ts)
      const user = await authorizeCaller(role);
      const input = validate(schema, raw);
      return handler(input, user, { address: await readClientAddress() });
    }, echo);
  };
  return mark(guarded, { kind: "action", access: role });
}

/** A form action anyone may use (apply, reset): validated the same way, no session needed. */
export function publicAction<S extends Schema>(schema: S, handler: (input: InputOf<S>, context: ActionContext) => Promise<string | void>): FormAction {
  const guarded: FormAction = async (_previous, formData) => {
    const { raw, echo } = formInput(formData);
    return runAction(async () => {
      await db(); // binds this chunk's model classes to the shared instance (lib/db/connection.ts)
      return handler(validate(schema, raw), { address: await readClientAddress() });
    }, echo);
  };
  return mark(guarded, { kind: "action", access: "public" });
}
