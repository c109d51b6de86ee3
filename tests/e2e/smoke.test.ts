import { describe, expect, it } from "vitest";
import { browserSession, typeInto } from "../support/browser";

describe("smoke: the landing page in a real browser", () => {
  const { page: openPage } = browserSession();

  it("says what VisViva does and reports every service ok", async () => {
    const page = await openPage();
    await page.goto("/");
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toMatch(/mission proposals/i);
    await expect(page.getByText(/recomputes every orbit and Δv claim/i).count()).resolves.toBe(1);
    const health = await page.goto("/api/health");
    expect(health?.status()).toBe(200);
    const body = JSON.parse((await page.textContent("body")) ?? "{}");
    expect(body.services).toEqual({ database: "ok", objectStore: "ok", mail: "ok" });
  });

  it("recomputes a pasted request live on the public orbit-check page", async () => {
    const page = await openPage();
    await page.goto("/tools/orbit-check");
    await page.getByText("consistent — holds").first().waitFor();
    await page.getByLabel("Start from").selectOption("a claim off by more than the tolerance");
    await page.getByText("inconsistent — off by more than the tolerance").first().waitFor();
    await typeInto(page.getByLabel("Request (JSON)"), "{ not json");
    await page.getByText("The request is not valid JSON").waitFor();
  });
});
