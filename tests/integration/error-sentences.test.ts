// API 4xx answers and server-action field errors read as sentences, not as zod's own text.
import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { createBoardWithCast } from "../support/factories";
import { signedIn } from "../support/http";
import { makeCall } from "./matrix/dossiers";

describe("validation errors as sentences", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("says what to change in a refused proposal", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const client = await signedIn(cast.proposer.email);
    const response = await client.request(`/api/v1/boards/${cast.board.id}/proposals`, {
      method: "POST",
      json: { title: "x".repeat(201), callId: call.id, colour: "red" },
    });
    expect(response.status).toBe(422);
    const body = (await response.json()) as { error: string; details: { issues: { path: string; message: string }[] } };
    expect(body.error).toBe('The title can be at most 200 characters. The field "colour" is not expected; leave it out.');
    expect(body.details.issues).toEqual([
      { path: "title", message: "The title can be at most 200 characters." },
      { path: "", message: 'The field "colour" is not expected; leave it out.' },
    ]);
    expect(body.error).not.toMatch(/Too big|expected string|request is not valid/);

    const missing = await client.request(`/api/v1/boards/${cast.board.id}/proposals`, { method: "POST", json: { title: "Lantern", callId: "nope" } });
    expect(missing.status).toBe(422);
    expect(((await missing.json()) as { error: string }).error).toBe("Choose a call.");
  });
});
