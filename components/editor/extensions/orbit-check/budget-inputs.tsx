"use client";
// Text inputs for the budget kinds' lists, in the shape people write them: one line per
// entry. Typed text is kept as typed; the parsed value is handed up only when every line
// reads, and the line that does not read is named.
import { useId, useState } from "react";

function parseNumber(text: string): number | undefined {
  const t = text.trim().replace(/\s/g, "").replace(/%$/, "");
  if (t === "") return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : undefined;
}

export interface PhaseValue {
  name: string;
  type: "deterministic" | "statistical";
  margin: number;
  maneuvers: { name: string; deltaV: number; specificImpulse?: number; engine?: "thrusters" }[];
}

function phasesText(value: unknown): string {
  if (!Array.isArray(value)) return "";
  return (value as PhaseValue[])
    .map((p) =>
      [
        `${p.name}, ${p.type}, ${Number(((p.margin ?? 0) * 100).toPrecision(6))} %`,
        ...(p.maneuvers ?? []).map(
          (m) => `- ${m.name}: ${m.deltaV}${m.specificImpulse ? ` @ ${m.specificImpulse} s` : m.engine === "thrusters" ? " thrusters" : ""}`,
        ),
      ].join("\n"),
    )
    .join("\n");
}

/** "Transfer, deterministic, 5 %" then "- raise: 0.1" lines (optional "@ 220 s" or "thrusters"). */
export function parsePhases(text: string): { phases?: PhaseValue[]; error?: string } {
  const phases: PhaseValue[] = [];
  const lines = text.split("\n").map((l) => l.trim());
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!;
    if (!line) continue;
    if (line.startsWith("-")) {
      const current = phases[phases.length - 1];
      if (!current) return { error: `line ${i + 1}: start with a phase line such as "Transfer, deterministic, 5 %"` };
      const body = line.slice(1).trim();
      const colon = body.lastIndexOf(":");
      if (colon < 0) return { error: `line ${i + 1}: write the manoeuvre as "- name: Δv in km/s"` };
      let rest = body.slice(colon + 1).trim();
      const m: PhaseValue["maneuvers"][number] = { name: body.slice(0, colon).trim() || `manoeuvre ${current.maneuvers.length + 1}`, deltaV: 0 };
      if (/\bthrusters$/i.test(rest)) {
        m.engine = "thrusters";
        rest = rest.replace(/\bthrusters$/i, "").trim();
      }
      const at = rest.indexOf("@");
      if (at >= 0) {
        const isp = parseNumber(rest.slice(at + 1).replace(/s$/, ""));
        if (isp === undefined) return { error: `line ${i + 1}: the specific impulse after @ must be a number of seconds` };
        m.specificImpulse = isp;
        rest = rest.slice(0, at);
      }
      const dv = parseNumber(rest.replace(/km\/s$/, ""));
      if (dv === undefined) return { error: `line ${i + 1}: the Δv must be a number in km/s` };
      m.deltaV = dv;
      current.maneuvers.push(m);
    } else {
      const [name, type, margin] = line.split(",").map((p) => p.trim());
      if (type !== "deterministic" && type !== "statistical") return { error: `line ${i + 1}: the phase type must be deterministic or statistical` };
      const pct = margin === undefined || margin === "" ? 0 : parseNumber(margin);
      if (pct === undefined) return { error: `line ${i + 1}: the margin must be a percentage such as 5 %` };
      phases.push({ name: name || `phase ${phases.length + 1}`, type, margin: pct / 100, maneuvers: [] });
    }
  }
  return { phases };
}

export function PhasesInput({ value, onChange }: { value: unknown; onChange: (v: PhaseValue[] | undefined) => void }) {
  const id = useId();
  const [text, setText] = useState(() => phasesText(value));
  const [error, setError] = useState<string | undefined>();
  return (
    <div className="flex items-start gap-2">
      <label htmlFor={id} className="w-44 shrink-0 text-xs font-semibold text-ink-700">
        Phases: a line “name, deterministic or statistical, margin %”, then its manoeuvres “- name: Δv km/s” (optional “@ Isp s” or “thrusters”)
      </label>
      <div>
        <textarea
          id={id}
          rows={5}
          value={text}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${id}-error`}
          onChange={(e) => {
            setText(e.target.value);
            const parsed = parsePhases(e.target.value);
            setError(parsed.error);
            onChange(parsed.error ? undefined : parsed.phases);
          }}
          className="w-72 rounded-chip border border-ink-300 bg-white px-2 py-1 font-mono text-sm aria-[invalid=true]:border-void-500"
        />
        <p id={`${id}-error`} className="text-xs text-void-700">
          {error}
        </p>
      </div>
    </div>
  );
}

const MATURITY: Record<string, "new" | "modified" | "offTheShelf"> = {
  new: "new",
  "new design": "new",
  modified: "modified",
  "off the shelf": "offTheShelf",
  "off-the-shelf": "offTheShelf",
  offtheshelf: "offTheShelf",
};
const MATURITY_TEXT = { new: "new", modified: "modified", offTheShelf: "off the shelf" } as const;

export function MassItemsInput({ value, onChange }: { value: unknown; onChange: (v: { name: string; mass: number; maturity: string }[] | undefined) => void }) {
  const id = useId();
  const [text, setText] = useState(() =>
    Array.isArray(value)
      ? (value as { name: string; mass: number; maturity: keyof typeof MATURITY_TEXT }[])
          .map((it) => `${it.name}, ${MATURITY_TEXT[it.maturity] ?? it.maturity}, ${it.mass}`)
          .join("\n")
      : "",
  );
  const [error, setError] = useState<string | undefined>();
  return (
    <div className="flex items-start gap-2">
      <label htmlFor={id} className="w-44 shrink-0 text-xs font-semibold text-ink-700">
        Items: one per line “name, new / modified / off the shelf, mass kg”
      </label>
      <div>
        <textarea
          id={id}
          rows={4}
          value={text}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${id}-error`}
          onChange={(e) => {
            setText(e.target.value);
            const items: { name: string; mass: number; maturity: string }[] = [];
            let problem: string | undefined;
            e.target.value.split("\n").forEach((raw, i) => {
              const line = raw.trim();
              if (!line || problem) return;
              const parts = line.split(",").map((p) => p.trim());
              const maturity = MATURITY[(parts[1] ?? "").toLowerCase()];
              const mass = parseNumber((parts[2] ?? "").replace(/kg$/, ""));
              if (!maturity) problem = `line ${i + 1}: the maturity must be new, modified or off the shelf`;
              else if (mass === undefined) problem = `line ${i + 1}: the mass must be a number in kg`;
              else items.push({ name: parts[0] || `item ${i + 1}`, maturity, mass });
            });
            setError(problem);
            onChange(problem ? undefined : items);
          }}
          className="w-72 rounded-chip border border-ink-300 bg-white px-2 py-1 font-mono text-sm aria-[invalid=true]:border-void-500"
        />
        <p id={`${id}-error`} className="text-xs text-void-700">
          {error}
        </p>
      </div>
    </div>
  );
}
