import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser } from "playwright-core";
import { createDatabase } from "@/lib/db/connection";
import { readCorpusFiguresFrom } from "@/lib/db/queries/corpus";
import { formatCount } from "@/lib/format";
import { launchBrowser, openPage } from "./support/browser";
import "./support/context";

const e2e = inject("e2e");

describe.skipIf(!e2e.enabled)("the landing page in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("shows the seeded corpus figures, counted directly in the database", async () => {
    const database = createDatabase(e2e.databaseUrl);
    await database.ready;
    const expected = await readCorpusFiguresFrom(database.models);
    await database.sequelize.close();
    expect(expected.verifiedPapers).toBeGreaterThan(50);

    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await page.goto("/");
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toContain("recomputed");
    const tile = (label: string) => page.locator("dt", { hasText: label }).locator("xpath=following-sibling::dd[1]");
    expect(await tile("Papers coded").textContent()).toBe(formatCount(expected.papers));
    expect(await tile("Verified papers").textContent()).toBe(formatCount(expected.verifiedPapers));
    expect(await tile("Verified comparisons").textContent()).toBe(formatCount(expected.verifiedComparisons));
    expect(problems).toEqual([]);
  });

  it("renders its text in the font shipped with the app", async () => {
    const { page } = await openPage(browser, e2e.baseUrl);
    await page.goto("/");
    await page.evaluate(() => document.fonts.ready);
    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(family).toMatch(/plex/i);
    const loaded = await page.evaluate(() => [...document.fonts].filter((font) => font.status === "loaded").map((font) => font.family));
    expect(loaded.some((name) => /plex/i.test(name))).toBe(true);
  });
});
