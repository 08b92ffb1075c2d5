// A local stand-in for the SMTP relay (DESIGN §7): accepts every message, keeps it in memory and shows
// it over a small JSON web interface (GET /messages, GET /messages/:id, DELETE /messages), which the
// development page /dev/mail and the tests read.
import http from "node:http";
import type { AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface StoredMessage {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

export interface SmtpSinkOptions {
  smtpPort: number;
  webPort: number;
  host?: string;
  /** oldest messages are dropped past this many (default 2000) */
  keep?: number;
}

export interface RunningSmtpSink {
  smtpPort: number;
  webPort: number;
  webUrl: string;
  messages(): StoredMessage[];
  clear(): void;
  close(): Promise<void>;
}

function addresses(value: unknown): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  return list.flatMap((entry: { value?: { address?: string }[] }) => (entry.value ?? []).map((item) => item.address ?? "")).filter(Boolean);
}

export async function startSmtpSink(options: SmtpSinkOptions): Promise<RunningSmtpSink> {
  const host = options.host ?? "127.0.0.1";
  const keep = options.keep ?? 2000;
  const store: StoredMessage[] = [];
  let nextId = 1;

  const smtp = new SMTPServer({
    // The package's built-in certificate has expired (STACK.md): plain SMTP on loopback only.
    disabledCommands: ["STARTTLS"],
    authOptional: true,
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          store.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: addresses(parsed.from)[0] ?? "",
            to: addresses(parsed.to),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : null,
          });
          if (store.length > keep) store.splice(0, store.length - keep);
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });

  const web = http.createServer((request, response) => {
    const url = new URL(request.url ?? "/", "http://sink.local");
    const json = (status: number, body: unknown) => response.writeHead(status, { "Content-Type": "application/json" }).end(JSON.stringify(body));
    if (url.pathname === "/messages" && request.method === "GET") return json(200, [...store].reverse());
    if (url.pathname === "/messages" && request.method === "DELETE") {
      store.length = 0;
      return json(200, { cleared: true });
    }
    const one = /^\/messages\/(\d+)$/.exec(url.pathname);
    if (one && request.method === "GET") {
      const message = store.find((item) => item.id === Number(one[1]));
      return message ? json(200, message) : json(404, { error: "no such message" });
    }
    json(404, { error: "not found" });
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(options.smtpPort, host, () => resolve());
  });
  await new Promise<void>((resolve, reject) => {
    web.once("error", (error) => {
      smtp.close(() => reject(error));
    });
    web.listen(options.webPort, host, () => resolve());
  });

  const smtpPort = (smtp.server.address() as AddressInfo).port;
  const webPort = (web.address() as AddressInfo).port;
  return {
    smtpPort,
    webPort,
    webUrl: `http://${host}:${webPort}`,
    messages: () => [...store],
    clear: () => {
      store.length = 0;
    },
    close: () =>
      new Promise<void>((done) => {
        web.closeAllConnections();
        web.close(() => smtp.close(() => done()));
      }),
  };
}
