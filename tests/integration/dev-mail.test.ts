// The local mail catcher's pages: /api/dev/mail lists each attachment with its name, type,
// size and a download URL, the URL serves the bytes as a download, and /dev/mail links them.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { baseUrl } from "../support/http";
import { mailTransport } from "@/lib/mail/transport";
import { waitForMail } from "../support/mail";

describe("caught mail with attachments", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("lists, links and serves each attachment", async () => {
    const to = `dev-mail-${crypto.randomUUID()}@example.test`;
    const csv = "quantity,value\nperiod,5677\n";
    await mailTransport().sendMail({
      from: "board@example.test",
      to,
      subject: "Decision letter with files",
      text: "See the attached files.",
      attachments: [
        { filename: "decision-letter.pdf", content: Buffer.from("%PDF-1.4\n%%EOF\n", "latin1"), contentType: "application/pdf" },
        { filename: "claims.csv", content: csv, contentType: "text/csv" },
      ],
    });
    const caught = await waitForMail(to, /Decision letter with files/);

    const listed = (await (await fetch(`${baseUrl()}/api/dev/mail`)).json()) as {
      messages: { id: string; attachments: { filename: string; contentType: string; size: number; url: string }[] }[];
    };
    const message = listed.messages.find((m) => m.id === caught.id);
    expect(message?.attachments.map((a) => [a.filename, a.contentType, a.size])).toEqual([
      ["decision-letter.pdf", "application/pdf", 15],
      ["claims.csv", "text/csv", Buffer.byteLength(csv)],
    ]);
    const csvUrl = message!.attachments[1]!.url;
    expect(csvUrl).toBe(`/api/dev/mail/${caught.id}/attachments/1`);

    const download = await fetch(`${baseUrl()}${csvUrl}`);
    expect(download.status).toBe(200);
    expect(download.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(download.headers.get("content-disposition")).toContain('attachment; filename="claims.csv"');
    expect(await download.text()).toBe(csv);

    expect((await fetch(`${baseUrl()}/api/dev/mail/${caught.id}/attachments/7`)).status).toBe(404);
    expect((await fetch(`${baseUrl()}/api/dev/mail/not-a-message/attachments/0`)).status).toBe(404);

    const page = await (await fetch(`${baseUrl()}/dev/mail`)).text();
    expect(page).toContain(`href="${csvUrl}"`);
    expect(page).toContain(">claims.csv</a>");
  });
});
