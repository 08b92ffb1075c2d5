// Builds the app once, then runs it for real against a temp SQLite file seeded with the demo corpus,
// with the fake DOI registry and fake SMTP server on free loopback ports. Tests get the addresses
// through inject("e2e").
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { TestProject } from "vitest/node";
import { createDatabase } from "@/lib/db/connection";
import { migrateUp } from "@/lib/db/migrate";
import { startDoiRegistry } from "@/lib/fakes/doi-registry";
import { startSmtpSink } from "@/lib/fakes/smtp-sink";
import { seedDemo } from "@/seeders/demo-seed";
import { demoRegistryRecords } from "@/seeders/demo/corpus";
import { e2eEnabled } from "./support/browser";
import { freePort } from "./support/ports";
import "./support/context";

const root = fileURLToPath(new URL("../..", import.meta.url));
const nextBin = path.join(root, "node_modules", ".bin", "next");

async function waitForHealth(url: string, server: ChildProcess, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`the app exited with code ${server.exitCode} before it was ready`);
    try {
      const response = await fetch(`${url}/api/health`);
      if (response.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
  throw new Error(`the app did not become healthy within ${timeoutMs} ms`);
}

export default async function setup(project: TestProject) {
  const disabled = { enabled: false, baseUrl: "", mailUrl: "", doiUrl: "", databaseUrl: "" };
  if (!e2eEnabled) {
    console.warn("\n!!! END-TO-END TESTS SKIPPED: /usr/bin/chromium is not installed (apt-get install -y chromium). CI installs it. !!!\n");
    project.provide("e2e", disabled);
    return;
  }

  const folder = fs.mkdtempSync(path.join(os.tmpdir(), "fitledger-e2e-"));
  const databaseUrl = `sqlite:${path.join(folder, "e2e.sqlite")}`;
  const database = createDatabase(databaseUrl);
  await database.ready;
  await migrateUp(database.sequelize);
  await seedDemo(database);
  await database.sequelize.close();

  const registry = await startDoiRegistry({ port: 0, records: demoRegistryRecords(), slowMs: 8000 });
  const sink = await startSmtpSink({ smtpPort: 0, webPort: 0 });

  // E2E_REUSE_BUILD=1 skips the build when one exists (for a developer re-running tests); CI always builds.
  const reuse = process.env.E2E_REUSE_BUILD === "1" && fs.existsSync(path.join(root, ".next", "BUILD_ID"));
  if (!reuse) {
    const build = spawnSync(nextBin, ["build"], { cwd: root, stdio: "inherit", env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1" } });
    if (build.status !== 0) throw new Error("next build failed; see the output above");
  }

  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const server = spawn(nextBin, ["start", "-p", String(port), "-H", "127.0.0.1"], {
    cwd: root,
    stdio: ["ignore", "pipe", "pipe"],
    env: {
      ...process.env,
      NODE_ENV: "production",
      NEXT_TELEMETRY_DISABLED: "1",
      DATABASE_URL: databaseUrl,
      APP_URL: baseUrl,
      PORT: String(port),
      AUTH_SECRET: "e2e-only-secret-0123456789abcdef0123456789",
      NEXTAUTH_URL: baseUrl,
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(sink.smtpPort),
      DOI_RESOLVER_URL: registry.url,
    },
  });
  const log = fs.createWriteStream(path.join(folder, "app.log"));
  server.stdout?.pipe(log);
  server.stderr?.pipe(log);
  try {
    await waitForHealth(baseUrl, server, 90_000);
  } catch (error) {
    server.kill("SIGTERM");
    console.error(fs.existsSync(path.join(folder, "app.log")) ? fs.readFileSync(path.join(folder, "app.log"), "utf8").slice(-4000) : "");
    throw error;
  }

  project.provide("e2e", { enabled: true, baseUrl, mailUrl: sink.webUrl, doiUrl: registry.url, databaseUrl });

  return async () => {
    // what the server logged as going wrong, for a failure seen only in CI (the folder goes below)
    const logged = fs.readFileSync(path.join(folder, "app.log"), "utf8").split("\n");
    const problems = logged.filter((line) => /error|failed|unhandled|\[import\]/i.test(line));
    if (problems.length > 0) console.error(`The app server logged ${problems.length} problem lines during the e2e run:\n${problems.slice(-40).join("\n")}`);
    server.kill("SIGTERM");
    await new Promise((resolve) => (server.exitCode !== null ? resolve(null) : server.once("exit", resolve)));
    await Promise.all([registry.close(), sink.close()]);
    fs.rmSync(folder, { recursive: true, force: true });
  };
}
