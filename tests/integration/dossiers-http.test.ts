// The dossier JSON API over HTTP on the running app: sign-in, autosave conflicts, the
// presigned upload round trip, submission answers and the OpenAPI document.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { signedIn } from "../support/http";
import { addMember, createUser } from "../support/factories";
import { dossierDoc, makeProposal, orbitBlock } from "./matrix/dossiers";

const PDF = Buffer.from("%PDF-1.4\n1 0 obj<</Type/Catalog>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n", "latin1");

describe("dossier API", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("saves drafts with their revision and answers a stale one with 409 and what to do", async () => {
    const { cast, proposal } = await makeProposal();
    const client = await signedIn(cast.proposer.email);
    const path = `/api/v1/boards/${cast.board.id}/proposals/${proposal.id}/draft`;
    const loaded = await (await client.get(path)).json();
    expect(loaded.draft.revision).toBe(1);
    const first = await client.request(path, {
      method: "PUT",
      json: { revision: 1, document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "one" }] }]) },
    });
    expect(first.status).toBe(200);
    expect((await first.json()).draft.revision).toBe(2);
    const stale = await client.request(path, {
      method: "PUT",
      json: { revision: 1, document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "two" }] }]) },
    });
    expect(stale.status).toBe(409);
    const body = await stale.json();
    expect(body.error).toMatch(/reload the latest and reapply/i);
    expect(body.details).toMatchObject({ currentRevision: 2 });
    // Malformed and oversized bodies are 4xx, never 500.
    expect((await client.request(path, { method: "PUT", body: "{not json", headers: { "content-type": "application/json" } })).status).toBe(400);
    expect((await client.request(path, { method: "PUT", json: { revision: "x", document: [] } })).status).toBe(422);
    const huge = await client.request(path, {
      method: "PUT",
      json: { revision: 2, document: { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "x".repeat(2_200_000) }] }] } },
    });
    expect(huge.status).toBe(413);
  });

  it("lists proposals with hasMore and a keyset cursor, and refuses a foreign cursor with 400", async () => {
    const { cast, call } = await makeProposal();
    const client = await signedIn(cast.proposer.email);
    const base = `/api/v1/boards/${cast.board.id}/proposals`;
    const callId = call.id;
    for (const title of ["Second list entry", "Third list entry"])
      expect((await client.request(base, { method: "POST", json: { title, missionType: "science", callId, coauthorIds: [] } })).status).toBe(201);
    const first = await client.get(`${base}?pageSize=2`);
    expect(first.status).toBe(200);
    const page1 = await first.json();
    expect(page1).toMatchObject({ page: 1, pageSize: 2, hasMore: true });
    expect(page1).not.toHaveProperty("total");
    expect(page1.rows).toHaveLength(2);
    const page2 = await (await client.get(`${base}?pageSize=2&cursor=${encodeURIComponent(page1.nextCursor)}`)).json();
    expect(page2).toMatchObject({ hasMore: false, nextCursor: null });
    expect(page2.rows).toHaveLength(1);
    expect(new Set([...page1.rows, ...page2.rows].map((r: { id: string }) => r.id)).size).toBe(3);
    const foreign = await client.get(`${base}?pageSize=2&sort=title&cursor=${encodeURIComponent(page1.nextCursor)}`);
    expect(foreign.status).toBe(400);
    expect((await foreign.json()).error).toMatch(/start again from the first page/);
    expect((await client.get(`${base}?cursor=%25%25%25`)).status).toBe(400);
  });

  it("uploads through a presigned PUT, confirms, and downloads through a presigned GET", async () => {
    const { cast, proposal } = await makeProposal();
    const client = await signedIn(cast.proposer.email);
    const presign = await client.post(`/api/v1/boards/${cast.board.id}/proposals/${proposal.id}/attachments`, {
      filename: "plan.pdf",
      contentType: "application/pdf",
      size: PDF.length,
    });
    expect(presign.status).toBe(201);
    const { attachment, uploadUrl, headers } = await presign.json();
    expect((await fetch(uploadUrl, { method: "PUT", headers, body: new Uint8Array(PDF) })).status).toBe(200);
    const confirm = await client.post(`/api/v1/boards/${cast.board.id}/attachments/${attachment.id}/confirm`);
    expect(confirm.status).toBe(200);
    expect((await confirm.json()).attachment.sha256).toBe(crypto.createHash("sha256").update(PDF).digest("hex"));
    const content = await client.get(`/api/v1/boards/${cast.board.id}/attachments/${attachment.id}/content`);
    expect(content.status).toBe(302);
    const download = await fetch(content.headers.get("location")!);
    expect(download.headers.get("content-disposition")).toMatch(/^attachment/);
    expect(Buffer.from(await download.arrayBuffer()).equals(PDF)).toBe(true);

    // Someone else's proposal: 404, as if it did not exist.
    const other = await createUser();
    await addMember(cast.board.id, other.id, "proposer");
    const otherClient = await signedIn(other.email);
    const refused = await otherClient.post(`/api/v1/boards/${cast.board.id}/proposals/${proposal.id}/attachments`, {
      filename: "x.pdf",
      contentType: "application/pdf",
      size: 10,
    });
    expect(refused.status).toBe(404);
    // A disallowed type is a 422 that names what is allowed.
    const exe = await client.post(`/api/v1/boards/${cast.board.id}/proposals/${proposal.id}/attachments`, {
      filename: "tool.exe",
      contentType: "application/x-msdownload",
      size: 10,
    });
    expect(exe.status).toBe(422);
    expect((await exe.json()).error).toMatch(/PDF, PNG, JPEG, CSV or plain text/);
  });

  it("submits, answers 422 with the problems, and serves versions, HTML and check results", async () => {
    const { cast, proposal } = await makeProposal({ requiredSections: ["Mission design"] });
    const client = await signedIn(cast.proposer.email);
    const base = `/api/v1/boards/${cast.board.id}/proposals/${proposal.id}`;
    const bad = orbitBlock("the science orbit", { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 6100 } });
    await client.request(`${base}/draft`, { method: "PUT", json: { revision: 1, document: dossierDoc([bad]) } });
    const missing = await client.post(`${base}/submissions`, {});
    expect(missing.status).toBe(422);
    expect((await missing.json()).details.problems[0].message).toContain("Mission design");
    await client.request(`${base}/draft`, {
      method: "PUT",
      json: { revision: 2, document: dossierDoc([{ type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Mission design" }] }, bad]) },
    });
    const submitted = await client.post(`${base}/submissions`, { revision: 3 });
    expect(submitted.status).toBe(201);
    expect((await submitted.json()).submission).toMatchObject({ number: 1, counts: { consistent: 0, inconsistent: 1, invalid: 0 } });
    const chair = await signedIn(cast.chair.email);
    const results = await (await chair.get(`${base}/versions/1/check-results`)).json();
    expect(results.results).toEqual([expect.objectContaining({ blockId: bad.attrs.blockId, status: "inconsistent" })]);
    const html = await (await chair.get(`${base}/versions/1/html`)).json();
    expect(html.html).toContain(`data-block-id="${bad.attrs.blockId}"`);
    expect((await chair.get(`${base}/versions/abc`)).status).toBe(400);
    expect((await chair.get(`${base}/versions/7`)).status).toBe(404);
    const version = await (await chair.get(`${base}/versions/1`)).json();
    expect(version.version.documentKey).toBeUndefined();
    expect(version.version.counts.inconsistent).toBe(1);
  });

  it("documents every dossier operation in the OpenAPI document", async () => {
    const client = await signedIn((await makeProposal()).cast.proposer.email);
    const doc = await (await client.get("/api/v1/openapi.json")).json();
    for (const id of [
      "listCalls",
      "createProposal",
      "saveDraft",
      "submitProposal",
      "presignAttachmentUpload",
      "confirmAttachment",
      "downloadAttachment",
      "listCheckResults",
    ]) {
      expect(JSON.stringify(doc.paths)).toContain(`"operationId":"${id}"`);
    }
  });
});
