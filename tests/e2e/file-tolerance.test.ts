// The call's tolerance for orbit files against the text, in a real browser: the chair types a
// bound with a unit the form refuses and reads what to do, types "1 km" instead and saves; the
// proposer sees the new bound on the call page and in the dossier's orbit files panel, where
// an element set that agreed with the text under the default ±5 km now disagrees.
import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { confirmAttachment, presignAttachmentUpload } from "@/lib/dal/attachments";
import { getOrbitFile } from "@/lib/dal/orbit-files";
import { createProposal, saveDraft } from "@/lib/dal/proposals";
import { tleChecksum } from "@/lib/orbit-files";
import { claimFromSummary } from "@/lib/orbit-files/claim";
import { browserSession, typeInto } from "../support/browser";
import { asSessionUser, createBoardWithCast } from "../support/factories";
import { dossierDoc, makeCall } from "../integration/matrix/dossiers";

/** Invented satellite 99009 "VV-PLOVER": mean altitude about 545.4 km (SGP4 mean elements). */
function ploverTle(): string {
  const l1 = "1 99009U 26008A   26060.50000000  .00000000  00000-0  00000-0 0  999";
  const l2 = "2 99009  97.6000  10.0000 0001000  90.0000   0.0000 15.06000000    1";
  return `VV-PLOVER\n${l1}${tleChecksum(l1)}\n${l2}${tleChecksum(l2)}\n`;
}

describe("file tolerance in the browser", () => {
  const { as } = browserSession();

  it("the chair tightens the altitude bound; the proposer sees it and the file now disagrees with the text", { timeout: 240_000 }, async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const proposer = asSessionUser(cast.proposer);
    const proposal = await createProposal(proposer, cast.board.id, {
      title: "Plover ocean-colour pathfinder",
      missionType: "science",
      callId: call.id,
      coauthorIds: [],
    });
    const body = Buffer.from(ploverTle(), "utf8");
    const presigned = await presignAttachmentUpload(proposer, cast.board.id, proposal.id, {
      filename: "plover.tle",
      contentType: "text/plain",
      size: body.length,
    });
    expect((await fetch(presigned.uploadUrl, { method: "PUT", headers: presigned.headers, body: new Uint8Array(body) })).status).toBe(200);
    const a = await confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
    const made = claimFromSummary(
      { attachmentId: a.id, sha256: a.sha256!, filename: a.filename },
      (await getOrbitFile(proposer, cast.board.id, a.id)).summaries[0]!,
    );
    if ("error" in made) throw new Error(made.error);
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "paragraph", content: [{ type: "text", text: "The science orbit is 548 km sun-synchronous." }] },
        {
          type: "orbitCheck",
          attrs: {
            blockId: crypto.randomUUID(),
            label: "the science orbit",
            claim: { kind: "sunSynchronous", body: "earth", given: { altitude: 548 }, claimed: {} },
            initialFrom: null,
          },
        },
        { type: "orbitCheck", attrs: { blockId: crypto.randomUUID(), label: "the science orbit", claim: made.claim, initialFrom: null, source: made.source } },
      ]),
    });

    // The chair: board → call → the call's settings, typing a bound with a unit the form does not take.
    const chair = await as(cast.chair.email);
    await chair.goto("/boards");
    await chair.getByRole("link", { name: cast.board.name }).click();
    await chair.getByRole("link", { name: call.title }).first().click();
    await expect(chair.locator("[data-call-file-tolerance]").textContent()).resolves.toBe(
      "altitudes ±5 km, inclination ±0.1°, eccentricity ±0.002, period ±60 s",
    );
    const altitudes = chair.getByLabel("Altitudes, largest difference");
    await expect(altitudes.inputValue()).resolves.toBe("5 km");
    await typeInto(altitudes, "1 mile");
    await chair.getByRole("button", { name: "Save call" }).click();
    await chair.getByRole("alert").filter({ hasText: '"mile" is not a unit for altitudes: use km, m.' }).waitFor();
    // The field itself carries the sentence (its accessible description), so a screen reader hears it there.
    const described = (await altitudes.getAttribute("aria-describedby"))!.split(" ");
    const texts = await Promise.all(described.map((id) => chair.locator(`[id="${id}"]`).textContent()));
    expect(texts).toContain('"mile" is not a unit for altitudes: use km, m.');
    // Nothing was saved.
    await expect(chair.locator("[data-call-file-tolerance]").textContent()).resolves.toMatch(/^altitudes ±5 km/);
    await typeInto(altitudes, "1 km");
    await typeInto(chair.getByLabel("Inclination, largest difference"), "3 arcmin");
    await chair.getByRole("button", { name: "Save call" }).click();
    await chair.getByRole("status").filter({ hasText: "Saved." }).waitFor();
    await expect
      .poll(() => chair.locator("[data-call-file-tolerance]").textContent())
      .toBe("altitudes ±1 km, inclination ±0.05°, eccentricity ±0.002, period ±60 s");
    await expect(altitudes.inputValue()).resolves.toBe("1 km");

    // The proposer: board → call page shows the bound; Back → the dossier, where the file now disagrees.
    const author = await as(cast.proposer.email);
    await author.goto("/boards");
    await author.getByRole("link", { name: cast.board.name }).click();
    await author.getByRole("link", { name: call.title }).first().click();
    await expect(author.locator("[data-call-file-tolerance]").textContent()).resolves.toBe(
      "altitudes ±1 km, inclination ±0.05°, eccentricity ±0.002, period ±60 s",
    );
    await author.goBack();
    await author.getByRole("link", { name: "Plover ocean-colour pathfinder" }).click();
    await author.getByRole("textbox", { name: "Dossier text" }).waitFor();
    await expect
      .poll(() => author.locator("[data-file-tolerance]").textContent())
      .toBe("This call compares orbit files with the text within: altitudes ±1 km, inclination ±0.05°, eccentricity ±0.002, period ±60 s.");
    const disagreement = author.locator('[data-comparison-status="inconsistent"]');
    await disagreement.waitFor();
    await expect(disagreement.textContent()).resolves.toMatch(
      /^the science orbit against plover\.tle: disagreesthe attached element set gives 545\.\d km altitude, the text claims 548 km \(the science orbit; tolerance ±1 km\)/,
    );
  });
});
