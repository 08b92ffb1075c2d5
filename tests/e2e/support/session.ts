import type { Page } from "playwright-core";
import { DEMO_PASSWORD } from "@/seeders/demo/corpus";

/** Signs a demo account in through the real form and waits until the app has sent it on to `next`. */
export async function signInAs(page: Page, email: string, next: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`/signin?next=${encodeURIComponent(next)}`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password", { exact: true }).fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => url.pathname === next);
}
