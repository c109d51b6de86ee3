"use client";
// The live orbit-check block: kind, body, given and claimed values with their units, the
// engine's recomputation (in the browser, the same lib/orbit the server runs), the verdict
// per quantity and a to-scale plot.
import { useId, useMemo, useRef, useState } from "react";
import { NodeViewWrapper, useEditorState, type ReactNodeViewProps } from "@tiptap/react";
import type { Editor } from "@tiptap/core";
import { BODY_NAMES, ORBIT_CHECK_KINDS, SCREENING_CAUTION, conicForPlot, evaluateClaim, type KindInfo } from "@/lib/orbit";
import { REFERENCEABLE_KINDS, REFERENCING_KINDS, resolveClaim, type OrbitCheckBlock, type ToleranceInput } from "@/lib/dossier/claims";
import type { DossierClaim, WrittenValues } from "@/lib/dossier/schema";
import { bodyLabel, kindLabel, plainQuantities, quantityLabel } from "@/lib/orbit/labels";
import { NOT_A_NUMBER, parseDecimal, type ConvertedValue, type WrittenValue } from "@/lib/dossier/units";
import { WrittenInput, initialWritten } from "./written-input";
import { CheckRowDetail, ConsistentMeaning } from "@/components/dossier/check-explain";
import { formatValue } from "@/lib/dossier/render";
import { OrbitPlot } from "@/components/orbit-plot/orbit-plot";
import { VerdictBadge } from "@/components/dossier/verdict-badge";
import { ContactPictures } from "@/components/coverage/contact-pictures";
import { StationsInput } from "@/components/coverage/stations-input";
import { MassItemsInput, PhasesInput } from "./budget-inputs";
import { useDraftAttachments } from "./attachments-context";
import { sourceNote, sourceOf } from "@/lib/orbit-files/source";

/** All orbit-check blocks of the editor's document, in order. */
export function blocksOf(editor: Editor): OrbitCheckBlock[] {
  const out: OrbitCheckBlock[] = [];
  editor.state.doc.descendants((node) => {
    if (node.type.name === "orbitCheck") {
      out.push({
        blockId: node.attrs.blockId,
        label: node.attrs.label ?? "",
        claim: node.attrs.claim as DossierClaim,
        initialFrom: node.attrs.initialFrom ?? null,
        ...(node.attrs.written ? { written: node.attrs.written as WrittenValues } : {}),
      });
      return false;
    }
    return true;
  });
  return out;
}

const unitText = (unit: string) => (unit === "1" || unit === "" ? "" : unit);
const kindInfo = (kind: string): KindInfo | undefined => ORBIT_CHECK_KINDS.find((k) => k.kind === kind);

function parseNumber(text: string): number | undefined {
  const parsed = parseDecimal(text);
  return parsed.ok ? parsed.value : undefined;
}

function VectorInput({ label, unit, value, onChange }: { label: string; unit: string; value: unknown; onChange: (v: number[] | undefined) => void }) {
  const base = useId();
  const initial = Array.isArray(value) ? value.map((x) => String(x)) : ["", "", ""];
  const [parts, setParts] = useState<string[]>(initial);
  const unreadable = parts.some((p) => p.trim() !== "" && parseNumber(p) === undefined);
  return (
    <fieldset className="flex flex-wrap items-center gap-2">
      <legend className="sr-only">{label}</legend>
      <span className="w-44 shrink-0 text-xs font-semibold text-ink-700" aria-hidden>
        {label}
      </span>
      {["x", "y", "z"].map((axis, i) => (
        <input
          key={axis}
          id={`${base}-${axis}`}
          aria-label={`${label} ${axis}`}
          inputMode="decimal"
          aria-invalid={(parts[i] ?? "").trim() !== "" && parseNumber(parts[i] ?? "") === undefined ? true : undefined}
          aria-describedby={unreadable ? `${base}-problem` : undefined}
          value={parts[i] ?? ""}
          onChange={(e) => {
            const next = [...parts];
            next[i] = e.target.value;
            setParts(next);
            const nums = next.map(parseNumber);
            onChange(nums.every((n) => n !== undefined) ? (nums as number[]) : undefined);
          }}
          className="w-24 rounded-chip border border-ink-300 bg-white px-2 py-1 font-mono text-sm aria-[invalid=true]:border-void-500"
        />
      ))}
      <span className="text-xs text-ink-500">{unit}</span>
      {unreadable ? (
        <p id={`${base}-problem`} className="w-full pl-46 text-2xs font-semibold text-void-700" data-field-error="">
          {NOT_A_NUMBER}
        </p>
      ) : null}
    </fieldset>
  );
}

