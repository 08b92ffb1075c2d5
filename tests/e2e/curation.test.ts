import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { CAUTION_TEXT } from "@/components/caution-notice";
import { createDatabase } from "@/lib/db/connection";
import { demoCorpus } from "@/seeders/demo/corpus";
import { signInAs } from "./support/session";
import { launchBrowser, openPage } from "./support/browser";
import { waitForMessage } from "./support/mail";
import "./support/context";

// Issue 5 end to end, in chromium against the built app: a contributor adds a paper by DOI (one the fake
// registry knows and the seeded database does not), codes two models and a comparison with a wrong Δdf,
// sees the finding appear live, submits; a curator returns it; the contributor fixes and resubmits; a
// second curator verifies; the public page shows it with the caution notice and no error finding.
//
// The figures: Metric χ² = 61.30, df = 24; Configural χ² = 48.20, df = 20; so Δdf = 24 − 20 = 4, and the
// slip typed first is Δdf = 3 (DESIGN §4.3 df-difference-mismatch).

const e2e = inject("e2e");
const CONTRIBUTOR = "contributor@fitledger.test";
const CURATOR = "curator@fitledger.test";
const SECOND_CURATOR = "curator2@fitledger.test";


/** A paste of tab-separated text into an input, as a copy from a PDF table or a spreadsheet arrives. */
async function pasteInto(page: Page, selector: string, text: string) {
  await page.locator(selector).focus();
  await page.locator(selector).evaluate((element, pasted) => {
    const data = new DataTransfer();
    data.setData("text/plain", pasted);
    element.dispatchEvent(new ClipboardEvent("paste", { clipboardData: data, bubbles: true, cancelable: true }));
  }, text);
}

