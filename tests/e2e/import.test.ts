import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { signInAs } from "./support/session";
import { launchBrowser, openPage } from "./support/browser";
import "./support/context";

// Issue 6 end to end, in chromium against the built app: a contributor uploads a sheet with two bad rows
// (text in a figure cell, and the same comparison twice), sees both in the dry run with row and column,
// commits the other two, downloads the rejected rows, fixes them and uploads that file as it is.

const e2e = inject("e2e");
const CONTRIBUTOR = "contributor@fitledger.test";
const HEADER = "doi,title,year,journal,authors,sample,n,comparison,method,nested,d_chisq,d_df,d_p,a_label,a_estimator,a_chisq,a_df,a_p,b_label,b_estimator,b_chisq,b_df,b_p";
const PAPER = "10.5555/e2e-import.2026,An invented sheet for the browser test,2026,Journal of Invented Measurement,\"Quill, Ada\",Pupils,420";
const SHEET = [
  HEADER,
  `${PAPER},One vs two factors,lrt,yes,61.20,1,< .001,One factor,ML,140.50,20,< .001,Two factors,ML,79.30,19,< .001`,
  `${PAPER},Two vs three factors,lrt,yes,12.40,2,.002,Two factors,ML,seventy-nine,19,< .001,Three factors,ML,66.90,17,< .001`,
  `${PAPER},Correlated vs orthogonal,lrt,yes,30.10,1,< .001,Orthogonal,ML,109.40,20,< .001,Two factors,ML,79.30,19,< .001`,
  `${PAPER},One vs two factors,lrt,yes,61.20,1,< .001,One factor,ML,140.50,20,< .001,Two factors,ML,79.30,19,< .001`,
].join("\r\n");


async function uploadAndPreview(page: Page, name: string, text: string) {
  await page.goto("/workbench/import");
  await page.locator("#sheet").setInputFiles({ name, mimeType: "text/csv", buffer: Buffer.from(text, "utf8") });
  await page.getByRole("button", { name: "Upload for a dry run" }).click();
  await page.waitForURL(/\/workbench\/import\/\d+$/);
  await waitForStatus(page, "previewed");
}

/** Waits until the batch settles; a different outcome fails with what the page said, not a bare timeout. */
async function waitForStatus(page: Page, status: "previewed" | "committed") {
  const settled = page.locator(`[data-batch-status="${status}"], [data-batch-status="failed"]`);
  const seen = await settled.waitFor({ timeout: 30_000 }).then(
    () => true,
    () => false,
  );
  const said = await page.locator("main").innerText();
  expect(seen && (await page.locator(`[data-batch-status="${status}"]`).count()) === 1, `the page said:\n${said}`).toBe(true);
}

const count = (page: Page, label: string) => page.locator(`[data-count="${label}"] dd`).innerText();

describe.skipIf(!e2e.enabled)("importing a sheet in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("dry run shows the two bad rows, the rest commits, and the fixed rejected rows import on their own", async () => {
    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, CONTRIBUTOR, "/workbench/import");

    await uploadAndPreview(page, "coding-sheet.csv", SHEET);
    expect([await count(page, "new"), await count(page, "rejected")]).toEqual(["2", "2"]);
    const rejected = page.getByRole("table", { name: "Rejected rows" });
    await expect(rejected.locator("[data-rejected-row='2']").innerText()).resolves.toMatch(/a_chisq\s+"seventy-nine"/);
    await expect(rejected.locator("[data-rejected-row='4']").innerText()).resolves.toMatch(/comparison\s+comparison "One vs two factors" of sample "Pupils" is already in row 1/);
    // the accepted rows show the findings they would get
    await expect(page.getByRole("table", { name: "Accepted rows" }).innerText()).resolves.toContain("Correlated vs orthogonal");

    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download the rejected rows" }).click()]);
    const rejectedCsv = fs.readFileSync((await download.path())!, "utf8");
    expect(rejectedCsv.split("\r\n").filter(Boolean)).toHaveLength(3);
    expect(rejectedCsv.split("\r\n")[0].endsWith(",error")).toBe(true);

    await page.getByRole("button", { name: "Commit 2 accepted rows" }).click();
    await waitForStatus(page, "committed");
    await expect(page.getByRole("status").filter({ hasText: "rows are now drafts of yours" }).count()).resolves.toBe(1);

    // fix both rows in the downloaded file (the error column stays) and upload it as it is
    const fixed = rejectedCsv.replace(",seventy-nine,", ",79.30,").replace(/\r\n(10\.5555[^\r\n]*?),One vs two factors,/, "\r\n$1,One vs three factors,");
    expect(fixed).not.toBe(rejectedCsv);
    await uploadAndPreview(page, "coding-sheet-rejected-rows.csv", fixed);
    expect([await count(page, "new"), await count(page, "unchanged"), await count(page, "rejected")]).toEqual(["2", "0", "0"]);
    await page.getByRole("button", { name: "Commit 2 accepted rows" }).click();
    await waitForStatus(page, "committed");

    await page.goto("/workbench/import/history");
    await expect(page.getByRole("table").innerText()).resolves.toMatch(/coding-sheet-rejected-rows\.csv\s+\S+ \S+\s+committed\s+2\s+2\s+0/);
    await page.goto("/workbench");
    await expect(page.getByText("An invented sheet for the browser test").count()).resolves.toBe(1);
    expect(problems).toEqual([]);
  });
});
