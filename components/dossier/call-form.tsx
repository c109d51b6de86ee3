"use client";
// Chairs open and change calls: dates (UTC), the tolerance policy the server applies to
// orbit checks, the sections every dossier must have, and reviewers per proposal.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { CharacterCount, TextField, useCharacterCount } from "@/components/ui/form-controls";

export interface CallFormValues {
  id?: string;
  title: string;
  description: string;
  opensAt: string;
  closesAt: string;
  tolerance: { relative: number; absolute?: Record<string, number> };
  /** Bounds for comparing orbit files with the text (km, deg, "1", s). */
  fileTolerance?: { km: number; deg: number; "1": number; s: number };
  requiredSections: string[];
  reviewersPerProposal: number;
}

/** Units whose absolute bound a chair may set, with the contract's default (orbit-check contract version 2). */
const ABSOLUTE_UNITS = [
  { unit: "km", fallback: "1" },
  { unit: "km/s", fallback: "0.001" },
  { unit: "s", fallback: "1" },
  { unit: "deg", fallback: "0.05" },
  { unit: "kg", fallback: "0.1" },
  { unit: "deg/day", fallback: "0.001" },
] as const;

/** Bounds for comparing attached orbit files with the text, typed with their unit (lib/orbit-files/tolerance.ts reads them). */
const FILE_TOLERANCE_FIELDS = [
  { unit: "km", label: "Altitudes", hint: "such as 5 km or 500 m" },
  { unit: "deg", label: "Inclination", hint: "such as 0.1° or 6 arcmin" },
  { unit: "1", label: "Eccentricity", hint: "a plain number such as 0.002" },
  { unit: "s", label: "Period", hint: "such as 60 s or 1 min" },
] as const;

/** The product's defaults (DEFAULT_FILE_TOLERANCE), shown in a new call's form. */
const DEFAULT_FILE_BOUNDS = { km: 5, deg: 0.1, "1": 0.002, s: 60 } as const;

const showFileBound = (unit: string, v: number | undefined) => (v === undefined ? "" : unit === "deg" ? `${v}°` : unit === "1" ? String(v) : `${v} ${unit}`);

const toLocalInput = (iso: string) => (iso ? iso.slice(0, 16) : "");

