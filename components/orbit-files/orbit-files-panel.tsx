"use client";
// The orbit files of a proposal: what the server read from each (epoch, frame, osculating
// elements, altitude range, period, inclination, sun-synchronous check; mean against
// osculating for element sets), "Make a claim from this file", the live comparison of the
// dossier's named orbits with their linked files, and each block's orbit as a CCSDS OPM.
import { useEffect, useMemo, useState } from "react";
import type { OrbitCheckBlock } from "@/lib/dossier/claims";
import { claimFromSummary, type ClaimFromFile } from "@/lib/orbit-files/claim";
import { FILE_QUESTION, compareFilesWithText, type FileComparison, type LinkedFile } from "@/lib/orbit-files/compare";
import { effectiveFileTolerance, fileToleranceSummary, type FileComparisonTolerance } from "@/lib/orbit-files/tolerance";
import type { CovarianceSigmas, OrbitSummary } from "@/lib/orbit-files/summary";

interface OrbitFileItem extends LinkedFile {
  parsedAt: string;
}

const FORMAT_TEXT: Record<string, string> = {
  tle: "Two-line element sets",
  opm: "CCSDS orbit parameter message (OPM)",
  omm: "CCSDS orbit mean-elements message (OMM)",
  oem: "CCSDS orbit ephemeris message (OEM)",
};

const fmt = (x: number, d: number) => (Number.isFinite(x) ? x.toLocaleString("en-GB", { minimumFractionDigits: d, maximumFractionDigits: d }) : "—");
const signed = (x: number, d: number) => `${x >= 0 ? "+" : "−"}${fmt(Math.abs(x), d)}`;

export interface OrbitFilesPanelProps {
  boardId: string;
  proposalId: string;
  /** Attachment ids shown by the page; the panel reloads when they change. */
  attachmentIds: string[];
  /**
   * The dossier's orbit-check blocks (`extractOrbitChecks` of the editor's live document, or
   * of a version's, read on the server): taking blocks rather than the document keeps the
   * sanitizer and Tiptap's schema out of the pages that show this panel without an editor.
   */
  blocks: OrbitCheckBlock[];
  /** The call's bounds for comparing orbit files with the text (its own setting, not the orbit-check policy). */
  fileTolerance?: FileComparisonTolerance;
  /** Where block exports come from: the draft or a submitted version. */
  exportFrom: { draft: true } | { version: number };
  /** Inserts a block made from a file (authors on the draft only). */
  onMakeClaim?: (made: ClaimFromFile) => void;
}

