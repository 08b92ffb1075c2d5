import fs from "node:fs";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser } from "playwright-core";
import { createDatabase } from "@/lib/db/connection";
import { launchBrowser, openPage } from "./support/browser";
import "./support/context";

// A reader's path through Explore in the real browser against the built app and the seeded demo
// corpus: a search with a typo, a finding filter and a year range, a paper and back, the CSV download.
// Expected counts come from GET /api/comparisons on the same running app (itself checked against
// direct database counts in tests/integration/search).

const e2e = inject("e2e");

describe.skipIf(!e2e.enabled)("Explore in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("searches with a typo, filters to just-identified comparisons in a year range, opens a paper, comes back, downloads the CSV", async () => {
    // the years in which the demo corpus has just-identified comparisons in its mediation papers
    const probe = (await (await fetch(`${e2e.baseUrl}/api/comparisons?q=mediation&code=just-identified-model&per_page=200`)).json()) as { total: number; facets: { year: { value: number; count: number }[] } };
    expect(probe.total).toBeGreaterThan(0);
    const years = probe.facets.year.map((facet) => facet.value);
    const yearFrom = years[0];
    const yearTo = years[Math.min(years.length - 1, Math.max(1, Math.floor(years.length / 2)))];
    const expected = (await (await fetch(`${e2e.baseUrl}/api/comparisons?q=mediaton&code=just-identified-model&year_from=${yearFrom}&year_to=${yearTo}`)).json()) as { total: number };
    expect(expected.total).toBeGreaterThan(0);

    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await page.goto("/explore");
    await page.getByRole("searchbox", { name: /search titles/i }).fill("mediaton"); // "mediation", one letter short
    await page.getByRole("button", { name: "Search", exact: true }).click();
    await page.waitForURL(/q=mediaton/);
    await expect.poll(async () => page.getByTestId("result-count").textContent()).not.toBe("0");

    await page.getByRole("checkbox", { name: /A just-identified model was compared/ }).check();
    await page.waitForURL(/code=just-identified-model/);
    await page.getByLabel("From", { exact: true }).fill(String(yearFrom));
    await page.getByLabel("To", { exact: true }).fill(String(yearTo));
    await page.getByRole("button", { name: "Apply" }).click();
    await page.waitForURL(new RegExp(`year_from=${yearFrom}&year_to=${yearTo}`));
    await expect.poll(async () => page.getByTestId("result-count").textContent()).toBe(String(expected.total));
    const exploreUrl = page.url();

    const firstLink = page.locator("tbody tr").first().locator("a").first();
    const href = await firstLink.getAttribute("href");
    expect(href).toMatch(/^\/papers\/\d+\?finding=just-identified-model#comparison-\d+$/);
    await firstLink.click();
    await page.waitForURL(/\/papers\/\d+/);

    await page.goBack();
    await page.waitForURL(exploreUrl);
    expect(page.url()).toBe(exploreUrl);
    await expect.poll(async () => page.getByTestId("result-count").textContent()).toBe(String(expected.total));
    expect(await page.getByRole("checkbox", { name: /A just-identified model was compared/ }).isChecked()).toBe(true);
    expect(await page.getByRole("searchbox", { name: /search titles/i }).inputValue()).toBe("mediaton");
    expect(await page.getByLabel("From", { exact: true }).inputValue()).toBe(String(yearFrom));

    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download CSV" }).click()]);
    const file = await download.path();
    const rows = Papa.parse<Record<string, string>>(fs.readFileSync(file, "utf8"), { header: true, skipEmptyLines: true }).data;
    expect(rows.length).toBe(expected.total);
    expect(rows.every((row) => Number(row.year) >= yearFrom && Number(row.year) <= yearTo)).toBe(true);

    // the paper page belongs to another feature; a missing page's 404 is not this test's concern
    expect(problems.filter((problem) => !/404|Failed to load resource/.test(problem))).toEqual([]);
  });

  it("never shows the public a draft, submitted or returned entry, on the page or in the API", async () => {
    const database = createDatabase(e2e.databaseUrl);
    await database.ready;
    const hidden = await database.models.Paper.findAll({ where: { state: ["draft", "submitted", "returned"] }, attributes: ["doi", "state"], raw: true, limit: 6 });
    const shown = await database.models.Paper.findOne({ where: { state: "verified" }, attributes: ["doi"], raw: true });
    await database.sequelize.close();
    expect(hidden.filter((paper) => paper.doi).length).toBeGreaterThanOrEqual(3);
    const { page } = await openPage(browser, e2e.baseUrl);
    for (const paper of hidden.filter((item) => item.doi)) {
      const api = (await (await fetch(`${e2e.baseUrl}/api/comparisons?q=${encodeURIComponent(paper.doi!)}`)).json()) as { total: number };
      expect([paper.state, api.total]).toEqual([paper.state, 0]);
      await page.goto(`/explore?q=${encodeURIComponent(paper.doi!)}`);
      await expect.poll(async () => page.getByTestId("result-count").textContent()).toBe("0");
    }
    await page.goto(`/explore?q=${encodeURIComponent(shown!.doi!)}`);
    await expect.poll(async () => Number(await page.getByTestId("result-count").textContent())).toBeGreaterThan(0);
  });

  it("shows an empty state and clears every filter with one button", async () => {
    const { page } = await openPage(browser, e2e.baseUrl);
    await page.goto("/explore?q=zzqxv");
    await expect.poll(async () => page.getByTestId("result-count").textContent()).toBe("0");
    await page.getByRole("button", { name: "Clear all filters" }).first().click();
    await page.waitForURL((url) => url.search === "");
    await expect.poll(async () => Number((await page.getByTestId("result-count").textContent())?.replace(/\D/g, ""))).toBeGreaterThan(100);
  });
});
