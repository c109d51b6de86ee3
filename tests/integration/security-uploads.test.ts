// Issue 17, finding 1: a confirmed (and later submitted) file cannot be replaced through the
// presigned PUT URL. Uploads land on a staging key; confirm copies them server-side to a final
// key no URL was issued for, sniffs and hashes that object, and deletes the staging one.
import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import {
  attachmentDownloadUrl,
  cleanUpUnconfirmedUploads,
  confirmAttachment,
  presignAttachmentUpload,
  stagingObjectKey,
  UPLOAD_URL_SECONDS,
} from "@/lib/dal/attachments";
import { submitProposal } from "@/lib/dal/proposals";
import { bucket, objectStore, presignDownload, readObject, statObjectOrNull, writeObject } from "@/storage/object-store";
import { asSessionUser } from "../support/factories";
import { attachmentRow, makeProposal } from "./matrix/dossiers";

const PDF = Buffer.from(
  "%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n",
  "latin1",
);
const sha256 = (b: Buffer) => crypto.createHash("sha256").update(b).digest("hex");

describe("upload integrity", () => {
  it("keeps the confirmed file when the PUT URL is used again after confirm and after submission", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const presigned = await presignAttachmentUpload(proposer, cast.board.id, proposal.id, {
      filename: "plan.pdf",
      contentType: "application/pdf",
      size: PDF.length,
    });
    // Presigned PUTs are short-lived and point at the staging key only.
    expect(UPLOAD_URL_SECONDS).toBeLessThanOrEqual(5 * 60);
    const url = new URL(presigned.uploadUrl);
    expect(Number(url.searchParams.get("X-Amz-Expires"))).toBeLessThanOrEqual(5 * 60);
    const finalKey = (await attachmentRow(presigned.attachment.id))!.objectKey;
    expect(decodeURIComponent(url.pathname)).toContain(stagingObjectKey(finalKey));
    expect(decodeURIComponent(url.pathname).endsWith(`/${finalKey}`) && !url.pathname.includes("staging")).toBe(false);

    // The uploader's PUT header claims HTML; the stored type comes from the bytes.
    const put = await fetch(presigned.uploadUrl, { method: "PUT", headers: { "Content-Type": "text/html" }, body: new Uint8Array(PDF) });
    expect(put.status).toBe(200);
    const confirmed = await confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
    expect(confirmed.sha256).toBe(sha256(PDF));
    expect(confirmed.contentType).toBe("application/pdf");
    expect(await statObjectOrNull(stagingObjectKey(finalKey))).toBeNull();
    expect((await statObjectOrNull(finalKey))!.contentType).toBe("application/pdf");

    // Reuse the URL after confirm, and again after submission: the final object stays.
    const evil = Buffer.from("<!doctype html><script>alert(1)</script>".padEnd(PDF.length, " "), "utf8");
    await fetch(presigned.uploadUrl, { method: "PUT", headers: { "Content-Type": "text/html" }, body: new Uint8Array(evil) });
    await submitProposal(proposer, cast.board.id, proposal.id);
    await fetch(presigned.uploadUrl, { method: "PUT", headers: { "Content-Type": "text/html" }, body: new Uint8Array(evil) });
    expect(sha256(await readObject(finalKey))).toBe(sha256(PDF));
    const row = await attachmentRow(presigned.attachment.id);
    expect(row!.sha256).toBe(sha256(PDF));

    // The late staging object is never read, and housekeeping removes it once the URL expired.
    expect(await statObjectOrNull(stagingObjectKey(finalKey))).not.toBeNull();
    await cleanUpUnconfirmedUploads(new Date(Date.now() + 60_000));
    expect(await statObjectOrNull(stagingObjectKey(finalKey))).toBeNull();
    expect(sha256(await readObject(finalKey))).toBe(sha256(PDF));

    const download = await fetch(await attachmentDownloadUrl(asSessionUser(cast.chair), cast.board.id, presigned.attachment.id));
    expect(download.status).toBe(200);
    expect(download.headers.get("content-type")).toBe("application/pdf");
    expect(download.headers.get("content-disposition")).toMatch(/^attachment;/);
    expect(sha256(Buffer.from(await download.arrayBuffer()))).toBe(sha256(PDF));
  });
});

describe("stored objects are served as downloads", () => {
  it("answers every GET from the store with Content-Disposition: attachment and X-Content-Type-Options: nosniff", async () => {
    const key = `tests/security/${crypto.randomUUID()}/page.html`;
    await writeObject(key, "<!doctype html><script>parent.postMessage(document.cookie, '*')</script>", "text/html");
    // Even a presigned GET without response overrides (as a forged link would be).
    const plain = await fetch(await objectStore().presignedGetObject(bucket(), key, 60));
    expect(plain.status).toBe(200);
    expect(plain.headers.get("x-content-type-options")).toBe("nosniff");
    expect(plain.headers.get("content-disposition")).toMatch(/^attachment/);
    const named = await fetch(await presignDownload(key, "page.html", 60, "text/plain; charset=utf-8"));
    expect(named.headers.get("content-disposition")).toMatch(/^attachment; filename="page.html"/);
    expect(named.headers.get("content-type")).toBe("text/plain; charset=utf-8");
    expect(named.headers.get("x-content-type-options")).toBe("nosniff");
  });
});
