import "server-only";
import NextAuth from "next-auth";
import { errorResponse } from "@/lib/http/respond";
import { clientAddressFrom } from "./client-address";
import { signInBlock } from "./limits";
import { authOptions } from "./options";

// Serves /api/auth/* through next-auth's request/response form rather than its App Router wrapper: the
// wrapper reads next/headers, this reads the Request it is given, so the endpoints behave the same in
// the server and in integration tests. In front of the credentials callback sits the sign-in rate
// limit, answered as a JSON 429 with Retry-After before any password is checked.

type Body = Record<string, string>;

function parseCookies(header: string | null): Record<string, string> {
  const cookies: Record<string, string> = {};
  for (const part of (header ?? "").split(";")) {
    const index = part.indexOf("=");
    if (index <= 0) continue;
    const name = part.slice(0, index).trim();
    const raw = part.slice(index + 1).trim();
    try {
      cookies[name] = decodeURIComponent(raw);
    } catch {
      cookies[name] = raw;
    }
  }
  return cookies;
}

async function readBody(request: Request): Promise<Body | undefined> {
  if (request.method !== "POST") return undefined;
  const type = request.headers.get("content-type") ?? "";
  const text = await request.text();
  if (type.includes("application/json")) {
    try {
      const parsed: unknown = JSON.parse(text);
      return parsed && typeof parsed === "object" ? Object.fromEntries(Object.entries(parsed).map(([key, value]) => [key, String(value)])) : {};
    } catch {
      return {};
    }
  }
  return Object.fromEntries(new URLSearchParams(text));
}

/** The small part of a Node response that next-auth's handler uses, collected into a web Response. */
class CollectedResponse {
  statusCode = 200;
  private readonly headers = new Headers();
  private body: string | null = null;

  status(code: number) {
    this.statusCode = code;
    return this;
  }
  getHeader(name: string) {
    if (name.toLowerCase() === "set-cookie") return this.headers.getSetCookie();
    return this.headers.get(name) ?? undefined;
  }
  setHeader(name: string, value: string | string[]) {
    this.headers.delete(name);
    for (const item of Array.isArray(value) ? value : [value]) this.headers.append(name, item);
    return this;
  }
  end() {
    return this;
  }
  json(value: unknown) {
    this.headers.set("Content-Type", "application/json");
    this.body = JSON.stringify(value);
    return this;
  }
  send(value: unknown) {
    this.body = typeof value === "string" ? value : value === undefined ? null : JSON.stringify(value);
    return this;
  }
  toResponse(): Response {
    return new Response(this.body, { status: this.statusCode, headers: this.headers });
  }
}

export async function handleAuthRequest(request: Request, segments: string[]): Promise<Response> {
  const body = await readBody(request);
  if (request.method === "POST" && segments[0] === "callback" && segments[1] === "credentials") {
    const blocked = signInBlock({ address: clientAddressFrom(request.headers), email: body?.email ?? "" });
    if (blocked) return errorResponse(blocked);
  }
  const url = new URL(request.url);
  const req = {
    method: request.method,
    query: { ...Object.fromEntries(url.searchParams), nextauth: segments },
    body,
    cookies: parseCookies(request.headers.get("cookie")),
    headers: Object.fromEntries(request.headers),
  };
  const res = new CollectedResponse();
  await NextAuth(req as never, res as never, authOptions());
  return res.toResponse();
}
