import "server-only";
import { AsyncLocalStorage } from "node:async_hooks";
import { Cite, plugins } from "@citation-js/core";
import { parsers as doiParsers } from "@citation-js/plugin-doi";
import { env } from "@/lib/env";
import type { CslItem } from "@/lib/citations/csl";
import { DOI_HINT, normaliseDoi } from "./normalise";

// DOI metadata through citation-js (DESIGN §7). plugin-doi 0.7 hard-codes https://doi.org/ and its own
// bundled fetch (STACK.md), so its `@doi/api` input parsers are registered again here: the URL is
// rewritten to the configured resolver, fetched with a bounded timeout, and the reply goes through
// plugin-doi's own CSL-JSON clean-up. Only the async API is used: the sync one spawns a child process
// per lookup and hangs when the registry runs in the same process.

export type DoiResolution =
  | { ok: true; csl: CslItem }
  | { ok: false; reason: "not_found" | "timeout" | "malformed" | "unreachable"; message: string };

export interface ResolveOptions {
  timeoutMs?: number;
  resolverUrl?: string;
}

const CSL_JSON = "application/vnd.citationstyles.csl+json";
const DOI_ORG = /^https?:\/\/(?:dx\.)?doi\.org\//i;

class LookupFailure extends Error {
  constructor(
    readonly reason: Exclude<DoiResolution, { ok: true }>["reason"],
    message: string,
  ) {
    super(message);
  }
}

// Per-lookup settings travel with the async call, so concurrent lookups with different resolvers or
// timeouts (tests, background resolution) never see each other's.
const lookupSettings = new AsyncLocalStorage<Required<ResolveOptions>>();

function resolverUrlFor(doiOrgUrl: string, base: string): string {
  const doi = doiOrgUrl.trim().replace(DOI_ORG, "");
  return `${base.replace(/\/+$/, "")}/${doi.split("/").map(encodeURIComponent).join("/")}`;
}

async function fetchCsl(doiOrgUrl: string): Promise<Record<string, unknown>> {
  const settings = lookupSettings.getStore() ?? { resolverUrl: env.DOI_RESOLVER_URL, timeoutMs: env.DOI_TIMEOUT_MS };
  const url = resolverUrlFor(doiOrgUrl, settings.resolverUrl);
  let response: Response;
  try {
    response = await fetch(url, { headers: { Accept: CSL_JSON }, signal: AbortSignal.timeout(settings.timeoutMs), redirect: "follow" });
  } catch (error) {
    if (error instanceof Error && (error.name === "TimeoutError" || error.name === "AbortError")) {
      throw new LookupFailure("timeout", `The DOI registry did not answer within ${Math.round(settings.timeoutMs / 100) / 10} s.`);
    }
    throw new LookupFailure("unreachable", "The DOI registry could not be reached.");
  }
  if (response.status === 404) throw new LookupFailure("not_found", "The DOI registry does not know this DOI.");
  if (!response.ok) throw new LookupFailure("unreachable", `The DOI registry answered with status ${response.status}.`);
  const type = response.headers.get("content-type") ?? "";
  let body: string;
  try {
    body = await response.text();
  } catch (error) {
    if (error instanceof Error && (error.name === "TimeoutError" || error.name === "AbortError")) {
      throw new LookupFailure("timeout", `The DOI registry did not finish its answer within ${Math.round(settings.timeoutMs / 100) / 10} s.`);
    }
    throw new LookupFailure("unreachable", "The DOI registry's answer broke off.");
  }
  if (!type.includes(CSL_JSON) && !type.includes("application/json")) throw new LookupFailure("malformed", "The DOI registry answered with something other than citation data.");
  let data: unknown;
  try {
    data = JSON.parse(body);
  } catch {
    throw new LookupFailure("malformed", "The DOI registry's answer is not readable citation data.");
  }
  if (data === null || typeof data !== "object" || Array.isArray(data)) throw new LookupFailure("malformed", "The DOI registry's answer is not a citation record.");
  return data as Record<string, unknown>;
}

let registered = false;
function registerResolver(): void {
  if (registered) return;
  registered = true;
  // plugin-doi's own clean-up of registry CSL-JSON (date-parts shape, item types), applied to our reply.
  const cleanRegistryJson = doiParsers.json.parse;
  plugins.input.add("@doi/api", {
    parse: () => {
      throw new LookupFailure("unreachable", "Synchronous DOI lookups are not supported; use resolveDoi.");
    },
    parseAsync: async (data: string | string[]) => Promise.all(([] as string[]).concat(data).map(async (url) => cleanRegistryJson(await fetchCsl(url)))),
  });
}

/** Resolves one DOI to its CSL-JSON record; never throws, never waits longer than the timeout. */
export async function resolveDoi(doi: string, options: ResolveOptions = {}): Promise<DoiResolution> {
  const normal = normaliseDoi(doi);
  if (!normal) return { ok: false, reason: "malformed", message: `"${doi.trim().slice(0, 80)}" is not a DOI. ${DOI_HINT}` };
  registerResolver();
  const settings = { resolverUrl: options.resolverUrl ?? env.DOI_RESOLVER_URL, timeoutMs: options.timeoutMs ?? env.DOI_TIMEOUT_MS };
  try {
    const cite = await lookupSettings.run(settings, () => Cite.async(`https://doi.org/${normal}`, { forceType: "@doi/api" }));
    const [item] = cite.data as CslItem[];
    if (!item || typeof item.title !== "string" || item.title.trim() === "") return { ok: false, reason: "malformed", message: "The DOI registry's record has no title." };
    return { ok: true, csl: item };
  } catch (error) {
    if (error instanceof LookupFailure) return { ok: false, reason: error.reason, message: error.message };
    const cause = (error as { cause?: unknown })?.cause;
    if (cause instanceof LookupFailure) return { ok: false, reason: cause.reason, message: cause.message };
    console.error("[doi] lookup failed", error);
    return { ok: false, reason: "malformed", message: "The DOI registry's answer could not be read." };
  }
}