export function CallForm({ boardId, initial, afterSave }: { boardId: string; initial?: CallFormValues; afterSave?: "list" | "refresh" }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [saving, setSaving] = useState(false);
  const [saved, setSaved] = useState(false);
  const descriptionCount = useCharacterCount(initial?.description);
  const shownFileBound = (unit: (typeof FILE_TOLERANCE_FIELDS)[number]["unit"]) =>
    showFileBound(unit, initial?.fileTolerance?.[unit] ?? DEFAULT_FILE_BOUNDS[unit]);

  const onSubmit = async (event: React.FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const text = (k: string) => String(form.get(k) ?? "").trim();
    const absolute: Record<string, number> = {};
    for (const { unit } of ABSOLUTE_UNITS) {
      const v = text(`abs-${unit}`);
      if (v !== "") absolute[unit] = Number(v);
    }
    const body = {
      title: text("title"),
      description: text("description"),
      opensAt: text("opensAt") ? `${text("opensAt")}:00Z` : "",
      closesAt: text("closesAt") ? `${text("closesAt")}:00Z` : "",
      tolerance: { relative: Number(text("relative")) / 100, ...(Object.keys(absolute).length ? { absolute } : {}) },
      requiredSections: text("requiredSections")
        .split("\n")
        .map((s) => s.trim())
        .filter(Boolean),
      reviewersPerProposal: Number(text("reviewersPerProposal")),
      // Sent only when the chair changed a bound: an untouched call keeps following the product's defaults.
      ...(FILE_TOLERANCE_FIELDS.some((f) => text(`file-${f.unit}`) !== shownFileBound(f.unit))
        ? { fileTolerance: Object.fromEntries(FILE_TOLERANCE_FIELDS.map((f) => [f.unit, text(`file-${f.unit}`)])) }
        : {}),
    };
    setSaving(true);
    setError(null);
    setFieldErrors({});
    setSaved(false);
    try {
      const response = await fetch(initial?.id ? `/api/v1/boards/${boardId}/calls/${initial.id}` : `/api/v1/boards/${boardId}/calls`, {
        method: initial?.id ? "PUT" : "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      });
      const answer = (await response.json().catch(() => ({}))) as {
        error?: string;
        details?: { issues?: { path: string; message: string }[] };
        call?: { id: string };
      };
      if (!response.ok) {
        setError(answer.error ?? `Saving failed (${response.status}).`);
        // Keyed by the first segment ("title") and by the whole path ("tolerance.absolute.km").
        setFieldErrors(
          Object.fromEntries((answer.details?.issues ?? []).flatMap((i) => [[i.path.split(".")[0]!, i.message] as const, [i.path, i.message] as const])),
        );
        return;
      }
      setSaved(true);
      if (afterSave === "list" || !initial?.id) router.push(`/boards/${boardId}/calls/${answer.call!.id}`);
      else router.refresh();
    } finally {
      setSaving(false);
    }
  };

  const abs: Record<string, number | undefined> = initial?.tolerance.absolute ?? {};
  return (
    <form onSubmit={(e) => void onSubmit(e)} className="grid max-w-2xl gap-4" noValidate>
      <TextField name="title" label="Title" defaultValue={initial?.title} required maxLength={200} error={fieldErrors.title} />
      <div>
        <label htmlFor="call-description" className="block text-sm font-semibold text-ink-800">
          Description
        </label>
        <textarea
          id="call-description"
          name="description"
          rows={3}
          defaultValue={initial?.description}
          maxLength={5000}
          aria-describedby="call-description-count"
          onInput={descriptionCount.onInput}
          className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-3 py-2"
        />
        <CharacterCount id="call-description-count" length={descriptionCount.length} max={5000} />
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          name="opensAt"
          type="datetime-local"
          label="Opens (UTC)"
          defaultValue={toLocalInput(initial?.opensAt ?? "")}
          required
          error={fieldErrors.opensAt}
        />
        <TextField
          name="closesAt"
          type="datetime-local"
          label="Closes (UTC)"
          defaultValue={toLocalInput(initial?.closesAt ?? "")}
          required
          error={fieldErrors.closesAt}
        />
      </div>
      <fieldset className="grid gap-3 rounded-panel border border-ink-200 p-3 sm:grid-cols-3" aria-describedby="call-tolerance-rule">
        <legend className="px-1 text-sm font-semibold text-ink-800">Tolerance for orbit checks</legend>
        <p id="call-tolerance-rule" className="text-xs text-ink-600 sm:col-span-3">
          A claimed value passes when its error is within the largest of: the relative bound times the recomputed value, the absolute bound of its unit, and the
          precision it was written with. Angles use the absolute bound in degrees alone. Changes apply to submissions from now on; submitted versions keep their
          record.
        </p>
        <TextField
          name="relative"
          type="number"
          step="any"
          min="0"
          max="49.99"
          label="Relative bound (%)"
          defaultValue={String(Number(((initial?.tolerance.relative ?? 0.001) * 100).toPrecision(6)))}
          hint="default 0.1 %; below 50 %"
          error={fieldErrors["tolerance.relative"] ?? fieldErrors.tolerance}
        />
        {ABSOLUTE_UNITS.map((u) => (
          <TextField
            key={u.unit}
            name={`abs-${u.unit}`}
            type="number"
            step="any"
            min="0"
            label={`Absolute bound, ${u.unit === "deg" ? "angles (deg)" : u.unit}`}
            defaultValue={abs[u.unit] !== undefined ? String(abs[u.unit]) : ""}
            hint={`default ${u.fallback}`}
            error={fieldErrors[`tolerance.absolute.${u.unit}`]}
          />
        ))}
      </fieldset>
      <fieldset className="grid gap-3 rounded-panel border border-ink-200 p-3 sm:grid-cols-2" aria-describedby="call-file-tolerance-rule">
        <legend className="px-1 text-sm font-semibold text-ink-800">Tolerance for orbit files against the text</legend>
        <p id="call-file-tolerance-rule" className="text-xs text-ink-600 sm:col-span-2">
          At submission each named orbit is compared with the orbit files linked to it; a difference larger than these bounds becomes a flag. Type each bound
          with its unit. Changes apply to submissions from now on.
        </p>
        {FILE_TOLERANCE_FIELDS.map((f) => (
          <TextField
            key={f.unit}
            name={`file-${f.unit}`}
            label={`${f.label}, largest difference`}
            defaultValue={shownFileBound(f.unit)}
            hint={f.hint}
            error={fieldErrors[`fileTolerance.${f.unit}`] ?? (f.unit === "km" ? fieldErrors.fileTolerance : undefined)}
          />
        ))}
      </fieldset>
      <div>
        <label htmlFor="call-sections" className="block text-sm font-semibold text-ink-800">
          Required sections (one heading per line)
        </label>
        <textarea
          id="call-sections"
          name="requiredSections"
          rows={4}
          defaultValue={initial?.requiredSections.join("\n")}
          className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-3 py-2 font-mono text-sm"
        />
        {fieldErrors.requiredSections ? <p className="mt-1 text-sm text-void-700">{fieldErrors.requiredSections}</p> : null}
      </div>
      <TextField
        name="reviewersPerProposal"
        type="number"
        min="1"
        max="10"
        label="Reviewers per proposal"
        defaultValue={String(initial?.reviewersPerProposal ?? 2)}
        error={fieldErrors.reviewersPerProposal}
      />
      {error ? (
        <p role="alert" className="rounded-chip bg-void-100 p-2 text-sm text-void-700">
          {error}
        </p>
      ) : null}
      {saved ? (
        <p role="status" className="text-sm text-holds-700">
          Saved.
        </p>
      ) : null}
      <div>
        <button
          type="submit"
          disabled={saving}
          className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-50"
        >
          {saving ? "Saving…" : initial?.id ? "Save call" : "Open call"}
        </button>
      </div>
    </form>
  );
}