describe.skipIf(!e2e.enabled)("curation in the browser", () => {
  let browser: Browser;
  const registryPaper = demoCorpus().registryOnly[demoCorpus().registryOnly.length - 1];
  let paperId = 0;

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a contributor adds a paper by DOI, codes it, sees the Δdf slip live and submits", async () => {
    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, CONTRIBUTOR, "/workbench/new");
    // a malformed DOI is refused next to the field; an unknown one says so and leaves the form to type into
    await page.locator("#doi-query").fill("10.12/too-short");
    await page.getByRole("button", { name: "Look up" }).click();
    expect(await page.locator("#doi-query-error").textContent()).toMatch(/not a DOI/);
    await page.locator("#doi-query").fill("10.5555/fitledger.nobody-registered-this");
    await page.getByRole("button", { name: "Look up" }).click();
    await page.getByText("The DOI registry does not know this DOI.").waitFor();
    expect(await page.locator("#paper-doi").inputValue()).toBe("10.5555/fitledger.nobody-registered-this");

    await page.locator("#doi-query").fill(`https://doi.org/${registryPaper.doi}`);
    await page.getByRole("button", { name: "Look up" }).click();
    await page.getByText("Found. Check the metadata below").waitFor();
    expect(await page.locator("#paper-title").inputValue()).toBe(registryPaper.title);
    expect(await page.locator("#paper-doi").inputValue()).toBe(registryPaper.doi.toLowerCase());
    await page.getByRole("button", { name: "Create the paper and start coding" }).click();
    await page.waitForURL(/\/workbench\/papers\/\d+$/);
    paperId = Number(new URL(page.url()).pathname.split("/").pop());

    await page.locator('[name="samples.0.n"]').fill("412");
    await page.getByRole("button", { name: "Add a model" }).click();
    await page.locator('[name="models.0.label"]').fill("Metric");
    await page.locator('[name="models.0.chisq"]').fill("61.30");
    await page.locator('[name="models.0.chisq"]').press("Tab"); // tab order runs along the row
    await page.keyboard.type("24");
    expect(await page.locator('[name="models.0.df"]').inputValue()).toBe("24");
    await page.getByRole("button", { name: "Add a model" }).click();
    await pasteInto(page, '[name="models.1.label"]', "Configural\t48.20\t20");
    expect(await page.locator('[name="models.1.chisq"]').inputValue()).toBe("48.20");
    expect(await page.locator('[name="models.1.df"]').inputValue()).toBe("20");

    await page.getByRole("button", { name: "Add a comparison" }).click();
    await page.locator('[name="comparisons.0.label"]').fill("Metric vs configural");
    await page.locator('[name="comparisons.0.restrictedKey"]').selectOption({ label: "Metric" });
    await page.locator('[name="comparisons.0.freeKey"]').selectOption({ label: "Configural" });
    await page.locator('[name="comparisons.0.dChisq"]').fill("13.10");
    await page.locator('[name="comparisons.0.dDf"]').fill("3");

    const live = page.getByTestId("live-recheck");
    await live.locator('[data-code="df-difference-mismatch"]').waitFor();
    expect(await live.locator('[data-code="df-difference-mismatch"]').textContent()).toContain("24 − 20 = 4");

    // text where a figure belongs: a message next to the field before anything is saved
    await page.locator('[name="models.0.cfi"]').fill("high");
    await page.locator("#models-0-cfi-error").waitFor();
    await page.locator('[name="models.0.cfi"]').fill("");

    await page.getByRole("button", { name: "Save coding" }).click();
    await page.getByText(/Saved \(version 2\)/).waitFor();
    await page.getByRole("button", { name: "Submit for verification" }).click();
    await page.getByTestId("entry-state").getByText("Submitted").waitFor();
    expect(problems).toEqual([]);
  });

  it("a curator returns it with a comment, and the contributor is e-mailed", async () => {
    const { page } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, CURATOR, "/review");
    // the queue is oldest first and paged; the curator narrows it to this paper, as a busy curator would
    await page.getByLabel("Title, DOI or journal").fill(registryPaper.doi.toLowerCase());
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL(/\/review\?q=/);
    await page.getByRole("link", { name: registryPaper.title }).click();
    await page.waitForURL(`**/review/${paperId}`);
    const finding = page.locator('[data-code="df-difference-mismatch"]');
    await finding.waitFor();
    // "explained" needs the link to the erratum or reply: said next to the link field
    await finding.getByLabel("Verdict", { exact: true }).selectOption({ label: "Explained (erratum or author reply)" });
    await finding.getByRole("button", { name: "Record" }).click();
    await finding.getByText("Link the erratum or the author's reply").waitFor();
    await finding.getByLabel("Verdict", { exact: true }).selectOption({ label: "Coding error (fixed)" });
    await finding.getByLabel("Note").fill("Table 2 prints Δdf = 4.");
    await finding.getByRole("button", { name: "Record" }).click();
    await finding.getByText("Curator's verdict: Coding error (fixed)").waitFor();
    await page.getByLabel("Comment for the contributor").fill("Table 2: the Δdf of metric vs configural is 4 (24 − 20), not 3.");
    await page.getByRole("button", { name: "Return with this comment" }).click();
    await page.getByTestId("review-outcome").getByText("The contributor has the comment").waitFor();
    const mail = await waitForMessage(e2e.mailUrl, { to: CONTRIBUTOR, subject: "Your entry was returned" });
    expect(mail.text).toContain("not 3");
  });

  it("the contributor fixes the Δdf and submits again", async () => {
    const { page } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, CONTRIBUTOR, `/workbench/papers/${paperId}`);
    expect(await page.getByTestId("curator-comment").textContent()).toContain("not 3");
    await page.locator('[name="comparisons.0.dDf"]').fill("4");
    const live = page.getByTestId("live-recheck");
    await live.getByText("No findings.").first().waitFor();
    expect(await live.locator('[data-code="df-difference-mismatch"]').count()).toBe(0);
    await page.getByRole("button", { name: "Save coding" }).click();
    await page.getByText(/Saved \(version 3\)/).waitFor();
    await page.getByRole("button", { name: "Submit again for verification" }).click();
    await page.getByTestId("entry-state").getByText("Submitted").waitFor();
  });

  it("a second curator verifies it, and the public page shows it with the caution notice and no error finding", async () => {
    const { page } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, SECOND_CURATOR, `/review/${paperId}`);
    await page.getByRole("button", { name: "Verify this entry" }).click();
    await page.getByTestId("review-outcome").getByText("Verified by Chidi Okonjo").waitFor();

    const { page: reader, problems } = await openPage(browser, e2e.baseUrl);
    await reader.goto(`/papers/${paperId}`);
    expect(await reader.getByRole("heading", { level: 1 }).textContent()).toBe(registryPaper.title);
    expect(await reader.getByRole("complementary", { name: "How to read findings" }).textContent()).toContain(CAUTION_TEXT);
    expect(await reader.getByTestId("citation").textContent()).toContain(`https://doi.org/${registryPaper.doi.toLowerCase()}`);
    expect(await reader.locator('[id^="comparison-"]').count()).toBe(1);
    expect(await reader.locator("header dl").textContent()).toContain("Verified by Chidi Okonjo");
    expect(await reader.locator("header dl").textContent()).toContain("Coded by Bram Lindqvist");

    const api = await fetch(`${e2e.baseUrl}/api/papers/${paperId}`);
    expect(api.status).toBe(200);
    const body = (await api.json()) as { paper: { state: string; findings: { severity: string }[]; comparisons: { id: number; figures: Record<string, string> }[] } };
    expect(body.paper.state).toBe("verified");
    expect(body.paper.findings.filter((finding) => finding.severity === "error")).toEqual([]);
    expect(body.paper.comparisons[0].figures).toMatchObject({ dChisq: "13.10", dDf: "4" });
    expect(await reader.locator(`#comparison-${body.paper.comparisons[0].id}`).count()).toBe(1);
    expect(problems).toEqual([]);
  });

  it("a link from search with ?finding=<code> highlights that finding, and the tables sort", async () => {
    // a seeded verified paper with at least two comparisons and a finding on one of them, read from the database
    const database = createDatabase(e2e.databaseUrl);
    await database.ready;
    const { Flag, Paper, Comparison } = database.models;
    const papers = await Paper.findAll({ where: { state: "verified" }, attributes: ["id"], order: [["id", "ASC"]] });
    let target: { paperId: number; flagId: number; code: string; labels: string[] } | null = null;
    for (const paper of papers) {
      const comparisons = await Comparison.findAll({ where: { paperId: paper.id }, attributes: ["label"] });
      const flag = await Flag.findOne({ where: { paperId: paper.id }, attributes: ["id", "code"], order: [["id", "ASC"]] });
      if (flag && comparisons.length >= 2) {
        target = { paperId: paper.id, flagId: flag.id, code: flag.code, labels: comparisons.map((row) => row.label) };
        break;
      }
    }
    await database.sequelize.close();
    expect(target).not.toBeNull();

    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await page.goto(`/papers/${target!.paperId}?finding=${target!.code}`);
    const finding = page.locator(`#finding-${target!.flagId}`);
    expect(await finding.getAttribute("data-highlighted")).toBe("true");
    expect(await page.locator("[data-highlighted]").evaluateAll((items) => items.map((item) => item.getAttribute("data-code")))).toEqual(
      expect.arrayContaining([target!.code]),
    );
    expect(new Set(await page.locator("[data-highlighted]").evaluateAll((items) => items.map((item) => item.getAttribute("data-code"))))).toEqual(new Set([target!.code]));

    const table = page.locator("table", { has: page.locator("caption", { hasText: "Reported comparisons" }) });
    await table.getByRole("button", { name: "Comparison", exact: true }).click();
    const ascending = await table.locator("tbody tr td:first-child").allTextContents();
    expect(ascending).toEqual([...target!.labels].sort((a, b) => a.localeCompare(b)));
    await table.getByRole("button", { name: "Comparison", exact: true }).click();
    expect(await table.locator("tbody tr td:first-child").allTextContents()).toEqual([...ascending].reverse());
    expect(problems).toEqual([]);
  });

  it("two edits of the same paper: the second save gets a conflict notice and keeps what was typed", async () => {
    const { page: first } = await openPage(browser, e2e.baseUrl);
    await signInAs(first, CONTRIBUTOR, "/workbench/new");
    await first.getByRole("tab", { name: "By hand" }).click();
    await first.locator("#paper-title").fill("A conference paper typed by hand");
    await first.locator("#paper-authors").fill("Rautio, Aino\n{Fitledger Consortium}");
    await first.locator("#paper-year").fill("2023");
    await first.getByRole("button", { name: "Create the paper and start coding" }).click();
    await first.waitForURL(/\/workbench\/papers\/\d+$/);
    const address = new URL(first.url()).pathname;

    const { page: second } = await openPage(browser, e2e.baseUrl);
    await signInAs(second, CONTRIBUTOR, address);

    await first.getByRole("button", { name: "Add a model" }).click();
    await first.locator('[name="models.0.label"]').fill("One factor");
    await first.locator('[name="models.0.chisq"]').fill("88.41");
    await first.locator('[name="models.0.df"]').fill("27");
    await first.getByRole("button", { name: "Save coding" }).click();
    await first.getByText(/Saved \(version 2\)/).waitFor();

    await second.getByRole("button", { name: "Add a model" }).click();
    await second.locator('[name="models.0.label"]').fill("Two factors");
    await second.locator('[name="models.0.chisq"]').fill("41.07");
    await second.getByRole("button", { name: "Save coding" }).click();
    await second.getByText("Not saved: someone else saved first").waitFor();
    expect(await second.getByText(/you started from version 1; it is now at version 2/).count()).toBe(1);
    expect(await second.locator('[name="models.0.label"]').inputValue()).toBe("Two factors");
    expect(await second.locator('[name="models.0.chisq"]').inputValue()).toBe("41.07");
    await second.getByRole("button", { name: /Reload the saved version here/ }).click();
    await second.waitForLoadState("load");
    await second.locator('[name="models.0.label"]').waitFor();
    expect(await second.locator('[name="models.0.label"]').inputValue()).toBe("One factor");
  });

  it("a RIS file uploaded on the new-paper page fills the metadata, particles and diacritics intact", async () => {
    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, CONTRIBUTOR, "/workbench/new");
    await page.getByRole("tab", { name: "BibTeX or RIS" }).click();
    const ris = ["TY  - JOUR", "AU  - Øvergaard, Siri", "AU  - von Trapp, Maria", "TI  - Scaled difference tests in practice", "JO  - Methods Quarterly", "PY  - 2021", "SP  - 11", "EP  - 29", "ER  - ", ""].join("\n");
    await page.locator('input[type="file"]').setInputFiles({ name: "record.ris", mimeType: "text/plain", buffer: Buffer.from(ris, "utf8") });
    await page.waitForFunction(() => (document.querySelector("#citation-text") as HTMLTextAreaElement | null)?.value.includes("TY  - JOUR"));
    await page.getByRole("button", { name: "Read the record" }).click();
    await page.waitForFunction(() => (document.querySelector("#paper-title") as HTMLInputElement | null)?.value !== "");
    expect(await page.locator("#paper-title").inputValue()).toBe("Scaled difference tests in practice");
    expect(await page.locator("#paper-authors").inputValue()).toBe("Øvergaard, Siri\nvon Trapp, Maria");
    expect(await page.locator("#paper-pages").inputValue()).toBe("11–29");
    // BibTeX that does not parse: a message next to the text
    await page.locator("#citation-text").fill("@article{broken, title = {An unclosed brace");
    await page.getByRole("button", { name: "Read the record" }).click();
    await page.locator("#citation-text-error").waitFor();
    expect(problems.filter((problem) => !problem.includes("400"))).toEqual([]);
  });

  it("an admin rechecks everything and watches the progress bar reach the end", async () => {
    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, "admin@fitledger.test", "/admin/recheck");
    await page.getByRole("button", { name: "Recheck everything" }).click();
    await page.getByText("Last full recheck").waitFor({ timeout: 90_000 });
    const line = await page.locator('[aria-live="polite"]', { hasText: "papers" }).textContent();
    const [, done, total] = /(\d+) of (\d+) papers \(100 %\)/.exec(line ?? "") ?? [];
    expect(Number(done)).toBe(Number(total));
    expect(Number(total)).toBeGreaterThan(150); // the seeded demo corpus has 160 papers, plus the ones made above
    expect(await page.locator("progress").getAttribute("value")).toBe(total);
    expect(problems).toEqual([]);
  });

  it("a curator returns the verified entry for a correction, and the public no longer sees it", async () => {
    const { page, problems } = await openPage(browser, e2e.baseUrl);
    await signInAs(page, CURATOR, `/review/${paperId}`);
    await page.getByLabel("Comment for the contributor").fill("The authors' erratum gives N = 412 for the second sample.");
    await page.getByRole("button", { name: "Return for a correction" }).click();
    await page.getByTestId("review-outcome").getByText("The contributor has the comment").waitFor();
    const mail = await waitForMessage(e2e.mailUrl, { to: CONTRIBUTOR, subject: "Your entry was returned", contains: "N = 412" });
    expect(mail.text).toContain(`/workbench/papers/${paperId}`);
    expect((await fetch(`${e2e.baseUrl}/api/papers/${paperId}`)).status).toBe(404);
    expect(problems).toEqual([]);
  });
});
