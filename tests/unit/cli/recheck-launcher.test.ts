// The launcher that `npm run recheck` starts (lib/cli/recheck-launcher.mjs): it runs a bundled build of
// lib/cli/recheck.ts, which must behave exactly as the source run through tsx — same bytes on stdout and
// stderr, same exit status — whatever the sheet and the format.
import { execFile } from "node:child_process";
import { readdirSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const ROOT = fileURLToPath(new URL("../../..", import.meta.url));
const TSX = join(ROOT, "node_modules", ".bin", "tsx");
const SHEETS = "tests/fixtures/sheets";

interface Run {
  status: number;
  stdout: string;
  stderr: string;
}

function run(command: string, args: string[]): Promise<Run> {
  return new Promise((resolve) => {
    execFile(command, args, { cwd: ROOT, maxBuffer: 1 << 26 }, (error, stdout, stderr) => {
      const status = error ? Number((error as NodeJS.ErrnoException & { code?: unknown }).code) : 0;
      resolve({ status, stdout, stderr });
    });
  });
}

const viaTsx = (...args: string[]) => run(TSX, ["lib/cli/recheck.ts", ...args]);
const viaLauncher = (...args: string[]) => run(process.execPath, ["lib/cli/recheck-launcher.mjs", ...args]);

const TIMEOUT = 60_000;
const sheets = readdirSync(join(ROOT, SHEETS)).filter((name) => name.endsWith(".csv"));

describe("recheck launcher (bundled build)", () => {
  it("has fixture sheets to compare on", () => {
    expect(sheets.length).toBeGreaterThan(0);
  });

  it.each([
    { args: ["--help"] },
    { args: [] },
    { args: ["no-such-sheet.csv"] },
    { args: [SHEETS] },
    { args: ["--format", "xml", "x.csv"] },
    { args: ["--bogus"] },
  ])("answers $args exactly as the source does", { timeout: TIMEOUT }, async ({ args }: { args: string[] }) => {
    const [expected, actual] = await Promise.all([viaTsx(...args), viaLauncher(...args)]);
    expect(actual).toEqual(expected);
  });

  for (const format of ["jsonl", "csv"]) {
    it(`writes the same ${format} as the source for every fixture sheet`, { timeout: TIMEOUT * 2 }, async () => {
      for (const name of sheets) {
        const file = join(SHEETS, name);
        const [expected, actual] = await Promise.all([viaTsx(file, "--format", format), viaLauncher(file, "--format", format)]);
        expect(actual, name).toEqual(expected);
      }
    });
  }
});
