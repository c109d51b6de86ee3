"use client";
// A value as the proposer writes it: the text kept as typed, a unit choice beside it
// (s, min, h, day; km, m; km/s, m/s; deg, rad), the converted value in the contract's unit
// with the written precision scaled alike, and what is wrong said on the field itself.
import { useId, useState } from "react";
import { evaluateClaim } from "@/lib/orbit";
import { bodyLabel, displayUnit, quantityLabel, quantityName } from "@/lib/orbit/labels";
import { convertWritten, formatConverted, unitChoices, type ConvertedValue, type WrittenValue } from "@/lib/dossier/units";

/** The written form of a stored value: blocks saved before units were offered hold numbers. */
export function initialWritten(written: WrittenValue | undefined, stored: unknown, contractUnit: string): WrittenValue {
  if (written) return written;
  if (typeof stored === "number" || typeof stored === "string") return { text: String(stored), unit: contractUnit };
  return { text: "", unit: contractUnit };
}

const soiCache = new Map<string, number | null>();

/** Radius of the body's sphere of influence, km (null for the sun or when unknown). */
export function sphereOfInfluenceKm(body: string): number | null {
  if (soiCache.has(body)) return soiCache.get(body)!;
  let radius: number | null = null;
  if (body !== "sun") {
    const r = evaluateClaim({ id: "soi", kind: "sphereOfInfluence", body, given: {} }).computed.radius;
    radius = typeof r === "number" && Number.isFinite(r) ? r : null;
  }
  soiCache.set(body, radius);
  return radius;
}

const DISTANCE = /(^altitude$|Altitude$|Radius$|^semiMajorAxis$)/;

/** A warning when a distance lies beyond the body's sphere of influence. */
export function beyondSphereOfInfluence(name: string, valueKm: number, body: string): string | null {
  if (!DISTANCE.test(name) || !Number.isFinite(valueKm)) return null;
  const soi = sphereOfInfluenceKm(body);
  if (soi === null || Math.abs(valueKm) <= soi) return null;
  return `beyond ${bodyLabel(body)}'s sphere of influence (about ${Math.round(soi).toLocaleString("en-GB")} km): two-body figures about ${bodyLabel(body)} do not hold there; check the value and its unit`;
}

export function WrittenInput({
  name,
  contractUnit,
  written,
  body,
  optional,
  variant = "given",
  onChange,
}: {
  name: string;
  contractUnit: string;
  written: WrittenValue;
  body: string;
  optional?: boolean;
  variant?: "given" | "claimed";
  onChange: (written: WrittenValue | undefined, converted: ConvertedValue | undefined) => void;
}) {
  const id = useId();
  const [text, setText] = useState(written.text);
  const [unit, setUnit] = useState(written.unit || contractUnit);
  // A value copied in from outside (a board station's minimum elevation) replaces what is shown;
  // typing drops the station, and then the field keeps its own text.
  const copied = written.station ? `${written.station}|${written.text}|${written.unit}` : undefined;
  const [seenCopy, setSeenCopy] = useState(copied);
  if (copied !== seenCopy) {
    setSeenCopy(copied);
    if (copied !== undefined) {
      setText(written.text);
      setUnit(written.unit || contractUnit);
    }
  }
  const choices = unitChoices(contractUnit);
  const converted = text.trim() === "" ? null : convertWritten({ text, unit }, contractUnit);
  const error = converted && "error" in converted ? converted.error : null;
  const ok = converted && !("error" in converted) ? converted : null;
  const warning = ok ? beyondSphereOfInfluence(name, ok.value, body) : null;
  const label = `${quantityLabel(name, unit)}${optional ? " (optional)" : ""}`;
  const emit = (t: string, u: string) => {
    if (t.trim() === "") return onChange(undefined, undefined);
    const c = convertWritten({ text: t, unit: u }, contractUnit);
    onChange({ text: t, unit: u }, "error" in c ? undefined : c);
  };
  const describedBy = [error || warning ? `${id}-problem` : null, ok && ok.factor !== 1 ? `${id}-converted` : null].filter(Boolean).join(" ") || undefined;
  const inputName = variant === "claimed" ? `Claimed ${label}` : label;
  return (
    <div className={variant === "given" ? "flex flex-wrap items-start gap-2" : "flex flex-wrap items-start gap-1"}>
      {variant === "given" ? (
        <label htmlFor={id} className="w-52 shrink-0 pt-1 text-xs font-semibold text-ink-700">
          {label}
        </label>
      ) : null}
      <div className="space-y-0.5">
        <span className="flex items-center gap-1">
          <input
            id={id}
            inputMode="decimal"
            value={text}
            aria-label={variant === "claimed" ? inputName : undefined}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            data-quantity={name}
            data-claimed-input={variant === "claimed" ? name : undefined}
            onChange={(e) => {
              setText(e.target.value);
              emit(e.target.value, unit);
            }}
            className="w-28 rounded-chip border border-ink-300 bg-white px-2 py-0.5 font-mono text-sm aria-[invalid=true]:border-void-500"
          />
          {choices.length > 1 ? (
            <select
              aria-label={`Unit of ${variant === "claimed" ? "claimed " : ""}${quantityName(name).toLowerCase()}`}
              value={unit}
              onChange={(e) => {
                setUnit(e.target.value);
                emit(text, e.target.value);
              }}
              className="rounded-chip border border-ink-300 bg-white px-1 py-0.5 text-xs"
            >
              {choices.map((c) => (
                <option key={c.unit} value={c.unit}>
                  {c.unit}
                </option>
              ))}
            </select>
          ) : (
            <span className="text-xs text-ink-500">{displayUnit(contractUnit)}</span>
          )}
        </span>
        {ok && ok.factor !== 1 ? (
          <p id={`${id}-converted`} className="text-2xs text-ink-600" data-converted="">
            = {formatConverted(ok.value, contractUnit)} (precision as written ± {formatConverted(ok.allowance, contractUnit)})
          </p>
        ) : null}
        {error ? (
          <p id={`${id}-problem`} className="text-2xs font-semibold text-void-700" data-field-error="">
            {error}
          </p>
        ) : warning ? (
          <p id={`${id}-problem`} className="text-2xs font-semibold text-drift-700" data-field-warning="">
            Warning: {warning}
          </p>
        ) : null}
      </div>
    </div>
  );
}
