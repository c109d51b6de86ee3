// Attachments as a proposer meets them: a file of a type not accepted, picked or dropped,
// is refused at once with the accepted types listed; a file whose content is not what its
// name says is refused after upload without a Retry that could never work; a good file ends
// up in the attached list, with no progress bar left behind.
import { describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { TEST_PASSWORD } from "../support/factories";
import { browserSession, signInThroughPage } from "../support/browser";
import { makeProposal } from "../integration/matrix/dossiers";

const PDF = Buffer.from("%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n", "latin1");
// A Windows executable's header under a PDF's name.
const DISGUISED = Buffer.concat([Buffer.from("MZ\x90\x00\x03\x00\x00\x00", "latin1"), Buffer.alloc(2048, 0)]);

async function dropFile(page: Page, name: string, type: string, bytes: Buffer) {
  await page.getByText("Drop files here").evaluate(
    (el, file) => {
      const transfer = new DataTransfer();
      transfer.items.add(new File([new Uint8Array(file.bytes)], file.name, { type: file.type }));
      const zone = el.parentElement!;
      for (const kind of ["dragenter", "dragover", "drop"])
        zone.dispatchEvent(new DragEvent(kind, { bubbles: true, cancelable: true, dataTransfer: transfer }));
    },
    { name, type, bytes: [...bytes] },
  );
}

describe("attachments in the browser", () => {
  const { page: openPage } = browserSession();

  it("says which files are refused and why, and lists the ones attached", async () => {
    const { cast, proposal } = await makeProposal();
    const page = await openPage();
    try {
      await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
      await page.goto("/boards");
      await page.getByRole("link", { name: cast.board.name }).click();
      await page.getByRole("link", { name: proposal.title }).first().click();
      await page.getByRole("textbox", { name: "Dossier text" }).waitFor();
      const panel = page.getByRole("region", { name: "Attachments" });

      // Picked: refused before any upload, with the accepted types in words.
      await page.locator('input[type="file"]').setInputFiles({ name: "tool.exe", mimeType: "application/x-msdownload", buffer: DISGUISED });
      const refused = panel.getByRole("alert").filter({ hasText: '"tool.exe" was not attached' });
      await refused.waitFor();
      const text = await refused.innerText();
      expect(text).toContain("files of this type are not accepted");
      expect(text).toContain("PDF (.pdf)");
      expect(text).toContain(".tle");
      expect(await panel.getByRole("progressbar").count()).toBe(0);
      await refused.getByRole("button", { name: "Dismiss" }).click();
      expect(await panel.getByRole("alert").count()).toBe(0);

      // Dropped: the same.
      await dropFile(page, "tool.exe", "application/x-msdownload", DISGUISED);
      await panel.getByRole("alert").filter({ hasText: '"tool.exe" was not attached: files of this type are not accepted' }).waitFor();

      // Disguised: uploaded, then refused by the server's check; no Retry is offered.
      await page.locator('input[type="file"]').setInputFiles({ name: "orbit-plan.pdf", mimeType: "application/pdf", buffer: DISGUISED });
      const failed = panel.locator('[data-upload-status="failed"]');
      await failed.waitFor({ timeout: 20_000 });
      expect(await failed.getByRole("alert").innerText()).toContain("orbit-plan.pdf");
      expect(await failed.getByRole("button", { name: "Retry" }).count()).toBe(0);
      await failed.getByRole("button", { name: "Dismiss" }).click();
      await expect.poll(() => failed.count()).toBe(0);

      // A real PDF ends as a file in the list, marked as just attached, and no bar stays.
      await page.locator('input[type="file"]').setInputFiles({ name: "lantern-plan.pdf", mimeType: "application/pdf", buffer: PDF });
      const attached = panel.getByRole("list", { name: "Attached files" }).getByRole("listitem").filter({ hasText: "lantern-plan.pdf" });
      await attached.getByRole("link", { name: "lantern-plan.pdf" }).waitFor({ timeout: 20_000 });
      await attached.getByText("Attached", { exact: true }).waitFor();
      expect(await panel.getByRole("progressbar").count()).toBe(0);
      expect(await panel.getByRole("list", { name: "Attached files" }).innerText()).not.toContain("orbit-plan.pdf");
    } finally {
      await page.close();
    }
  });
});
