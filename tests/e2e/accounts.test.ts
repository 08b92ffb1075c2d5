import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, openPage } from "./support/browser";
import { waitForMessage } from "./support/mail";
import "./support/context";

const e2e = inject("e2e");

// The account side in a real browser against the built app: the demo admin (seeded with the demo
// password) approves a new applicant on /admin/people, the approval arrives in the fake SMTP inbox, the
// person signs in to the workbench, changes their password (which signs out their other browser but
// not this one), and after a suspension their next page load signs them out.

const ADMIN = { email: "admin@fitledger.test", password: "fitledger-demo" };
const applicant = {
  // markup in a name must show as typed, never as markup
  name: "Mara <em>Voss</em>",
  email: `mara.voss.${Date.now()}@example.org`,
  affiliation: "Centre for Replication Studies",
  reason: "I code measurement invariance papers for a meta-analysis of reporting errors.",
  password: "chi square differences add up",
  newPassword: "degrees of freedom add up too",
};

async function signIn(page: Page, email: string, password: string, next?: string) {
  await page.goto(next ? `/signin?next=${encodeURIComponent(next)}` : "/signin");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password", { exact: true }).fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

async function peopleRow(page: Page, status: string, email: string) {
  await page.goto(`/admin/people?status=${status}&q=${encodeURIComponent(email)}`);
  return page.locator("tbody tr", { hasText: email });
}

describe.skipIf(!e2e.enabled)("accounts in the browser", () => {
  let browser: Browser;
  let applicantPage: Page;
  let applicantProblems: string[];
  let adminPage: Page;

  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page: applicantPage, problems: applicantProblems } = await openPage(browser, e2e.baseUrl));
    ({ page: adminPage } = await openPage(browser, e2e.baseUrl));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a new person applies and is told what happens next", async () => {
    await applicantPage.goto("/join");
    await applicantPage.getByLabel("Full name").fill(applicant.name);
    await applicantPage.getByLabel("E-mail address").fill(applicant.email);
    await applicantPage.getByLabel("Affiliation").fill(applicant.affiliation);
    await applicantPage.getByLabel("Why would you like an account?").fill(applicant.reason);
    await applicantPage.getByLabel("Password", { exact: true }).fill(applicant.password);
    await applicantPage.getByLabel("Password again").fill(applicant.password);
    await applicantPage.getByRole("button", { name: "Send application" }).click();
    await applicantPage.getByText("Thank you — your application is in.").waitFor();
    expect(await applicantPage.getByRole("status").textContent()).toContain("You get an e-mail at the address you gave");
  });

  it("before approval, signing in tells the applicant the account is waiting", async () => {
    await signIn(applicantPage, applicant.email, applicant.password);
    await applicantPage.getByText("still waiting for an admin's decision").waitFor();
    expect(new URL(applicantPage.url()).pathname).toBe("/signin");
  });

  it("the admin signs in, sees the application with the name shown as typed, and approves it", async () => {
    await signIn(adminPage, ADMIN.email, ADMIN.password, "/admin/people");
    await adminPage.waitForURL(/\/admin\/people/);
    const row = await peopleRow(adminPage, "pending", applicant.email);
    await row.waitFor();
    expect(await row.locator("th").textContent()).toContain("Mara <em>Voss</em>");
    expect(await row.locator("em").count()).toBe(0);
    expect(await row.textContent()).toContain(applicant.reason);
    await row.getByRole("button", { name: "Approve" }).click();
    await row.waitFor({ state: "detached" });
    const active = await peopleRow(adminPage, "active", applicant.email);
    expect(await active.count()).toBe(1);
  });

  it("the approval e-mail arrives in the fake SMTP inbox", async () => {
    const message = await waitForMessage(e2e.mailUrl, { to: applicant.email, subject: "Your Fitledger account is ready" });
    expect(message.text).toContain(`${e2e.baseUrl}/signin`);
    expect(message.html).toContain("Mara &lt;em&gt;Voss&lt;/em&gt;");
  });

  it("the person signs in and reaches the workbench", async () => {
    await signIn(applicantPage, applicant.email, applicant.password);
    await applicantPage.waitForURL(/\/workbench$/);
    await applicantPage.getByRole("heading", { name: "Your workbench" }).waitFor();
    await applicantPage.getByText("You have not coded a paper yet.").waitFor();
    const accountMenu = applicantPage.getByRole("navigation", { name: "Account" });
    await accountMenu.getByText("Mara <em>Voss</em>").waitFor();
    expect(await accountMenu.locator("em").count()).toBe(0);
    // the one refused sign-in (pending account) answered 401, which the browser logs; nothing else failed
    expect(applicantProblems).toEqual(["console error: Failed to load resource: the server responded with a status of 401 (Unauthorized)"]);
  });

  it("changing the password keeps this browser signed in and signs the person's other browser out", async () => {
    const { page: otherPage } = await openPage(browser, e2e.baseUrl);
    await signIn(otherPage, applicant.email, applicant.password);
    await otherPage.waitForURL(/\/workbench$/);

    await applicantPage.goto("/account");
    await applicantPage.getByLabel("Current password").fill(applicant.password);
    await applicantPage.getByLabel("New password", { exact: true }).fill(applicant.newPassword);
    await applicantPage.getByLabel("New password again").fill(applicant.newPassword);
    await applicantPage.getByRole("button", { name: "Change password" }).click();
    await applicantPage.getByText("Your password is changed and your other sessions are signed out.").waitFor();
    await applicantPage.goto("/workbench");
    await applicantPage.getByRole("heading", { name: "Your workbench" }).waitFor();

    await otherPage.goto("/workbench");
    await otherPage.waitForURL(/\/signin/);
    await signIn(otherPage, applicant.email, applicant.password);
    await otherPage.getByText("That e-mail address and password do not match an account.").waitFor();
    await signIn(otherPage, applicant.email, applicant.newPassword);
    await otherPage.waitForURL(/\/workbench$/);
    await otherPage.context().close();
  });

  it("after an admin suspends the person, their next page load signs them out", async () => {
    const row = await peopleRow(adminPage, "active", applicant.email);
    await row.getByLabel(/Reason for suspending/).fill("Testing the suspension path.");
    await row.getByRole("button", { name: "Suspend" }).click();
    await row.waitFor({ state: "detached" });

    await applicantPage.reload();
    await applicantPage.waitForURL(/\/signin/);
    await applicantPage.getByRole("navigation", { name: "Account" }).getByRole("link", { name: "Sign in" }).waitFor();
    await signIn(applicantPage, applicant.email, applicant.newPassword);
    await applicantPage.getByText("This account is suspended").waitFor();
  });
});
