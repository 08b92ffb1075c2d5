// `npm run demo`: checks what could stop the demo, migrates, seeds an empty database, starts the fake
// DOI registry and the fake SMTP server, then the app on http://localhost:PORT. Anything that fails
// stops it with one line saying what and how to fix it — never a half-started app.
import { spawn } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { oneLine } from "./one-line";

const root = fileURLToPath(new URL("../..", import.meta.url));

function fail(message: string): never {
  console.error(`demo: ${message}`);
  process.exit(1);
}

function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = net.createServer();
    probe.once("error", () => resolve(false));
    probe.listen(port, "0.0.0.0", () => probe.close(() => resolve(true)));
  });
}

async function waitForHealth(url: string, timeoutMs: number, stillRunning: () => boolean): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline && stillRunning()) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) return true;
    } catch {
      // not up yet
    }
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
  return false;
}

async function main() {
  let env;
  try {
    ({ env } = await import("@/lib/env"));
  } catch (error) {
    fail(oneLine(error));
  }

  const ports: [string, number][] = [
    ["PORT (the app)", env.PORT],
    ["FAKE_DOI_PORT (fake DOI registry)", env.FAKE_DOI_PORT],
    ["FAKE_SMTP_PORT (fake SMTP server)", env.FAKE_SMTP_PORT],
    ["FAKE_SMTP_WEB_PORT (fake SMTP inbox)", env.FAKE_SMTP_WEB_PORT],
  ];
  for (const [name, port] of ports) {
    if (!(await portIsFree(port))) fail(`port ${port} for ${name} is already in use: stop the program using it or set ${name.split(" ")[0]} to a free port.`);
  }

  const { createDatabase } = await import("@/lib/db/connection");
  const { migrateUp } = await import("@/lib/db/migrate");
  let database;
  try {
    database = createDatabase();
    await database.ready;
    await migrateUp(database.sequelize);
  } catch (error) {
    fail(`the database at ${env.DATABASE_URL} could not be opened or migrated: ${oneLine(error)}`);
  }
  const papers = await database.models.Paper.count();
  if (papers === 0) {
    const { seedDemo } = await import("@/seeders/demo-seed");
    console.log("demo: empty database, seeding the demo corpus…");
    const summary = await seedDemo(database);
    console.log(`demo: seeded ${summary.papersCreated} papers, ${summary.comparisonsCreated} comparisons, ${summary.flagsWritten} findings.`);
  }
  await database.sequelize.close();

  const { startDoiRegistry } = await import("@/lib/fakes/doi-registry");
  const { startSmtpSink } = await import("@/lib/fakes/smtp-sink");
  const { demoRegistryRecords } = await import("@/seeders/demo/corpus");
  let registry, sink;
  try {
    registry = await startDoiRegistry({ port: env.FAKE_DOI_PORT, records: demoRegistryRecords() });
    sink = await startSmtpSink({ smtpPort: env.FAKE_SMTP_PORT, webPort: env.FAKE_SMTP_WEB_PORT });
  } catch (error) {
    await registry?.close();
    fail(`a local fake service did not start: ${oneLine(error)}`);
  }

  const nextBin = path.join(root, "node_modules", ".bin", "next");
  const app = spawn(nextBin, ["dev", "-p", String(env.PORT)], {
    cwd: root,
    stdio: ["ignore", "inherit", "inherit"],
    env: {
      ...process.env,
      NEXT_TELEMETRY_DISABLED: "1",
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(sink.smtpPort),
      DOI_RESOLVER_URL: registry.url,
    },
  });
  const stop = async (code: number) => {
    await Promise.allSettled([registry.close(), sink.close()]);
    process.exit(code);
  };
  app.on("exit", (code) => void stop(code ?? 0));
  for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => app.kill(signal));

  const url = `http://localhost:${env.PORT}`;
  if (await waitForHealth(url, 120_000, () => app.exitCode === null)) {
    console.log(`\ndemo: Fitledger is running on ${url} (mail sent by the app: ${url}/dev/mail). Demo accounts: see README.md. Ctrl+C stops everything.\n`);
  } else if (app.exitCode === null) {
    console.error("demo: the app did not answer /api/health within 2 minutes; see its output above.");
    app.kill("SIGTERM");
  }
}

main().catch((error: unknown) => fail(oneLine(error)));
