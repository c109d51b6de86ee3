import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { appUrl } from "../support/app";
import { launchBrowser, newPage } from "../support/browser";

describe("smoke: the landing page in a real browser", () => {
  let browser: Browser;

  beforeAll(async () => {
    await appUrl();
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
  });

  it("says what VisViva does and reports every service ok", async () => {
    const page = await newPage(browser);
    await page.goto("/");
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toMatch(/mission proposals/i);
    await expect(page.getByText(/recomputes every orbit and Δv claim/i).count()).resolves.toBe(1);
    const health = await page.goto("/api/health");
    expect(health?.status()).toBe(200);
    const body = JSON.parse((await page.textContent("body")) ?? "{}");
    expect(body.services).toEqual({ database: "ok", objectStore: "ok", mail: "ok" });
  });
});
