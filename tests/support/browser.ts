// Debian's chromium driven by playwright-core (no browser download).
import { chromium, type Browser, type Page } from "playwright-core";
import { baseUrl } from "./http";

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"],
  });
}

/** A fresh page at a fixed viewport (screenshots compare across runs). */
export async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1360, height: 900 }, baseURL: baseUrl() });
  return context.newPage();
}

/** Signs in through the real sign-in page with e-mail and password. */
export async function signInThroughPage(page: Page, email: string, password: string): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail", { exact: true }).first().fill(email);
  await page.getByLabel("Password", { exact: true }).fill(password);
  await page.getByRole("button", { name: /^sign in$/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 30_000 });
}
