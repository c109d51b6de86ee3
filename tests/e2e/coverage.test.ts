// Ground coverage in a real browser: the chair adds a ground station to the board's list; a
// proposer adds a contact check to the dossier, picks the station, types the orbit key by key
// and sees passes per day and the 24-hour contact timeline, stored with the draft.
import { describe, expect, it } from "vitest";
import type { Locator, Page } from "playwright-core";
import { browserSession, typeInto as typeKeys } from "../support/browser";
import { asSessionUser } from "../support/factories";
import { createProposal, getDraft, saveDraft, submitProposal } from "@/lib/dal/proposals";
import { assignReviewers } from "@/lib/dal/assignments";
import { createStation } from "@/lib/dal/stations";
import { listStations } from "@/lib/dal/stations";
import { listRequirements } from "@/lib/dal/requirements";
import { dossierDoc, makeCall, makeProposal, orbitBlock } from "../integration/matrix/dossiers";
import { createBoardWithCast } from "../support/factories";

// Types key by key and fails if the field did not keep the text (tests/support/browser.ts).
async function typeInto(_page: Page, field: Locator, text: string) {
  await typeKeys(field, text);
}

describe("ground stations and contact checks in the browser", () => {
  const { as } = browserSession();

  it("chair adds a station; proposer picks it in a contact check and sees passes per day and the timeline", async () => {
    const { cast, proposal } = await makeProposal();
    const stationName = `Tallvik ${crypto.randomUUID().slice(0, 6)}`;

    // The chair, from /boards by links only.
    const chair = await as(cast.chair.email);
    try {
      await chair.goto("/boards");
      await chair.getByRole("link", { name: cast.board.name }).first().click();
      await chair.getByRole("link", { name: "Ground stations" }).click();
      await chair.getByRole("heading", { name: "Ground stations", level: 1 }).waitFor();
      const form = chair.getByRole("form", { name: "Add a ground station" });
      // A bad latitude is refused with a message that says what to give.
      await typeInto(chair, form.getByLabel("Station name"), stationName);
      await typeInto(chair, form.getByLabel("Latitude (°)"), "95");
      await typeInto(chair, form.getByLabel("Longitude (°)"), "147.7° W");
      await typeInto(chair, form.getByLabel("Height above sea level"), "210 m");
      await typeInto(chair, form.getByLabel("Minimum elevation (°)"), "10");
      await form.getByRole("button", { name: "Add station" }).click();
      await form.getByText("latitude must lie between −90° (south) and 90° (north)").waitFor();
      // The typed values stay; the chair fixes only the latitude.
      expect(await form.getByLabel("Station name").inputValue()).toBe(stationName);
      await form.getByLabel("Latitude (°)").click();
      await chair.keyboard.press("Control+A");
      await chair.keyboard.type("64.8° N");
      await form.getByRole("button", { name: "Add station" }).click();
      await chair.getByRole("rowheader", { name: stationName }).waitFor();
      await chair.getByRole("cell", { name: "147.700° W" }).first().waitFor();
      const stored = await listStations(asSessionUser(cast.chair), cast.board.id);
      expect(stored.stations).toEqual([expect.objectContaining({ name: stationName, latitude: 64.8, longitude: -147.7, minimumElevation: 10 })]);
      expect(stored.stations[0]!.altitude).toBeCloseTo(0.21, 9);
      await chair.goBack();
      await chair.getByRole("link", { name: "Ground stations" }).waitFor();
    } finally {
      await chair.close();
    }

    // The proposer, from /boards to the proposal by links.
    const page = await as(cast.proposer.email);
    try {
      await page.goto("/boards");
      await page.getByRole("link", { name: cast.board.name }).first().click();
      await page.getByRole("link", { name: proposal.title }).first().click();
      const editor = page.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      await editor.click();
      await page.keyboard.press("Control+End");
      await page.keyboard.type("Our downlink station sees the spacecraft about seven times a day.");
      await page.getByRole("button", { name: "Insert orbit check" }).click();
      const block = page.locator("[data-orbit-check-block]").first();
      await block.waitFor();
      await typeInto(page, block.getByLabel("Name in the text"), "downlink contact");
      await block.getByLabel("Kind").selectOption("contactTime");
      await typeInto(page, block.getByLabel("Altitude h (km)", { exact: true }), "550");
      await typeInto(page, block.getByLabel("Inclination i (deg)", { exact: true }), "97.6");
      await block.getByRole("checkbox", { name: new RegExp(stationName) }).check();
      const figures = block.getByLabel("Contact figures of downlink contact");
      await figures.getByText(/on average \(\d+ to \d+\)/).waitFor();
      const passes = Number((await figures.getByText(/on average \(\d+ to \d+\)/).innerText()).split(" ")[0]);
      expect(passes).toBeGreaterThan(5);
      expect(passes).toBeLessThan(9);
      const timeline = block.getByRole("img", { name: /Contact timeline of downlink contact/ });
      await timeline.waitFor();
      expect(await timeline.locator("rect title").count()).toBeGreaterThan(20); // about seven contacts a day for 7 days
      await block.getByRole("img", { name: /Ground track of downlink contact/ }).waitFor();
      await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
      // Stored with the station's values copied into the claim, and shown again after a reload.
      const draft = JSON.stringify((await getDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id)).document);
      expect(draft).toContain(stationName);
      expect(draft).toContain('"kind":"contactTime"');
      await page.reload();
      const again = page.locator("[data-orbit-check-block]").first();
      await again.getByRole("img", { name: /Contact timeline of downlink contact/ }).waitFor();
      expect(await again.getByRole("checkbox", { name: new RegExp(stationName) }).isChecked()).toBe(true);
    } finally {
      await page.close();
    }
  });

  it("proposer takes a board station's minimum elevation into a link budget, and typing another drops the station", async () => {
    const { cast, proposal } = await makeProposal();
    const stationName = `Brekka ${crypto.randomUUID().slice(0, 6)}`;
    await createStation(asSessionUser(cast.chair), cast.board.id, { name: stationName, latitude: 61.2, longitude: 5.4, altitude: 0.1, minimumElevation: 7.5 });
    const page = await as(cast.proposer.email);
    try {
      await page.goto("/boards");
      await page.getByRole("link", { name: cast.board.name }).first().click();
      await page.getByRole("link", { name: proposal.title }).first().click();
      const editor = page.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      await editor.click();
      await page.keyboard.press("Control+End");
      await page.keyboard.type("The X-band downlink is sized at the station's mask.");
      await page.getByRole("button", { name: "Insert orbit check" }).click();
      const block = page.locator("[data-orbit-check-block]").first();
      await block.waitFor();
      await typeInto(page, block.getByLabel("Name in the text"), "X-band downlink");
      await block.getByLabel("Kind").selectOption("linkBudget");
      await typeInto(page, block.getByLabel("Carrier frequency f (GHz)"), "8.2");
      await typeInto(page, block.getByLabel("Transmit power P_t (W)"), "10");
      await typeInto(page, block.getByLabel("Transmit antenna gain G_t (dBi)"), "10");
      await typeInto(page, block.getByLabel("Receive figure of merit G/T (dB/K)"), "24");
      await typeInto(page, block.getByLabel("Data rate R (bit/s)"), "150000000");
      await typeInto(page, block.getByLabel("Required Eb/N0 (dB)"), "4.4");
      await typeInto(page, block.getByLabel("Altitude h (km)", { exact: true }), "800");
      // The board's station, chosen from the list: its minimum elevation fills the field.
      const pick = block.getByLabel("Minimum elevation of a board station");
      await pick.selectOption(stationName);
      const elevation = block.getByLabel("Minimum elevation ε_min (deg)");
      await expect.poll(() => elevation.inputValue()).toBe("7.5");
      expect(await pick.inputValue()).toBe(stationName);
      // The link is recomputed at that station's mask.
      await block.getByText("All recomputed values").click();
      const recomputed = block.locator("details dl");
      await recomputed.getByText(/^Slant range d \(km\)$/).waitFor();
      await expect
        .poll(async () => JSON.stringify((await getDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id)).document), { timeout: 20_000 })
        .toContain(`"station":"${stationName}"`);
      expect(JSON.stringify((await getDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id)).document)).toContain('"minimumElevation":7.5');
      // Typing another elevation makes it the proposer's own: the station's name goes.
      await typeInto(page, elevation, "6");
      expect(await pick.inputValue()).toBe("");
      const draftText = async () => JSON.stringify((await getDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id)).document);
      await expect.poll(draftText, { timeout: 20_000 }).toContain('"minimumElevation":6');
      expect(await draftText()).not.toContain(`"station":"${stationName}"`);
    } finally {
      await page.close();
    }
  });

  it("chair requires daily contact; the reviewer sees the dossier's contact check flagged not met", { timeout: 240_000 }, async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const chairUser = asSessionUser(cast.chair);
    const station = await createStation(chairUser, cast.board.id, {
      name: "North site",
      latitude: 64.8,
      longitude: -147.7,
      altitude: 0.2,
      minimumElevation: 10,
    });

    // The chair: board → call → add the requirement, typing 90 minutes a day.
    const chair = await as(cast.chair.email);
    try {
      await chair.goto("/boards");
      await chair.getByRole("link", { name: cast.board.name }).first().click();
      await chair.getByRole("link", { name: call.title }).first().click();
      await chair.getByRole("heading", { name: "Add a requirement" }).waitFor();
      await chair.getByRole("combobox", { name: /^Requirement/ }).selectOption("minDailyContact");
      await chair.getByLabel("Least contact in any one day (min)").click();
      await chair.keyboard.type("90");
      // The board's stations are offered as checkboxes named by the station; the chair ticks one by clicking it.
      const stationsGroup = chair.getByRole("group", { name: "Stations that may be counted (optional)" });
      const northSite = stationsGroup.getByRole("checkbox", { name: "North site" });
      expect(await northSite.isChecked()).toBe(false);
      await northSite.click();
      expect(await northSite.isChecked()).toBe(true);
      await chair.getByRole("button", { name: "Add requirement" }).click();
      await chair.getByText("Added: Contact at least 90 min every day at North site.").waitFor();
      // Listed on the call with the station named, and stored as the API takes it.
      await chair
        .getByRole("list", { name: "Requirements of this call" })
        .getByText("Contact at least 90 min every day at North site", { exact: true })
        .waitFor();
      const stored = await listRequirements(chairUser, cast.board.id, call.id);
      expect(stored).toEqual([expect.objectContaining({ type: "minDailyContact", params: { minimumPerDay: 5400, stations: ["North site"] } })]);
      // The form is cleared for the next requirement.
      expect(await northSite.isChecked()).toBe(false);
    } finally {
      await chair.close();
    }

    // A dossier whose contact check gives about 41 minutes a day at that station, submitted and assigned.
    const proposer = asSessionUser(cast.proposer);
    const proposal = await createProposal(proposer, cast.board.id, {
      title: "Petrel downlink demonstrator",
      missionType: "science",
      callId: call.id,
      coauthorIds: [],
    });
    const stationValues = {
      name: station.name,
      latitude: station.latitude,
      longitude: station.longitude,
      altitude: station.altitude,
      minimumElevation: station.minimumElevation,
    };
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Ground segment" }] },
        orbitBlock("downlink contact", { kind: "contactTime", body: "earth", given: { altitude: 550, inclination: 97.6, stations: [stationValues] } }),
      ]),
    });
    await submitProposal(proposer, cast.board.id, proposal.id);
    await assignReviewers(chairUser, cast.board.id, {
      proposalIds: [proposal.id],
      reviewerIds: [cast.reviewer.id],
      dueAt: new Date(Date.now() + 7 * 86_400_000),
      confirmLikelyConflicts: true,
    });

    // The reviewer: board → reviews → the dossier; the contact requirement is flagged.
    const reviewer = await as(cast.reviewer.email);
    try {
      await reviewer.goto("/boards");
      await reviewer.getByRole("link", { name: cast.board.name }).first().click();
      await reviewer.locator(`a[href="/boards/${cast.board.id}/reviews"]`).first().click();
      await reviewer.getByRole("link", { name: "Petrel downlink demonstrator" }).click();
      const checks = reviewer.locator("section[aria-labelledby=checks-heading]");
      await checks.locator('[data-requirement-outcome="notMet"]').waitFor();
      await expect(checks.textContent()).resolves.toMatch(/Requirement not met.*Contact at least 90 min every day at North site/);
      await expect(checks.textContent()).resolves.toMatch(/the day with the least contact has 4\d(\.\d)? min, the call asks at least 90 min/);
      // The contact pictures stand beside the flag, drawn from the recorded claim (SVG with text alternatives).
      const timeline = checks.getByRole("img", { name: /Contact timeline of downlink contact/ });
      await timeline.waitFor();
      expect(await timeline.locator("desc").textContent()).toMatch(/Day 1: \d+ contacts?, \d+ min \d+ s in all/);
      await checks.getByRole("img", { name: /Ground track of downlink contact/ }).waitFor();
      await expect(checks.getByLabel("Contact figures of downlink contact").textContent()).resolves.toMatch(/Passes per day\d+\.\d\d on average/);
    } finally {
      await reviewer.close();
    }

    // The chair: board → the call → version 1 (read-only) → the proposal, and Back.
    const chairAgain = await as(cast.chair.email);
    try {
      await chairAgain.goto("/boards");
      await chairAgain.getByRole("link", { name: cast.board.name }).first().click();
      await chairAgain.getByRole("link", { name: call.title }).first().click();
      await chairAgain.getByRole("link", { name: "Petrel downlink demonstrator: version 1" }).click();
      await chairAgain.getByRole("heading", { name: /Petrel downlink demonstrator: version 1/ }).waitFor();
      const map = chairAgain.getByRole("img", { name: /Ground track of downlink contact/ });
      await map.waitFor();
      expect(await map.locator("desc").textContent()).toMatch(/Stations: North site at 64\.8° N, 147\.7° W/);
      await chairAgain.getByRole("img", { name: /Contact timeline of downlink contact/ }).waitFor();
      await chairAgain.getByRole("link", { name: "back to the proposal" }).click();
      await chairAgain.getByRole("link", { name: "Version 1", exact: true }).waitFor();
      await chairAgain.getByRole("img", { name: /Contact timeline of downlink contact/ }).waitFor();
      // The decision page lists the checks compactly; the contact pictures open on request.
      await chairAgain.getByRole("link", { name: "Write the decision" }).click();
      const decisionCheck = chairAgain.locator("[data-decision-check]").filter({ hasText: "downlink contact" });
      await decisionCheck.getByText("Contact pictures of downlink contact").click();
      await decisionCheck.getByRole("img", { name: /Contact timeline of downlink contact/ }).waitFor();
      await chairAgain.goBack();
      await chairAgain.getByRole("link", { name: "Version 1", exact: true }).waitFor();
      await chairAgain.goBack();
      await chairAgain.getByRole("heading", { name: /Petrel downlink demonstrator: version 1/ }).waitFor();
      await chairAgain.getByRole("img", { name: /Ground track of downlink contact/ }).waitFor();
    } finally {
      await chairAgain.close();
    }
  });
});
