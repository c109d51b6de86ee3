// A stored dossier (a submitted version, or a draft for readers who cannot edit), rendered
// on the server from its JSON through the shared sanitizer. With `results`, the server's
// verdict stands beside each orbit-check block (matched by data-block-id). Each orbit-check
// block at the top level of the text is drawn with the same to-scale plot the editor shows, and a
// stored contact check with its ground-track map and 24-hour contact timeline.
import { OrbitPlot } from "@/components/orbit-plot/orbit-plot";
import { storedContactPictures } from "@/components/coverage/stored-contact-pictures";
import { extractOrbitChecks, resolveClaim } from "@/lib/dossier/claims";
import { renderDossierHtml, type BlockVerdict } from "@/lib/dossier/render";
import { sanitizeDossier } from "@/lib/dossier/sanitize";
import type { DossierNode } from "@/lib/dossier/schema";
import { SCREENING_CAUTION, conicForPlot } from "@/lib/orbit";

// The renderer emits plain elements; their look lives here.
const FIGURE_STYLES = [
  "[&_figure.orbit-check]:my-4 [&_figure.orbit-check]:rounded-panel [&_figure.orbit-check]:border [&_figure.orbit-check]:border-ink-200 [&_figure.orbit-check]:bg-white [&_figure.orbit-check]:p-3",
  "[&_.orbit-check>figcaption]:mb-2 [&_.orbit-check>figcaption]:text-sm [&_.orbit-check-values]:text-sm [&_.orbit-check-values_th]:text-left [&_.orbit-check-values_td]:font-mono",
  "[&_.orbit-check-verdict]:mt-2 [&_.orbit-check-verdict]:rounded-chip [&_.orbit-check-verdict]:border [&_.orbit-check-verdict]:p-2 [&_.orbit-check-verdict]:text-sm",
  "[&_[data-status=consistent]]:border-holds-500 [&_.orbit-check-verdict[data-status=consistent]]:bg-holds-100 [&_.orbit-check-verdict[data-status=consistent]]:text-holds-700",
  "[&_figure[data-status=inconsistent]]:border-drift-500 [&_.orbit-check-verdict[data-status=inconsistent]]:bg-drift-100 [&_.orbit-check-verdict[data-status=inconsistent]]:text-drift-700",
  "[&_figure[data-status=invalid]]:border-void-500 [&_.orbit-check-verdict[data-status=invalid]]:bg-void-100 [&_.orbit-check-verdict[data-status=invalid]]:text-void-700",
  "[&_.orbit-check-requirements]:mt-2 [&_.orbit-check-requirements]:rounded-chip [&_.orbit-check-requirements]:border [&_.orbit-check-requirements]:border-ink-200 [&_.orbit-check-requirements]:p-2 [&_.orbit-check-requirements]:text-sm",
  "[&_[data-requirement-status=notMet]]:text-void-700 [&_[data-requirement-status=met]]:text-holds-700",
  "[&_img]:max-w-full [&_img]:rounded-chip",
].join(" ");

export interface StoredCheckResult {
  blockId: string;
  status: BlockVerdict["status"];
  result: Record<string, unknown>;
  /** The call's requirements judged on the claim at submission. */
  requirements?: BlockVerdict["requirements"];
  /** With kind and claim, a contactTime result gets its ground-track map and contact timeline. */
  label?: string;
  kind?: string;
  claim?: unknown;
}

export function ReadOnlyDossier({
  document,
  boardId,
  results,
  className,
  tolerance,
}: {
  document: unknown;
  boardId?: string;
  results?: StoredCheckResult[];
  className?: string;
  /** The tolerance policy the verdicts were found under, named beside each. */
  tolerance?: { relative?: number; absolute?: Record<string, number | undefined> };
}) {
  const verdicts = results
    ? Object.fromEntries(results.map((r) => [r.blockId, { ...(r.result as unknown as BlockVerdict), status: r.status, requirements: r.requirements }]))
    : undefined;
  // Contact pictures of stored contactTime results, drawn on the server from the recorded claims.
  const pictures = results
    ? storedContactPictures(results.map((r) => ({ blockId: r.blockId, label: r.label ?? "", kind: r.kind ?? "", claim: r.claim, result: r.result })))
    : {};
  const { doc } = sanitizeDossier(document, { boardId });
  const blocks = extractOrbitChecks(doc);
  // Runs of ordinary blocks as one piece of HTML; each orbit-check block with its plot.
  const pieces: ({ kind: "html"; nodes: DossierNode[] } | { kind: "check"; node: DossierNode })[] = [];
  for (const node of doc.content) {
    if (node.type === "orbitCheck") pieces.push({ kind: "check", node });
    else if (pieces.at(-1)?.kind === "html") (pieces.at(-1) as { nodes: DossierNode[] }).nodes.push(node);
    else pieces.push({ kind: "html", nodes: [node] });
  }
  const html = (nodes: DossierNode[]) => renderDossierHtml({ type: "doc", content: nodes }, { boardId, verdicts, tolerance });
  return (
    <div className={className}>
      <article className={FIGURE_STYLES}>
        {pieces.map((piece, i) => {
          if (piece.kind === "html") return <div key={i} className="prose-dossier" dangerouslySetInnerHTML={{ __html: html(piece.nodes) }} />;
          const block = blocks.find((b) => b.blockId === String(piece.node.attrs?.blockId));
          const plot = block ? conicForPlot(resolveClaim(block, blocks).claim) : null;
          return (
            <div key={i} className="my-4 grid items-start gap-3 md:grid-cols-[minmax(0,1fr)_auto] [&_figure.orbit-check]:my-0" data-orbit-check-with-plot="">
              <div className="prose-dossier" dangerouslySetInnerHTML={{ __html: html([piece.node]) }} />
              {plot && block ? (
                <div className="w-56">
                  <OrbitPlot plot={plot} title={`Plot of ${block.label || `the ${block.claim.kind} claim`}`} size={220} />
                </div>
              ) : null}
              {block && pictures[block.blockId] ? <div className="md:col-span-2">{pictures[block.blockId]}</div> : null}
            </div>
          );
        })}
      </article>
      {results && results.length > 0 ? <p className="mt-4 text-2xs text-ink-500">{SCREENING_CAUTION}</p> : null}
    </div>
  );
}
