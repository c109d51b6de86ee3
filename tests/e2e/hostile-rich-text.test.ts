// Issue 17, finding 7: a standing corpus of hostile rich text, saved through the real draft
// path, submitted, and read in Chromium by its author from the board page. No script from the dossier may run
// (a detector function the payloads try to call, dialogs) and the page's own
// Content-Security-Policy must not have to refuse anything (browserSession fails on any
// violation): the sanitizer removes it first.
import { describe, expect, it } from "vitest";
import { saveDraft, submitProposal } from "@/lib/dal/proposals";
import { browserSession } from "../support/browser";
import { asSessionUser, TEST_PASSWORD } from "../support/factories";
import { dossierDoc, makeProposal, orbitBlock } from "../integration/matrix/dossiers";

const pwn = (why: string) => `window.__pwned && window.__pwned('${why}')`;
const text = (t: string, marks?: unknown[]) => ({ type: "text", text: t, ...(marks ? { marks } : {}) });
const para = (...content: unknown[]) => ({ type: "paragraph", content });

/** Hostile nodes, marks and attributes a proposer could send to the draft API. */
const CORPUS = [
  para(text(`<script>${pwn("script-in-text")}</script>`)),
  para(text(`<img src=x onerror="${pwn("img-in-text")}">`)),
  para(text("link", [{ type: "link", attrs: { href: `javascript:${pwn("javascript-href")}` } }])),
  para(text("link", [{ type: "link", attrs: { href: "/\\evil.example/steal" } }])),
  para(text("link", [{ type: "link", attrs: { href: `data:text/html,<script>${pwn("data-href")}</script>` } }])),
  para(text("link", [{ type: "link", attrs: { href: "https://example.org/", onclick: pwn("onclick-attr"), target: "_top" } }])),
  { type: "paragraph", attrs: { style: "background:url(javascript:alert(1))", onmouseover: pwn("para-attr") }, content: [text("styled")] },
  { type: "heading", attrs: { level: `2" onmouseover="${pwn("heading-level")}` }, content: [text("Heading")] },
  { type: "image", attrs: { src: `javascript:${pwn("image-src")}`, alt: `" onerror="${pwn("image-alt")}` } },
  { type: "image", attrs: { src: "https://evil.example/pixel.png", alt: "tracker" } },
  { type: "iframe", attrs: { src: `javascript:${pwn("iframe")}` } },
  { type: "script", content: [text(pwn("script-node"))] },
  { type: "codeBlock", content: [text(`</code></pre><script>${pwn("code-break-out")}</script>`)] },
  para(text(`<svg onload="${pwn("svg")}"></svg>`, [{ type: "bold" }, { type: "evilMark", attrs: { onclick: pwn("unknown-mark") } }])),
  orbitBlock(`<svg onload="${pwn("orbit-label")}">`, { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 5677 } }),
  {
    type: "table",
    content: [{ type: "tableRow", content: [{ type: "tableCell", attrs: { colspan: `1 onclick=${pwn("colspan")}` }, content: [para(text("cell"))] }] }],
  },
];

describe("hostile rich text in a dossier", () => {
  const { as } = browserSession();

  it("renders the submitted corpus for its author without running any of it or tripping the Content-Security-Policy", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc(CORPUS) });
    await submitProposal(proposer, cast.board.id, proposal.id);

    const page = await as(cast.proposer.email, TEST_PASSWORD);
    const pwned: string[] = [];
    const dialogs: string[] = [];
    await page.exposeFunction("__pwned", (why: string) => pwned.push(why));
    page.on("dialog", (dialog) => {
      dialogs.push(dialog.message());
      void dialog.dismiss();
    });
    await page.goto("/boards");
    await page.getByRole("link", { name: cast.board.name }).first().click();
    await page.getByRole("link", { name: proposal.title }).click();
    await page.getByRole("heading", { name: proposal.title }).waitFor();
    await page.getByText("styled").first().waitFor();

    // Hover and click over everything the dossier shows, as a reader would.
    const dossier = page.locator("main");
    for (const handle of await dossier.locator("p, h1, h2, h3, td, img, svg, a[href^='javascript'], a[href^='data']").all()) {
      await handle.hover({ timeout: 2000 }).catch(() => undefined);
    }
    const inDossier = async (selector: string) => dossier.locator(selector).evaluateAll((els) => els.map((e) => e.outerHTML.slice(0, 120)));
    expect(await inDossier("a[href^='javascript'], a[href^='data'], a[href^='/\\\\'], iframe, object, embed, script")).toEqual([]);
    expect(await inDossier("[onerror], [onclick], [onmouseover], [onload], [style*='javascript']")).toEqual([]);
    expect(pwned).toEqual([]);
    expect(dialogs).toEqual([]);
  });
});
