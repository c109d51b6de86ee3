// Attachments against the real object store: presigned PUT from "the browser" (fetch),
// confirmation with content sniffing and SHA-256, rejections, downloads and cleanup.
import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { attachments } from "@/db/schema";
import {
  attachmentDownloadUrl,
  cleanUpUnconfirmedUploads,
  confirmAttachment,
  deleteAttachment,
  listAttachments,
  presignAttachmentUpload,
} from "@/lib/dal/attachments";
import { saveDraft, submitProposal } from "@/lib/dal/proposals";
import { attachmentContentPath } from "@/lib/dossier";
import { statObjectOrNull, writeObject } from "@/storage/object-store";
import { errorOf } from "../support/errors";
import { addMember, asSessionUser, createUser } from "../support/factories";
import { attachmentRow, dossierDoc, makeProposal } from "./matrix/dossiers";

/** A small but real PDF (header, one empty page, trailer). */
const PDF = Buffer.from(
  "%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 200 200]>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n",
  "latin1",
);

const OEM = Buffer.from(
  "CCSDS_OEM_VERS = 2.0\nCREATION_DATE = 2031-04-01T00:00:00\nORIGINATOR = EXAMPLE-AGENCY\nMETA_START\nOBJECT_NAME = LANTERN-1\nCENTER_NAME = EARTH\nREF_FRAME = EME2000\nTIME_SYSTEM = UTC\nMETA_STOP\n2031-04-01T00:00:00 6878.137 0 0 0 7.612 0\n",
  "utf8",
);

async function upload(
  user: ReturnType<typeof asSessionUser>,
  boardId: string,
  proposalId: string,
  filename: string,
  contentType: string,
  body: Buffer,
  declaredSize = body.length,
) {
  const presigned = await presignAttachmentUpload(user, boardId, proposalId, { filename, contentType, size: declaredSize });
  const put = await fetch(presigned.uploadUrl, { method: "PUT", headers: presigned.headers, body: new Uint8Array(body) });
  expect(put.status).toBe(200);
  return presigned;
}

