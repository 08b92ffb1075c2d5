// A local stand-in for DOI content negotiation (DESIGN §7): GET /<doi> with
// `Accept: application/vnd.citationstyles.csl+json` answers the CSL-JSON record of a known DOI.
// Test switches: the DOIs 10.5555/fitledger.slow and 10.5555/fitledger.malformed, or
// `PUT /__mode/slow|malformed|normal` to switch every reply.
import http from "node:http";
import type { AddressInfo } from "node:net";

export const CSL_JSON = "application/vnd.citationstyles.csl+json";
export const SLOW_DOI = "10.5555/fitledger.slow";
export const MALFORMED_DOI = "10.5555/fitledger.malformed";

export type RegistryMode = "normal" | "slow" | "malformed";

export interface DoiRegistryOptions {
  port: number;
  host?: string;
  /** CSL-JSON records by lower-case DOI */
  records: Map<string, Record<string, unknown>>;
  /** how long a slow reply waits (default 15 s, longer than any sensible client timeout) */
  slowMs?: number;
}

export interface RunningRegistry {
  url: string;
  port: number;
  setMode(mode: RegistryMode): void;
  close(): Promise<void>;
}

export function startDoiRegistry(options: DoiRegistryOptions): Promise<RunningRegistry> {
  let mode: RegistryMode = "normal";
  const slowMs = options.slowMs ?? 15_000;
  const timers = new Set<NodeJS.Timeout>();

  const server = http.createServer((request, response) => {
    const url = new URL(request.url ?? "/", "http://registry.local");
    const switchTo = /^\/__mode\/(normal|slow|malformed)$/.exec(url.pathname);
    if (request.method === "PUT" && switchTo) {
      mode = switchTo[1] as RegistryMode;
      response.writeHead(204).end();
      return;
    }
    if (request.method !== "GET" && request.method !== "HEAD") {
      response.writeHead(405, { Allow: "GET, HEAD" }).end();
      return;
    }
    const doi = decodeURIComponent(url.pathname.slice(1)).toLowerCase();
    const accept = request.headers.accept ?? "";
    if (!accept.includes(CSL_JSON) && !accept.includes("application/json") && !accept.includes("*/*")) {
      response.writeHead(406, { "Content-Type": "text/plain" }).end(`This registry only serves ${CSL_JSON}.`);
      return;
    }
    const reply = () => {
      if (mode === "malformed" || doi === MALFORMED_DOI) {
        response.writeHead(200, { "Content-Type": CSL_JSON }).end('{"type": "article-journal", "title": ');
        return;
      }
      const record = options.records.get(doi);
      if (!record) {
        response.writeHead(404, { "Content-Type": "text/plain" }).end("DOI Not Found");
        return;
      }
      response.writeHead(200, { "Content-Type": `${CSL_JSON}; charset=utf-8` }).end(JSON.stringify(record));
    };
    if (mode === "slow" || doi === SLOW_DOI) {
      const timer = setTimeout(() => {
        timers.delete(timer);
        reply();
      }, slowMs);
      timers.add(timer);
      request.on("close", () => clearTimeout(timer));
      return;
    }
    reply();
  });

  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, options.host ?? "127.0.0.1", () => {
      const { port } = server.address() as AddressInfo;
      resolve({
        url: `http://${options.host ?? "127.0.0.1"}:${port}`,
        port,
        setMode: (next) => {
          mode = next;
        },
        close: () =>
          new Promise<void>((done) => {
            for (const timer of timers) clearTimeout(timer);
            server.closeAllConnections();
            server.close(() => done());
          }),
      });
    });
  });
}