export function OrbitFilesPanel(props: OrbitFilesPanelProps) {
  const { boardId, proposalId } = props;
  const [files, setFiles] = useState<OrbitFileItem[] | null>(null);
  const [caution, setCaution] = useState("");
  const [loadError, setLoadError] = useState<string | null>(null);
  const key = props.attachmentIds.join(",");

  useEffect(() => {
    let stale = false;
    fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/orbit-files`, { headers: { accept: "application/json" } })
      .then(async (r) => {
        const body = (await r.json().catch(() => ({}))) as { orbitFiles?: OrbitFileItem[]; caution?: string; error?: string };
        if (stale) return;
        if (!r.ok || !body.orbitFiles) setLoadError(body.error ?? `The orbit files could not be loaded (${r.status}). Reload the page.`);
        else {
          setFiles(body.orbitFiles);
          setCaution(body.caution ?? "");
          setLoadError(null);
        }
      })
      .catch(() => !stale && setLoadError("The orbit files could not be loaded: the server did not answer. Reload the page."));
    return () => {
      stale = true;
    };
  }, [boardId, proposalId, key]);

  const blocks = props.blocks;
  const comparisons = useMemo(
    () => (files ? compareFilesWithText(blocks, files, effectiveFileTolerance(props.fileTolerance)) : []),
    [blocks, files, props.fileTolerance],
  );
  const exportBase =
    "draft" in props.exportFrom
      ? `/api/v1/boards/${boardId}/proposals/${proposalId}/draft/orbit-checks`
      : `/api/v1/boards/${boardId}/proposals/${proposalId}/versions/${props.exportFrom.version}/orbit-checks`;

  if (loadError) {
    return (
      <section aria-labelledby="orbit-files-heading" className="space-y-2 rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
        <h2 id="orbit-files-heading" className="text-base font-semibold text-ink-900">
          Orbit files
        </h2>
        <p role="alert" className="text-sm text-void-700">
          {loadError}
        </p>
      </section>
    );
  }
  if (!files) return null;
  if (files.length === 0 && blocks.length === 0) return null;

  return (
    <section aria-labelledby="orbit-files-heading" className="space-y-3 rounded-panel border border-ink-200 bg-white p-4 shadow-panel" data-orbit-files="">
      <h2 id="orbit-files-heading" className="text-base font-semibold text-ink-900">
        Orbit files
      </h2>
      {files.length === 0 ? (
        <p className="text-sm text-ink-600">
          No orbit files attached. Attach two-line element sets or CCSDS OPM, OMM or OEM files (KVN or XML) to check them against the text.
        </p>
      ) : null}
      {files.map((f) => (
        <OrbitFileCard key={f.attachmentId} file={f} onMakeClaim={props.onMakeClaim} />
      ))}
      {files.length > 0 ? (
        <p className="text-2xs text-ink-600" data-file-tolerance="">
          {`This call compares orbit files with the text within: ${fileToleranceSummary(effectiveFileTolerance(props.fileTolerance))}.`}
        </p>
      ) : null}
      {comparisons.length > 0 ? <Comparisons comparisons={comparisons} /> : null}
      {blocks.length > 0 ? (
        <div className="space-y-1">
          <h3 className="text-sm font-semibold text-ink-900">Export an orbit as a CCSDS OPM</h3>
          {"draft" in props.exportFrom ? <p className="text-2xs text-ink-600">Exports the last saved draft.</p> : null}
          <ul className="space-y-0.5 text-sm">
            {blocks.map((b, i) => (
              <li key={b.blockId}>
                <a href={`${exportBase}/${b.blockId}/opm`} className="text-trajectory-700 underline" download>
                  {`OPM of ${b.label || `block ${i + 1} (${b.claim.kind})`}`}
                </a>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {caution ? <p className="text-2xs text-ink-600">{caution}</p> : null}
    </section>
  );
}

function OrbitFileCard({ file, onMakeClaim }: { file: OrbitFileItem; onMakeClaim?: (made: ClaimFromFile) => void }) {
  const [claimError, setClaimError] = useState<string | null>(null);
  return (
    <article className="space-y-2 border-t border-ink-100 pt-2" aria-label={`Orbit file ${file.filename}`} data-orbit-file={file.attachmentId}>
      <h3 className="text-sm font-semibold text-ink-900">
        {file.filename}
        <span className="ml-1 font-normal text-ink-600">· {file.format ? FORMAT_TEXT[file.format] : "orbit file"}</span>
      </h3>
      {file.status === "unparsed" ? (
        <p className="rounded-chip border border-void-500/40 bg-void-100 p-2 text-sm text-void-700" data-orbit-file-error="">
          Could not be read: {file.error?.message}. The file stays attached; correct it and attach it again.
        </p>
      ) : (
        file.summaries.slice(0, 5).map((s) => (
          <div key={s.index} className="space-y-1">
            <SummaryList summary={s} />
            {onMakeClaim ? (
              <button
                type="button"
                className="rounded-chip border border-trajectory-600 px-2 py-0.5 text-xs font-semibold text-trajectory-700 hover:bg-trajectory-100"
                onClick={() => {
                  const made = claimFromSummary(file, s);
                  if ("error" in made) setClaimError(`No claim made: ${made.error}.`);
                  else {
                    setClaimError(null);
                    onMakeClaim(made);
                  }
                }}
              >
                Make a claim from this file{file.summaries.length > 1 ? ` (${s.label})` : ""}
              </button>
            ) : null}
          </div>
        ))
      )}
      {file.summaries.length > 5 ? <p className="text-2xs text-ink-600">{`Showing 5 of ${file.summaries.length} orbits in this file.`}</p> : null}
      {claimError ? (
        <p role="alert" className="text-xs text-void-700">
          {claimError}
        </p>
      ) : null}
    </article>
  );
}

function Row({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div className="flex justify-between gap-2">
      <dt className="text-ink-600">{term}</dt>
      <dd className="text-right font-mono text-ink-900">{children}</dd>
    </div>
  );
}

/** "1σ position 18.3, 26.0, 18.0 m; velocity 0.021, 0.013, 0.025 m/s (EME2000, 1996-12-18 12:00:00.331)". */
function sigmaText(c: CovarianceSigmas): string {
  const where = [c.refFrame, c.epoch?.replace("T", " ")].filter(Boolean).join(", ");
  return `1σ position ${c.positionKm.map((x) => fmt(x * 1000, 1)).join(", ")} m; velocity ${c.velocityKmS.map((x) => fmt(x * 1000, 3)).join(", ")} m/s${where ? ` (${where})` : ""}`;
}

function SummaryList({ summary: s }: { summary: OrbitSummary }) {
  const o = s.osculating;
  return (
    <dl className="space-y-0.5 text-xs" aria-label={`Orbit of ${s.label}`}>
      <Row term="Object">{s.label}</Row>
      <Row term="Epoch">{`${s.epoch.replace("T", " ")} ${s.timeSystem}`}</Row>
      {s.epochUtc && s.timeSystem !== "UTC" ? <Row term="Epoch in UTC">{`${s.epochUtc.replace("T", " ")} UTC`}</Row> : null}
      <Row term="Frame, centre">{`${s.frame}, ${s.center}`}</Row>
      {s.planes ? (
        <>
          <Row term="Inclination, RAAN of date (compared)">{`${fmt(s.planes.ofDate.inclinationDeg, 3)}°, ${fmt(s.planes.ofDate.raanDeg, 3)}°`}</Row>
          <Row term="Inclination, RAAN in EME2000">{`${fmt(s.planes.eme2000.inclinationDeg, 3)}°, ${fmt(s.planes.eme2000.raanDeg, 3)}°`}</Row>
        </>
      ) : null}
      {o ? (
        <>
          <Row term="Semi-major axis (osculating)">{`${fmt(o.semiMajorAxisKm, 1)} km`}</Row>
          <Row term="Eccentricity (osculating)">{fmt(o.eccentricity, 5)}</Row>
          <Row term="Inclination (osculating)">{`${fmt(o.inclinationDeg, 3)}°`}</Row>
          <Row term="RAAN, argument of periapsis">{`${fmt(o.raanDeg, 2)}°, ${fmt(o.argPeriapsisDeg, 2)}°`}</Row>
          <Row term="True anomaly">{`${fmt(o.anomalyDeg, 2)}°`}</Row>
        </>
      ) : null}
      {s.compare ? (
        <>
          <Row term={`Altitude range (${s.compare.basis})`}>{`${fmt(s.compare.periapsisAltitudeKm, 1)} – ${fmt(s.compare.apoapsisAltitudeKm, 1)} km`}</Row>
          <Row term={`Period (${s.compare.basis})`}>{`${fmt(s.compare.periodMin, 2)} min`}</Row>
          <Row term={`Inclination (${s.compare.basis})`}>{`${fmt(s.compare.inclinationDeg, 3)}°`}</Row>
        </>
      ) : null}
      {s.sunSynchronous ? (
        <Row term="Sun-synchronous">
          {s.sunSynchronous.sunSynchronous ? "yes" : "no"}
          {` (node drifts ${signed(s.sunSynchronous.nodalRateDegPerDay, 4)}°/day; the mean sun ${fmt(s.sunSynchronous.meanSunRateDegPerDay, 4)}°/day${
            s.sunSynchronous.inclinationForSunSyncDeg !== null ? `; ${fmt(s.sunSynchronous.inclinationForSunSyncDeg, 2)}° would make it so` : ""
          })`}
        </Row>
      ) : null}
      {s.meanVsOsculating ? (
        <Row term="Mean against osculating">
          {`a ${signed(s.meanVsOsculating.semiMajorAxisKm, 1)} km, e ${signed(s.meanVsOsculating.eccentricity, 5)}, i ${signed(s.meanVsOsculating.inclinationDeg, 3)}°`}
        </Row>
      ) : null}
      {s.covariance ? (
        <>
          <Row term={s.covariance.count > 1 ? `Covariance (${s.covariance.count} matrices), first` : "Covariance"}>{sigmaText(s.covariance.first)}</Row>
          {s.covariance.count > 1 ? <Row term="Covariance, last">{sigmaText(s.covariance.last)}</Row> : null}
        </>
      ) : null}
      {s.notes.map((n, i) => (
        <p key={i} className="text-2xs text-ink-600">
          {n}
        </p>
      ))}
    </dl>
  );
}

const STATUS_WORDS: Record<FileComparison["status"], string> = { consistent: "agrees", inconsistent: "disagrees", invalid: "cannot be compared" };

function Comparisons({ comparisons }: { comparisons: FileComparison[] }) {
  return (
    <div className="space-y-1" data-file-comparisons="">
      <h3 className="text-sm font-semibold text-ink-900">The files against the text</h3>
      <p className="text-2xs text-ink-600">
        {FILE_QUESTION} Named orbits are compared with the files they were made from, and with files of blocks bearing the same name.
      </p>
      <ul className="space-y-1 text-xs">
        {comparisons.map((c) => (
          <li
            key={`${c.blockId}:${c.attachmentId}`}
            // The target of the flag's link in the version summary (its stored block id is file:<block>:<attachment>).
            id={`orbit-check-file:${c.blockId}:${c.attachmentId ?? "missing"}`}
            data-comparison-status={c.status}
            className="rounded-chip border border-ink-100 p-1.5"
          >
            <p className="font-semibold">{`${c.label || "Unnamed orbit"} against ${c.filename}: ${STATUS_WORDS[c.status]}`}</p>
            <ul className="list-disc pl-4">
              {c.messages.map((m, i) => (
                <li key={i}>{m}</li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
    </div>
  );
}