describe("attachments", () => {
  it("uploads a PDF through a presigned PUT, confirms it with its SHA-256, and downloads it as an attachment", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const presigned = await upload(proposer, cast.board.id, proposal.id, "mission-plan.pdf", "application/pdf", PDF);
    expect(presigned.method).toBe("PUT");
    const key = (await attachmentRow(presigned.attachment.id))!.objectKey;
    expect(key).toBe(`boards/${cast.board.id}/proposals/${proposal.id}/attachments/${presigned.attachment.id}`);
    // Not listed until confirmed.
    expect(await listAttachments(proposer, cast.board.id, proposal.id)).toHaveLength(0);

    const confirmed = await confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
    expect(confirmed.status).toBe("confirmed");
    expect(confirmed.size).toBe(PDF.length);
    expect(confirmed.sha256).toBe(crypto.createHash("sha256").update(PDF).digest("hex"));
    expect(confirmed.contentType).toBe("application/pdf");
    expect((await listAttachments(asSessionUser(cast.chair), cast.board.id, proposal.id)).map((a) => a.id)).toEqual([presigned.attachment.id]);

    const url = await attachmentDownloadUrl(proposer, cast.board.id, presigned.attachment.id);
    const download = await fetch(url);
    expect(download.status).toBe(200);
    expect(download.headers.get("content-disposition")).toMatch(/^attachment; filename="mission-plan.pdf"/);
    expect(Buffer.from(await download.arrayBuffer()).equals(PDF)).toBe(true);
  });

  it("confirms CCSDS orbit data messages as plain text and recognises them", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const presigned = await upload(proposer, cast.board.id, proposal.id, "lantern-1.oem", "text/plain", OEM);
    const confirmed = await confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
    expect(confirmed.textKind).toBe("CCSDS OEM");
    expect(confirmed.contentType).toBe("text/plain");
  });

  it("removes a disguised file (HTML or an executable named .pdf) with a 422 that says why", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    for (const [name, body] of [
      ["report.pdf", Buffer.from("<!doctype html><script>alert(document.cookie)</script>", "utf8")],
      ["setup.pdf", Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(64)])],
    ] as const) {
      const presigned = await upload(proposer, cast.board.id, proposal.id, name, "application/pdf", body);
      const key = (await attachmentRow(presigned.attachment.id))!.objectKey;
      const error = await errorOf(confirmAttachment(proposer, cast.board.id, presigned.attachment.id));
      expect(error.status).toBe(422);
      expect(error.message).toContain(`"${name}" was declared as application/pdf but its content is not a file of that type`);
      expect(await attachmentRow(presigned.attachment.id)).toBeNull();
      expect(await statObjectOrNull(key)).toBeNull();
    }
    // A binary file declared as a two-line element set is refused too.
    const presigned = await upload(proposer, cast.board.id, proposal.id, "catalog.tle", "text/plain", Buffer.from([0x31, 0x20, 0x00, 0x01, 0xfe]));
    const error = await errorOf(confirmAttachment(proposer, cast.board.id, presigned.attachment.id));
    expect(error.status).toBe(422);
    expect(error.message).toMatch(/NUL bytes/);
  });

  it("refuses types outside the allow-list and files over the cap", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const html = await errorOf(presignAttachmentUpload(proposer, cast.board.id, proposal.id, { filename: "page.html", contentType: "text/html", size: 10 }));
    expect(html.status).toBe(422);
    expect(html.message).toMatch(/cannot be attached/);
    const renamed = await errorOf(
      presignAttachmentUpload(proposer, cast.board.id, proposal.id, { filename: "tool.exe", contentType: "application/pdf", size: 10 }),
    );
    expect(renamed.status).toBe(422);
    const huge = await errorOf(
      presignAttachmentUpload(proposer, cast.board.id, proposal.id, { filename: "big.pdf", contentType: "application/pdf", size: 101 * 1024 * 1024 }),
    );
    expect(huge.status).toBe(422);
    expect(huge.message).toMatch(/limited to 100 MB/);

    // The store does not enforce the declared size: a larger object is caught at confirmation.
    const presigned = await upload(proposer, cast.board.id, proposal.id, "plan.pdf", "application/pdf", PDF, 10);
    const bigger = await errorOf(confirmAttachment(proposer, cast.board.id, presigned.attachment.id));
    expect(bigger.status).toBe(422);
    expect(bigger.message).toMatch(/declared as 10/);
    expect(await attachmentRow(presigned.attachment.id)).toBeNull();

    // Over the configured cap at confirmation (cap lowered for the test).
    const capped = await upload(proposer, cast.board.id, proposal.id, "plan.pdf", "application/pdf", PDF);
    const over = await errorOf(confirmAttachment(proposer, cast.board.id, capped.attachment.id, { maxBytes: 64 }));
    expect(over.status).toBe(422);
    expect(over.message).toMatch(/limited to 64 bytes/);
    expect(
      await statObjectOrNull(
        (await attachmentRow(capped.attachment.id))?.objectKey ?? `boards/${cast.board.id}/proposals/${proposal.id}/attachments/${capped.attachment.id}`,
      ),
    ).toBeNull();
  });

  it("issues upload URLs only to the proposal's authors (404 for anyone else's proposal)", async () => {
    const { cast, proposal } = await makeProposal();
    const otherProposer = await createUser();
    await addMember(cast.board.id, otherProposer.id, "proposer");
    const input = { filename: "a.pdf", contentType: "application/pdf", size: 100 };
    for (const user of [otherProposer, cast.reviewer, cast.chair, cast.outsider]) {
      expect((await errorOf(presignAttachmentUpload(asSessionUser(user), cast.board.id, proposal.id, input))).status).toBe(404);
    }
    // Confirming someone else's upload is hidden the same way.
    const presigned = await upload(asSessionUser(cast.proposer), cast.board.id, proposal.id, "plan.pdf", "application/pdf", PDF);
    expect((await errorOf(confirmAttachment(asSessionUser(otherProposer), cast.board.id, presigned.attachment.id))).status).toBe(404);
  });

  it("cleans up unconfirmed uploads older than the cut-off, object and row", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const old = await upload(proposer, cast.board.id, proposal.id, "old.pdf", "application/pdf", PDF);
    const neverArrived = await presignAttachmentUpload(proposer, cast.board.id, proposal.id, {
      filename: "lost.pdf",
      contentType: "application/pdf",
      size: 50,
    });
    const fresh = await upload(proposer, cast.board.id, proposal.id, "fresh.pdf", "application/pdf", PDF);
    const twoHoursAgo = new Date(Date.now() - 2 * 3600_000);
    await db().update(attachments).set({ createdAt: twoHoursAgo }).where(eq(attachments.id, old.attachment.id));
    await db().update(attachments).set({ createdAt: twoHoursAgo }).where(eq(attachments.id, neverArrived.attachment.id));
    const oldKey = (await attachmentRow(old.attachment.id))!.objectKey;

    const removed = await cleanUpUnconfirmedUploads(new Date(Date.now() - 3600_000));
    expect(removed).toBeGreaterThanOrEqual(2);
    expect(await attachmentRow(old.attachment.id)).toBeNull();
    expect(await attachmentRow(neverArrived.attachment.id)).toBeNull();
    expect(await statObjectOrNull(oldKey)).toBeNull();
    expect((await attachmentRow(fresh.attachment.id))!.status).toBe("pending");
  });

  it("keeps an attachment's object for the versions that list it when it is removed from the draft", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const presigned = await upload(proposer, cast.board.id, proposal.id, "plan.pdf", "application/pdf", PDF);
    await confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
    const src = attachmentContentPath(cast.board.id, presigned.attachment.id);
    const saved = await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "paragraph", content: [{ type: "text", text: "Figure:" }] },
        { type: "image", attrs: { src, alt: "ground track" } },
      ]),
    });
    expect(JSON.stringify(saved.document)).toContain(src);
    await submitProposal(proposer, cast.board.id, proposal.id);
    const key = (await attachmentRow(presigned.attachment.id))!.objectKey;
    // Under review: the draft is frozen.
    expect((await errorOf(deleteAttachment(proposer, cast.board.id, presigned.attachment.id))).status).toBe(409);
    // Chairs can download what the version lists.
    expect(await attachmentDownloadUrl(asSessionUser(cast.chair), cast.board.id, presigned.attachment.id)).toMatch(/^http/);
    expect(await statObjectOrNull(key)).not.toBeNull();
  });

  it("deletes a draft attachment's object and row", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const presigned = await upload(proposer, cast.board.id, proposal.id, "notes.txt", "text/plain", Buffer.from("Δv notes\n", "utf8"));
    await confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
    const key = (await attachmentRow(presigned.attachment.id))!.objectKey;
    await deleteAttachment(proposer, cast.board.id, presigned.attachment.id);
    expect(await attachmentRow(presigned.attachment.id)).toBeNull();
    expect(await statObjectOrNull(key)).toBeNull();
    await writeObject(key, "x", "text/plain"); // the key is free again; nothing else refers to it
  });
});
