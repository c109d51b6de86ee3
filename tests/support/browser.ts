// Debian's chromium driven by playwright-core (no browser download).
import { chromium, type Browser, type Locator, type Page } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { appUrl } from "./app";
import { TEST_PASSWORD } from "./factories";
import { baseUrl } from "./http";

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"],
  });
}

/** Every Content-Security-Policy refusal the browser reported, with the page it happened on. */
export const cspViolations: string[] = [];

/** A fresh page at a fixed viewport (screenshots compare across runs). */
export async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1360, height: 900 }, baseURL: baseUrl() });
  const page = await context.newPage();
  page.on("console", (message) => {
    if (message.type() === "error" && /Content Security Policy/i.test(message.text())) cspViolations.push(`${page.url()}: ${message.text()}`);
  });
  return page;
}

/** Signs in through the real sign-in page with e-mail and password. */
export async function signInThroughPage(page: Page, email: string, password: string): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail", { exact: true }).first().fill(email);
  await page.getByLabel("Password", { exact: true }).fill(password);
  await page.getByRole("button", { name: /^sign in$/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 30_000 });
}

/**
 * One browser for a describe block: launched (after the app is up) in beforeAll and closed in
 * afterAll. `page()` opens a fresh page; `as(email)` opens one signed in through /sign-in.
 */
export function browserSession(options: { onPage?: (page: Page, email: string | null) => void } = {}) {
  let browser: Browser | undefined;
  beforeAll(async () => {
    await appUrl();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    // The pages must work under their own policy: nothing the app needs may be refused.
    const refused = cspViolations.splice(0);
    if (refused.length > 0) throw new Error(`the Content-Security-Policy refused ${refused.length} load(s):\n${refused.join("\n")}`);
  });
  const page = async (): Promise<Page> => {
    if (!browser) throw new Error("the browser is not up yet: call page() inside a test");
    const opened = await newPage(browser);
    options.onPage?.(opened, null);
    return opened;
  };
  const as = async (email: string, password = TEST_PASSWORD): Promise<Page> => {
    if (!browser) throw new Error("the browser is not up yet: call as() inside a test");
    const opened = await newPage(browser);
    options.onPage?.(opened, email);
    await signInThroughPage(opened, email, password);
    return opened;
  };
  return { page, as };
}

/**
 * Types into a text field as a person does: click it, select its text, then key by key with
 * `page.keyboard.type` (never `fill`, which pastes and hides bugs that lose keystrokes or
 * focus). Fails when the field did not keep exactly what was typed.
 */
export async function typeInto(field: Locator, text: string): Promise<void> {
  await field.click();
  // Select what is there so the first key replaces it (as a person selects and types over).
  await field.press("ControlOrMeta+a");
  await field.page().keyboard.type(text);
  const kept = await field.inputValue();
  if (kept !== text) throw new Error(`typed "${text}" but the field kept "${kept}"`);
}
