import fs from "node:fs";
import { chromium, type Browser, type Page } from "playwright-core";

export const CHROMIUM_PATH = "/usr/bin/chromium";

/** End-to-end tests need Debian's chromium; `.ci/run` installs it, a developer machine may not have it. */
export const e2eEnabled = fs.existsSync(CHROMIUM_PATH);

// Flags for a closed network: without the background-networking switches chromium keeps trying to
// reach its vendor's hosts at every start.
const ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-dev-shm-usage",
];

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: ARGS, headless: true });
}

/** A page whose console errors and failed requests are collected, so a test can assert there were none. */
export async function openPage(browser: Browser, baseUrl: string): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on("pageerror", (error) => problems.push(`page error: ${error.message}`));
  page.on("console", (message) => {
    if (message.type() === "error") problems.push(`console error: ${message.text()}`);
  });
  return { page, problems };
}
