// A stored dossier (a submitted version, or a draft for readers who cannot edit), rendered
// on the server from its JSON through the shared sanitizer. With `results`, the server's
// verdict stands beside each orbit-check block (matched by data-block-id).
import { renderDossierHtml, type BlockVerdict } from "@/lib/dossier/render";
import { SCREENING_CAUTION } from "@/lib/orbit";

// The renderer emits plain elements; their look lives here.
const FIGURE_STYLES = [
  "[&_figure.orbit-check]:my-4 [&_figure.orbit-check]:rounded-panel [&_figure.orbit-check]:border [&_figure.orbit-check]:border-ink-200 [&_figure.orbit-check]:bg-white [&_figure.orbit-check]:p-3",
  "[&_figcaption]:mb-2 [&_figcaption]:text-sm [&_.orbit-check-values]:text-sm [&_.orbit-check-values_th]:text-left [&_.orbit-check-values_td]:font-mono",
  "[&_.orbit-check-verdict]:mt-2 [&_.orbit-check-verdict]:rounded-chip [&_.orbit-check-verdict]:border [&_.orbit-check-verdict]:p-2 [&_.orbit-check-verdict]:text-sm",
  "[&_[data-status=consistent]]:border-holds-500 [&_.orbit-check-verdict[data-status=consistent]]:bg-holds-100 [&_.orbit-check-verdict[data-status=consistent]]:text-holds-700",
  "[&_figure[data-status=inconsistent]]:border-drift-500 [&_.orbit-check-verdict[data-status=inconsistent]]:bg-drift-100 [&_.orbit-check-verdict[data-status=inconsistent]]:text-drift-700",
  "[&_figure[data-status=invalid]]:border-void-500 [&_.orbit-check-verdict[data-status=invalid]]:bg-void-100 [&_.orbit-check-verdict[data-status=invalid]]:text-void-700",
  "[&_img]:max-w-full [&_img]:rounded-chip",
].join(" ");

export interface StoredCheckResult {
  blockId: string;
  status: BlockVerdict["status"];
  result: Record<string, unknown>;
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
  const verdicts = results ? Object.fromEntries(results.map((r) => [r.blockId, { ...(r.result as unknown as BlockVerdict), status: r.status }])) : undefined;
  const html = renderDossierHtml(document, { boardId, verdicts, tolerance });
  return (
    <div className={className}>
      <article className={`prose-dossier ${FIGURE_STYLES}`} dangerouslySetInnerHTML={{ __html: html }} />
      {results && results.length > 0 ? <p className="mt-4 text-2xs text-ink-500">{SCREENING_CAUTION}</p> : null}
    </div>
  );
}