function ManeuversInput({ value, onChange }: { value: unknown; onChange: (v: { name: string; deltaV: number }[] | undefined) => void }) {
  const id = useId();
  const initial = Array.isArray(value) ? value.map((m) => `${(m as { name?: string }).name ?? ""}: ${(m as { deltaV?: number }).deltaV ?? ""}`).join("\n") : "";
  const [text, setText] = useState(initial);
  // The first line whose Δv cannot be read (1-based), for the message on the field.
  const lines = text.split("\n").map((line) => line.trim());
  const badIndex = lines.findIndex((line) => line !== "" && parseNumber(line.lastIndexOf(":") >= 0 ? line.slice(line.lastIndexOf(":") + 1) : "") === undefined);
  const badLine = badIndex >= 0 ? badIndex + 1 : null;
  return (
    <div className="flex flex-wrap items-start gap-2">
      <label htmlFor={id} className="w-44 shrink-0 text-xs font-semibold text-ink-700">
        Manoeuvres (one per line, name: Δv in km/s)
      </label>
      <textarea
        id={id}
        rows={3}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          const items = e.target.value
            .split("\n")
            .map((line) => line.trim())
            .filter(Boolean)
            .map((line) => {
              const i = line.lastIndexOf(":");
              return { name: (i >= 0 ? line.slice(0, i) : line).trim(), deltaV: parseNumber(i >= 0 ? line.slice(i + 1) : "") };
            });
          onChange(items.every((m) => m.deltaV !== undefined) ? (items as { name: string; deltaV: number }[]) : undefined);
        }}
        aria-invalid={badLine ? true : undefined}
        aria-describedby={badLine ? `${id}-problem` : undefined}
        className="w-72 rounded-chip border border-ink-300 bg-white px-2 py-1 font-mono text-sm aria-[invalid=true]:border-void-500"
      />
      {badLine ? (
        <p id={`${id}-problem`} className="text-2xs font-semibold text-void-700" data-field-error="">
          Line {badLine}: the Δv is {NOT_A_NUMBER}
        </p>
      ) : null}
    </div>
  );
}

function SelectInput({
  label,
  value,
  options,
  onChange,
  optionLabel,
}: {
  label: string;
  value: string;
  options: readonly string[];
  onChange: (v: string) => void;
  optionLabel?: (v: string) => string;
}) {
  const id = useId();
  return (
    <div className="flex items-center gap-2">
      <label htmlFor={id} className="w-44 shrink-0 text-xs font-semibold text-ink-700">
        {label}
      </label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} className="rounded-chip border border-ink-300 bg-white px-2 py-1 text-sm">
        {options.map((o) => (
          <option key={o} value={o}>
            {optionLabel ? optionLabel(o) : o}
          </option>
        ))}
      </select>
    </div>
  );
}

