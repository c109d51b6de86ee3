// One real browser through the real sign-in page: password, land on the boards list, see the
// board, sign out.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { appUrl } from "../support/app";
import { launchBrowser, newPage } from "../support/browser";
import { createBoardWithCast, TEST_PASSWORD } from "../support/factories";

describe("signing in in the browser", () => {
  let browser: Browser;
  let base: string;

  beforeAll(async () => {
    base = await appUrl();
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
  });

  it("signs in with a password, shows the member's board, and signs out", async () => {
    const cast = await createBoardWithCast();
    const page = await newPage(browser);
    try {
      await page.goto(`${base}/boards`);
      // Signed out: the boards list sends the visitor to sign in.
      await page.waitForURL(/\/sign-in\?callbackUrl=/);
      const form = page.getByRole("form", { name: "Sign in with e-mail and password" });
      await form.getByLabel("E-mail").fill(cast.reviewer.email);
      await form.getByLabel("Password").fill("a wrong password here");
      await form.getByRole("button", { name: "Sign in" }).click();
      await page.getByRole("alert").filter({ hasText: "do not match an active account" }).waitFor();

      await form.getByLabel("Password").fill(TEST_PASSWORD);
      await form.getByRole("button", { name: "Sign in" }).click();
      await page.waitForURL(`${base}/boards`);
      await page.getByRole("heading", { name: "Your boards" }).waitFor();
      const boardLink = page.getByRole("link", { name: cast.board.name });
      await boardLink.waitFor();
      expect(await page.getByRole("link", { name: cast.other.name }).count()).toBe(0);

      await boardLink.click();
      await page.waitForURL(`${base}/boards/${cast.board.id}`);
      await page.getByRole("heading", { name: cast.board.name }).waitFor();
      await page.getByText("You are a reviewer on this board.").waitFor();

      await page.getByRole("button", { name: "Sign out" }).click();
      await page.getByRole("link", { name: "Sign in", exact: true }).first().waitFor();
      await page.goto(`${base}/boards`);
      await page.waitForURL(/\/sign-in/);
    } finally {
      await page.close();
    }
  });
});
