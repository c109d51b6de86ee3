// One real browser through the real sign-in page: password, land on the boards list, see the
// board, sign out.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { appUrl } from "../support/app";
import { launchBrowser, newPage } from "../support/browser";
import { createBoardWithCast, TEST_PASSWORD } from "../support/factories";
import { linkIn, waitForMail } from "../support/mail";

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

  it("resets a forgotten password from the e-mailed link, then signs in with the new one", async () => {
    const cast = await createBoardWithCast();
    const page = await newPage(browser);
    const fresh = "a brand new pass phrase for the board";
    try {
      await page.goto(`${base}/sign-in`);
      await page.getByText("Forgot your password?").click();
      const request = page.getByRole("form", { name: "E-mail me a link to choose a new password" });
      await request.getByLabel("Account e-mail").fill(cast.proposer.email);
      await request.getByRole("button", { name: "E-mail me a reset link" }).click();
      await request.getByText("a link to choose a new password is on its way").waitFor();

      const mail = await waitForMail(cast.proposer.email, /new VisViva password/);
      await page.goto(linkIn(mail, "/sign-in/reset"));
      const reset = page.getByRole("form", { name: "Choose a new password" });
      await reset.getByLabel("New password").fill(fresh);
      await reset.getByLabel("The same again").fill("not the same at all, sorry");
      await reset.getByRole("button", { name: "Set the new password" }).click();
      await page.getByText("The two passwords differ.").waitFor();
      await reset.getByLabel("The same again").fill(fresh);
      await reset.getByRole("button", { name: "Set the new password" }).click();
      await page.getByText("every browser is signed out").waitFor();

      await page.getByRole("link", { name: "Sign in with the new password" }).click();
      const form = page.getByRole("form", { name: "Sign in with e-mail and password" });
      await form.getByLabel("E-mail").fill(cast.proposer.email);
      await form.getByLabel("Password").fill(fresh);
      await form.getByRole("button", { name: "Sign in" }).click();
      await page.getByRole("button", { name: "Sign out" }).waitFor();
    } finally {
      await page.close();
    }
  });
});