export function OrbitCheckView({ node, updateAttributes, deleteNode, editor, extension, selected }: ReactNodeViewProps) {
  const blockId: string = node.attrs.blockId;
  const label: string = node.attrs.label ?? "";
  const claim = (node.attrs.claim ?? { kind: "orbit", given: {} }) as DossierClaim;
  const initialFrom: string | null = node.attrs.initialFrom ?? null;
  const written = (node.attrs.written ?? {}) as WrittenValues;
  const tolerance = (extension.options as { tolerance?: ToleranceInput }).tolerance;
  const source = sourceOf(node.attrs.source);
  const attachments = useDraftAttachments();
  const fileNote = source ? sourceNote(source, attachments) : null;
  const info = kindInfo(claim.kind) ?? ORBIT_CHECK_KINDS[0]!;
  const headingId = useId();
  const verdictId = useId();
  // Re-render when any block changes: references and the budget depend on the others.
  const blocksJson = useEditorState({ editor, selector: ({ editor: e }) => JSON.stringify(blocksOf(e)) });
  const blocks = useMemo(() => JSON.parse(blocksJson) as OrbitCheckBlock[], [blocksJson]);
  const self: OrbitCheckBlock = { blockId, label, claim, initialFrom, written };
  const { claim: resolved, notes } = resolveClaim(self, blocks.some((b) => b.blockId === blockId) ? blocks : [...blocks, self], tolerance);
  const result = evaluateClaim(resolved, tolerance);
  const plot = conicForPlot(resolved);
  const reference = REFERENCING_KINDS[claim.kind];
  const referenceable = blocks.filter((b) => b.blockId !== blockId && REFERENCEABLE_KINDS.includes(b.claim.kind));
  const bodyName = typeof claim.body === "string" ? claim.body : info.defaultBody;
  const setClaim = (next: Partial<DossierClaim>) => updateAttributes({ claim: { ...claim, ...next } });
  const setGiven = (name: string, v: unknown) => {
    const given = { ...claim.given };
    if (v === undefined) delete given[name];
    else given[name] = v;
    setClaim({ given });
  };
  /** A typed number: the contract value goes into the claim, the text and unit into `written`. */
  const setWritten = (side: "given" | "claimed", name: string, w: WrittenValue | undefined, converted: ConvertedValue | undefined) => {
    const values = { ...(side === "given" ? claim.given : (claim.claimed ?? {})) };
    // What cannot be read is sent as typed, so the server refuses it by name rather than drop it.
    if (w === undefined) delete values[name];
    else if (side === "given") {
      if (converted) values[name] = converted.value;
      else delete values[name];
    } else values[name] = converted ? converted.claimedText : w.text.trim();
    const texts = { ...(written[side] ?? {}) };
    if (w === undefined) delete texts[name];
    else texts[name] = w;
    if (side === "claimed") setPending((p) => (p.includes(name) ? p : [...p, name]));
    updateAttributes({ claim: { ...claim, [side]: values }, written: { ...written, [side]: texts } });
  };
  const claimed = claim.claimed ?? {};
  // Rows added but not filled in yet stay local: an empty claim is not a claim.
  const [pending, setPending] = useState<string[]>([]);
  const [choice, setChoice] = useState("");
  const stash = useRef<Record<string, { claim: DossierClaim; initialFrom: string | null; written: WrittenValues | null }>>({});
  const setClaimed = (name: string, v: number | string | undefined | null) => {
    const next = { ...claimed };
    if (v === undefined || v === null || v === "") delete next[name];
    else next[name] = v;
    setPending((p) => (v === null ? p.filter((n) => n !== name) : p.includes(name) ? p : [...p, name]));
    if (v === null && written.claimed?.[name]) {
      const texts = { ...written.claimed };
      delete texts[name];
      updateAttributes({ claim: { ...claim, claimed: next }, written: { ...written, claimed: texts } });
    } else setClaim({ claimed: next });
  };
  const claimedRows = [...Object.keys(claimed), ...pending.filter((n) => !(n in claimed))];
  const addChoice = () => {
    const name = choice;
    if (!name) return;
    setPending((p) => (p.includes(name) ? p : [...p, name]));
    setChoice("");
    // The new row's input takes the focus once it is rendered.
    requestAnimationFrame(() =>
      document.getElementById(`orbit-check-${blockId}`)?.querySelector<HTMLInputElement>(`input[data-claimed-input="${name}"]`)?.focus(),
    );
  };
  const referenced = reference && initialFrom ? new Set(reference.replaces) : new Set<string>();
  // Tables (decay profile, budget phases) are shown in the rail's charts, not claimed; old names kept as
  // aliases (earthCentralAngle) are not offered, their new name is.
  const unclaimed = info.computed.filter((c) => !claimedRows.includes(c.name) && c.type !== "table" && !c.aliasOf);
  const checks = new Map(result.checks.map((c) => [c.quantity, c]));

  return (
    <NodeViewWrapper
      as="section"
      aria-labelledby={headingId}
      data-orbit-check-block=""
      data-block-id={blockId}
      id={`orbit-check-${blockId}`}
      contentEditable={false}
      className={`my-4 rounded-panel border bg-paper p-4 shadow-panel ${selected ? "border-trajectory-500" : "border-ink-200"}`}
    >
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h3 id={headingId} className="text-sm font-semibold uppercase tracking-wide text-trajectory-700">
          Orbit check{label ? `: ${label}` : ""}
        </h3>
        <div className="flex items-center gap-2">
          <VerdictBadge status={result.status} id={verdictId} live />
          <button
            type="button"
            onClick={() => deleteNode()}
            className="rounded-chip border border-ink-300 px-2 py-0.5 text-xs hover:border-void-500"
            aria-label={`Remove orbit check ${label}`}
          >
            Remove
          </button>
        </div>
      </div>
      {fileNote ? (
        <div className="mb-3 space-y-1 text-xs" data-orbit-check-source={fileNote.state}>
          <p className="text-ink-600">{fileNote.madeFrom}</p>
          {fileNote.problem ? (
            <p role="status" className="rounded-chip border border-drift-500/40 bg-drift-100 px-2 py-1 font-semibold text-drift-700">
              {fileNote.problem}
            </p>
          ) : null}
        </div>
      ) : null}
      <div className="grid gap-4 lg:grid-cols-[1fr_auto]">
        <div className="space-y-2">
          <div className="flex items-center gap-2">
            <label htmlFor={`${headingId}-name`} className="w-44 shrink-0 text-xs font-semibold text-ink-700">
              Name in the text
            </label>
            <input
              id={`${headingId}-name`}
              value={label}
              maxLength={200}
              placeholder="e.g. the parking orbit"
              onChange={(e) => updateAttributes({ label: e.target.value })}
              className="w-64 rounded-chip border border-ink-300 bg-white px-2 py-1 text-sm"
            />
          </div>
          <SelectInput
            label="Kind"
            value={info.kind}
            options={ORBIT_CHECK_KINDS.map((k) => k.kind)}
            optionLabel={kindLabel}
            onChange={(kind) => {
              // Each kind keeps what was typed for it while the block is open, so moving
              // through the kinds with the arrow keys and back loses nothing.
              stash.current[claim.kind] = { claim, initialFrom, written: node.attrs.written ?? null };
              const back = stash.current[kind];
              setPending([]);
              updateAttributes(
                back ?? { claim: { kind, body: kindInfo(kind)?.defaultBody ?? "earth", given: {}, claimed: {} }, initialFrom: null, written: null },
              );
            }}
          />
          <p className="pl-46 text-xs text-ink-500">{plainQuantities(info.summary)}</p>
          <SelectInput label="Central body" value={bodyName} options={BODY_NAMES} optionLabel={bodyLabel} onChange={(body) => setClaim({ body })} />
          {reference ? (
            <div className="flex items-center gap-2">
              <label htmlFor={`${headingId}-from`} className="w-44 shrink-0 text-xs font-semibold text-ink-700">
                Initial orbit from
              </label>
              <select
                id={`${headingId}-from`}
                value={initialFrom ?? ""}
                onChange={(e) => updateAttributes({ initialFrom: e.target.value || null })}
                className="rounded-chip border border-ink-300 bg-white px-2 py-1 text-sm"
              >
                <option value="">(enter it below)</option>
                {referenceable.map((b) => (
                  <option key={b.blockId} value={b.blockId}>
                    {b.label || `unnamed ${kindLabel(b.claim.kind).toLowerCase()} block`}
                  </option>
                ))}
              </select>
            </div>
          ) : null}

          <fieldset className="space-y-1.5 rounded-chip border border-ink-200 p-2">
            <legend className="px-1 text-xs font-semibold text-ink-800">Given ({plainQuantities(info.givenRule)})</legend>
            {info.given
              .filter((g) => !referenced.has(g.name))
              .map((g) => {
                const key = `${info.kind}-${g.name}`;
                if (g.type === "vector")
                  return (
                    <VectorInput key={key} label={quantityLabel(g.name, "")} unit={g.unit} value={claim.given[g.name]} onChange={(v) => setGiven(g.name, v)} />
                  );
                if (g.type === "maneuvers") return <ManeuversInput key={key} value={claim.given[g.name]} onChange={(v) => setGiven(g.name, v)} />;
                if (g.type === "stations") return <StationsInput key={key} value={claim.given[g.name]} onChange={(v) => setGiven(g.name, v)} />;
                if (g.type === "phases") return <PhasesInput key={key} value={claim.given[g.name]} onChange={(v) => setGiven(g.name, v)} />;
                if (g.type === "massItems") return <MassItemsInput key={key} value={claim.given[g.name]} onChange={(v) => setGiven(g.name, v)} />;
                if (g.type === "body")
                  return (
                    <SelectInput
                      key={key}
                      label={quantityLabel(g.name)}
                      value={typeof claim.given[g.name] === "string" ? (claim.given[g.name] as string) : ""}
                      options={["", ...BODY_NAMES]}
                      optionLabel={(v) => (v ? bodyLabel(v) : "choose…")}
                      onChange={(v) => setGiven(g.name, v || undefined)}
                    />
                  );
                if (g.type === "text")
                  return (
                    <SelectInput
                      key={key}
                      label={quantityLabel(g.name)}
                      value={typeof claim.given[g.name] === "string" ? (claim.given[g.name] as string) : g.name === "solarActivity" ? "mean" : "prograde"}
                      options={g.name === "solarActivity" ? ["mean", "low", "high"] : ["prograde", "retrograde"]}
                      onChange={(v) => setGiven(g.name, v)}
                    />
                  );
                return (
                  <WrittenInput
                    key={key}
                    name={g.name}
                    contractUnit={g.unit}
                    optional={g.use === "optional"}
                    body={bodyName}
                    written={initialWritten(written.given?.[g.name], claim.given[g.name], g.unit)}
                    onChange={(w, c) => setWritten("given", g.name, w, c)}
                  />
                );
              })}
            {notes.length > 0 ? <p className="text-xs text-ink-600">{plainQuantities(notes.join("; "))}</p> : null}
          </fieldset>

          <fieldset className="rounded-chip border border-ink-200 p-2">
            <legend className="px-1 text-xs font-semibold text-ink-800">Claimed in the dossier</legend>
            <table className="w-full text-left text-xs">
              <thead className="text-ink-600">
                <tr>
                  <th scope="col" className="py-1">
                    Quantity
                  </th>
                  <th scope="col">Claimed, as written</th>
                  <th scope="col">Recomputed</th>
                  <th scope="col">Check</th>
                  <th scope="col">
                    <span className="sr-only">Remove</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {claimedRows.map((name) => {
                  const unit = info.computed.find((c) => c.name === name)?.unit ?? "";
                  const row = checks.get(name);
                  const computed = result.computed[name];
                  return (
                    <tr key={`${info.kind}-${name}`} className="border-t border-ink-100">
                      <th scope="row" className="py-1 pr-2 font-normal">
                        {quantityLabel(name)}
                      </th>
                      <td className="pr-2">
                        {unit === "" && typeof computed === "string" ? (
                          <input
                            aria-label={`Claimed ${quantityLabel(name)}`}
                            data-claimed-input={name}
                            value={String(claimed[name] ?? "")}
                            onChange={(e) => setClaimed(name, e.target.value)}
                            className="w-28 rounded-chip border border-ink-300 bg-white px-2 py-0.5 font-mono"
                          />
                        ) : (
                          <WrittenInput
                            name={name}
                            contractUnit={unit}
                            variant="claimed"
                            body={bodyName}
                            written={initialWritten(written.claimed?.[name], claimed[name], unit)}
                            onChange={(w, c) => setWritten("claimed", name, w, c)}
                          />
                        )}
                      </td>
                      <td className="pr-2 font-mono">{computed !== undefined ? `${formatValue(computed)} ${unitText(unit)}` : "—"}</td>
                      <td className={`pr-2 ${row ? (row.ok ? "text-holds-700" : "text-drift-700") : "text-ink-500"}`}>
                        {row ? <CheckRowDetail row={row} /> : "—"}
                      </td>
                      <td>
                        <button
                          type="button"
                          onClick={() => setClaimed(name, null)}
                          aria-label={`Remove claimed ${name}`}
                          className="text-ink-500 hover:text-void-700"
                        >
                          ×
                        </button>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
            {unclaimed.length > 0 ? (
              <div className="mt-2 flex items-center gap-2">
                <label htmlFor={`${headingId}-add`} className="text-xs font-semibold text-ink-700">
                  Add a claimed value
                </label>
                {/* Choosing only selects; the button (or Enter) adds the row, so moving through
                    the options with the keyboard adds nothing by accident. */}
                <select
                  id={`${headingId}-add`}
                  value={choice}
                  onChange={(e) => setChoice(e.target.value)}
                  onKeyDown={(e) => {
                    if (e.key === "Enter") {
                      e.preventDefault();
                      addChoice();
                    }
                  }}
                  className="rounded-chip border border-ink-300 bg-white px-2 py-1 text-xs"
                >
                  <option value="">choose a quantity…</option>
                  {unclaimed.map((c) => (
                    <option key={c.name} value={c.name}>
                      {quantityLabel(c.name, c.unit)}
                    </option>
                  ))}
                </select>
                <button
                  type="button"
                  onClick={addChoice}
                  disabled={!choice}
                  className="rounded-chip border border-ink-300 bg-white px-2 py-1 text-xs font-semibold disabled:opacity-50"
                >
                  Add claim
                </button>
              </div>
            ) : null}
          </fieldset>

          <div id={verdictId + "-detail"} className="space-y-1 text-xs">
            {result.messages.map((m, i) => (
              <p key={i} className={result.status === "invalid" ? "text-void-700" : "text-ink-600"}>
                {plainQuantities(m)}
              </p>
            ))}
            <details>
              <summary className="cursor-pointer text-ink-700">All recomputed values</summary>
              <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 font-mono">
                {Object.entries(result.computed).map(([k, v]) => (
                  <div key={k} className="contents">
                    <dt className="font-sans text-ink-600">{quantityLabel(k, info.computed.find((c) => c.name === k)?.unit ?? "")}</dt>
                    <dd>
                      {info.computed.find((c) => c.name === k)?.type === "table" && Array.isArray(v)
                        ? `${v.length} rows (see the rail's chart)`
                        : `${formatValue(v)} ${unitText(info.computed.find((c) => c.name === k)?.unit ?? "")}`}
                    </dd>
                  </div>
                ))}
              </dl>
            </details>
            <ConsistentMeaning tolerance={tolerance} />
            <p className="text-2xs text-ink-500">{SCREENING_CAUTION}</p>
          </div>
        </div>
        <OrbitPlot plot={plot} title={`Plot of ${label || `the ${kindLabel(info.kind).toLowerCase()} claim`}`} />
      </div>
      {claim.kind === "contactTime" ? <ContactPictures claim={resolved} label={label} computed={result.computed} /> : null}
    </NodeViewWrapper>
  );
}
