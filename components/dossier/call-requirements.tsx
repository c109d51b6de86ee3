"use client";
// The call's requirements: everyone on the board reads them with their rationale; the chair
// adds them from the list of types (with presets) and removes them. Values are typed in the
// units people write (percent, years, minutes); the server checks them again and names the
// field it refuses.
import { useId, useRef, useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { callApi } from "@/components/review/api";
import { REQUIREMENT_TYPES, requirementType } from "@/lib/requirements";

export interface CallRequirementItem {
  id: string;
  type: string;
  summary: string;
  rationale: string;
  params: Record<string, unknown>;
}

function parseNumber(text: string): number | null {
  const t = text.trim().replace(/\s/g, "").replace(",", ".").replace(/%$/, "");
  if (t === "") return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
}

export function CallRequirements({
  boardId,
  callId,
  requirements,
  editable,
  stations = [],
}: {
  boardId: string;
  callId: string;
  requirements: CallRequirementItem[];
  editable: boolean;
  /** Names of the board's ground stations, for requirements that name stations (chairs only). */
  stations?: string[];
}) {
  const router = useRouter();
  const [type, setType] = useState(REQUIREMENT_TYPES[0]!.type);
  const def = requirementType(type)!;
  const [values, setValues] = useState<Record<string, string>>({});
  const [rationale, setRationale] = useState("");
  const [picked, setPicked] = useState<string[]>([]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const statusRef = useRef<HTMLParagraphElement>(null);
  const formId = useId();

  const choosePreset = (index: number) => {
    const preset = def.presets[index];
    if (!preset) return;
    setValues(Object.fromEntries(def.fields.map((f) => [f.name, String(Number(((preset.params[f.name] as number) * f.scale).toPrecision(6)))])));
    setRationale(preset.rationale);
  };

  const add = async (e: React.FormEvent) => {
    e.preventDefault();
    const params: Record<string, unknown> = {};
    const found: Record<string, string> = {};
    for (const f of def.fields) {
      const n = parseNumber(values[f.name] ?? "");
      if (n === null) found[f.name] = `Enter ${f.label.toLowerCase()} as a number in ${f.unit}.`;
      else params[f.name] = n / f.scale;
    }
    // The ticked stations, in the board list's order.
    if (def.stationList && picked.length > 0) params[def.stationList.name] = stations.filter((n) => picked.includes(n));
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    setBusy(true);
    const answer = await callApi<{ requirement: CallRequirementItem }>(`/api/v1/boards/${boardId}/calls/${callId}/requirements`, {
      method: "POST",
      body: { type, params, rationale },
    });
    setBusy(false);
    if (answer.ok) {
      setValues({});
      setRationale("");
      setPicked([]);
      setMessage(`Added: ${answer.data.requirement.summary}.`);
      router.refresh();
    } else {
      const issues = (answer.details as { issues?: { path: string; message: string }[] } | undefined)?.issues ?? [];
      const byField: Record<string, string> = {};
      for (const i of issues) {
        const name = i.path.replace(/^params\./, "");
        const field = def.fields.find((f) => f.name === name);
        if (def.stationList && name.split(".")[0] === def.stationList.name) byField[def.stationList.name] = `${def.stationList.legend}: ${i.message}.`;
        else byField[field ? name : "form"] = field ? `${field.label}: ${i.message}.` : i.message;
      }
      setErrors(byField);
      setMessage(issues.length > 0 ? "Not added: correct the marked values." : answer.error);
    }
    statusRef.current?.focus();
  };

  const remove = async (r: CallRequirementItem) => {
    setBusy(true);
    const answer = await callApi(`/api/v1/boards/${boardId}/calls/${callId}/requirements/${r.id}`, { method: "DELETE" });
    setBusy(false);
    setMessage(answer.ok ? `Removed: ${r.summary}.` : answer.error);
    if (answer.ok) router.refresh();
    statusRef.current?.focus();
  };

  return (
    <div className="space-y-4">
      {requirements.length === 0 ? (
        <p className="text-sm text-ink-600">This call sets no requirements yet: dossiers are checked for agreement only.</p>
      ) : (
        <ul className="divide-y divide-ink-100" aria-label="Requirements of this call">
          {requirements.map((r) => (
            <li key={r.id} className="flex flex-wrap items-start justify-between gap-2 py-2" data-call-requirement={r.type}>
              <div>
                <p className="font-semibold text-ink-900">{r.summary}</p>
                <p className="text-sm text-ink-600">{r.rationale}</p>
              </div>
              {editable ? (
                <button type="button" disabled={busy} onClick={() => void remove(r)} className="rounded-chip border border-ink-300 px-2 py-0.5 text-sm">
                  Remove “{r.summary}”
                </button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      <p ref={statusRef} tabIndex={-1} role="status" className="text-sm text-ink-700">
        {message}
      </p>
      {editable ? (
        <form onSubmit={(e) => void add(e)} aria-labelledby={`${formId}-title`} className="space-y-3 rounded-panel border border-ink-200 p-3">
          <h3 id={`${formId}-title`} className="font-semibold text-ink-900">
            Add a requirement
          </h3>
          <div>
            <label htmlFor={`${formId}-type`} className="block text-sm font-semibold">
              Requirement
            </label>
            <select
              id={`${formId}-type`}
              value={type}
              onChange={(e) => {
                setType(e.target.value);
                setValues({});
                setErrors({});
                setRationale("");
                setPicked([]);
              }}
              className="mt-1 block rounded-chip border border-ink-300 bg-white px-2 py-1"
            >
              {REQUIREMENT_TYPES.map((d) => (
                <option key={d.type} value={d.type}>
                  {d.name}
                </option>
              ))}
            </select>
          </div>
          <p className="text-sm text-ink-600">{def.description}</p>
          {def.presets.length > 0 ? (
            <fieldset className="space-y-1">
              <legend className="text-sm font-semibold">Presets (common practice; the licensing authority decides which rule applies)</legend>
              {def.presets.map((p, i) => (
                <button key={p.label} type="button" onClick={() => choosePreset(i)} className="mr-2 rounded-chip border border-ink-300 px-2 py-0.5 text-sm">
                  Use {p.label}
                </button>
              ))}
            </fieldset>
          ) : null}
          {def.fields.map((f) => (
            <div key={f.name}>
              <label htmlFor={`${formId}-${f.name}`} className="block text-sm font-semibold">
                {f.label} ({f.unit})
              </label>
              <input
                id={`${formId}-${f.name}`}
                inputMode="decimal"
                value={values[f.name] ?? ""}
                aria-invalid={errors[f.name] ? true : undefined}
                aria-describedby={`${formId}-${f.name}-help`}
                onChange={(e) => setValues((v) => ({ ...v, [f.name]: e.target.value }))}
                className="mt-1 block w-32 rounded-chip border border-ink-300 px-2 py-1 font-mono aria-[invalid=true]:border-void-500"
              />
              <p id={`${formId}-${f.name}-help`} className="text-xs text-ink-600">
                {errors[f.name] ? <span className="text-void-700">{errors[f.name]} </span> : null}
                {f.help}
              </p>
            </div>
          ))}
          {def.stationList ? (
            <fieldset aria-describedby={`${formId}-stations-help`} className="space-y-1">
              <legend className="text-sm font-semibold">{def.stationList.legend}</legend>
              {stations.length === 0 ? (
                <p className="text-sm text-ink-600">
                  This board has no ground stations yet, so the requirement counts any station the dossier uses. Add stations on the{" "}
                  <Link href={`/boards/${boardId}/stations`} className="font-semibold text-trajectory-700 hover:underline">
                    Ground stations page
                  </Link>{" "}
                  to name them here.
                </p>
              ) : (
                stations.map((name) => (
                  <label key={name} className="flex items-center gap-2 text-sm">
                    <input
                      type="checkbox"
                      checked={picked.includes(name)}
                      onChange={(e) => setPicked((p) => (e.target.checked ? [...p, name] : p.filter((n) => n !== name)))}
                    />
                    {name}
                  </label>
                ))
              )}
              <p id={`${formId}-stations-help`} className="text-xs text-ink-600">
                {errors[def.stationList.name] ? <span className="text-void-700">{errors[def.stationList.name]} </span> : null}
                {stations.length > 0 ? def.stationList.help : null}
              </p>
            </fieldset>
          ) : null}
          <div>
            <label htmlFor={`${formId}-rationale`} className="block text-sm font-semibold">
              Rationale shown to proposers (optional; the type&apos;s own wording when empty)
            </label>
            <textarea
              id={`${formId}-rationale`}
              value={rationale}
              maxLength={2000}
              rows={2}
              onChange={(e) => setRationale(e.target.value)}
              className="mt-1 block w-full rounded-chip border border-ink-300 px-2 py-1"
            />
          </div>
          {errors.form ? <p className="text-sm text-void-700">{errors.form}</p> : null}
          <button
            type="submit"
            disabled={busy}
            className="rounded-chip bg-trajectory-600 px-3 py-1.5 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-50"
          >
            Add requirement
          </button>
        </form>
      ) : null}
    </div>
  );
}
