"use client";
import { useDeferredValue, useMemo, useState } from "react";
import { checkOrbitClaims, SCREENING_CAUTION, type ClaimResult } from "@/lib/orbit";
import { CONSISTENT_MEANS, kindLabel, quantityLabel } from "@/lib/orbit/labels";
import { rowHint } from "@/lib/dossier/verdict-text";

const statusStyle: Record<ClaimResult["status"], string> = {
  consistent: "bg-holds-100 text-holds-700 border-holds-500",
  inconsistent: "bg-drift-100 text-drift-700 border-drift-500",
  invalid: "bg-void-100 text-void-700 border-void-500",
};

const statusWord: Record<ClaimResult["status"], string> = {
  consistent: "holds",
  inconsistent: "off by more than the tolerance",
  invalid: "cannot be evaluated",
};

function formatValue(value: unknown): string {
  if (typeof value === "number") return Number.isInteger(value) ? String(value) : value.toPrecision(7).replace(/\.?0+$/, "");
  if (Array.isArray(value)) return `[${value.map(formatValue).join(", ")}]`;
  return String(value);
}

/** A request editor with live results, for proposers checking their numbers before they submit. */
export function OrbitCheckConsole({ examples }: { examples: { name: string; request: string }[] }) {
  const [text, setText] = useState(examples[0]?.request ?? '{ "claims": [] }');
  const deferred = useDeferredValue(text);
  const outcome = useMemo(() => {
    try {
      return { response: checkOrbitClaims(JSON.parse(deferred)), parseError: null as string | null };
    } catch (error) {
      return { response: null, parseError: (error as Error).message };
    }
  }, [deferred]);

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
      <div className="space-y-2">
        <div className="flex flex-wrap items-end justify-between gap-2">
          <label htmlFor="orbit-check-request" className="text-sm font-semibold">
            Request (JSON)
          </label>
          <label className="text-sm">
            Start from{" "}
            <select
              className="rounded-chip border border-ink-300 bg-white px-2 py-1"
              defaultValue={examples[0]?.name}
              onChange={(event) => setText(examples.find((e) => e.name === event.target.value)?.request ?? text)}
            >
              {examples.map((e) => (
                <option key={e.name} value={e.name}>
                  {e.name}
                </option>
              ))}
            </select>
          </label>
        </div>
        <textarea
          id="orbit-check-request"
          value={text}
          onChange={(event) => setText(event.target.value)}
          spellCheck={false}
          className="h-[36rem] w-full rounded-panel border border-ink-300 bg-white p-3 font-mono text-xs leading-5"
        />
      </div>
      <section aria-live="polite" aria-label="Results" className="space-y-3">
        <p className="rounded-chip border border-drift-500/40 bg-drift-100 px-3 py-2 text-xs text-ink-800">
          {SCREENING_CAUTION} {CONSISTENT_MEANS.replace("the call's tolerance", "the request's tolerance")}
        </p>
        {outcome.parseError ? <p className="text-void-700">The request is not valid JSON: {outcome.parseError}</p> : null}
        {outcome.response?.error ? <p className="text-void-700">{outcome.response.error}</p> : null}
        {outcome.response?.results.map((result) => (
          <article key={result.id} className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
            <header className="flex flex-wrap items-baseline gap-3">
              <h2 className="font-mono text-sm font-semibold">{result.id}</h2>
              <span className="text-sm text-ink-600">
                {kindLabel(result.kind)} <code className="text-xs text-ink-500">{result.kind}</code>
              </span>
              <span className={`ml-auto rounded-chip border px-2 py-0.5 text-xs font-semibold ${statusStyle[result.status]}`}>
                {result.status} — {statusWord[result.status]}
              </span>
            </header>
            {result.messages.length ? (
              <ul className="mt-2 list-disc pl-5 text-sm text-ink-700">
                {result.messages.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            ) : null}
            {result.checks.length ? (
              <table className="mt-3 w-full text-sm">
                <caption className="sr-only">Claimed against recomputed values for {result.id}</caption>
                <thead>
                  <tr className="text-left text-xs text-ink-600 [&>th]:px-2 [&>th]:py-1">
                    <th scope="col">quantity</th>
                    <th scope="col" className="text-right">
                      claimed
                    </th>
                    <th scope="col" className="text-right">
                      recomputed
                    </th>
                    <th scope="col">unit</th>
                    <th scope="col" className="text-right">
                      rel. error
                    </th>
                    <th scope="col">verdict</th>
                  </tr>
                </thead>
                <tbody className="font-mono">
                  {result.checks.map((row) => (
                    <tr key={row.quantity} className="border-t border-ink-100 [&>td]:px-2 [&>td]:py-1">
                      <td className="font-sans">
                        {quantityLabel(row.quantity, "")} <code className="text-2xs text-ink-500">{row.quantity}</code>
                      </td>
                      <td className="text-right">{formatValue(row.claimed)}</td>
                      <td className="text-right">{formatValue(row.computed)}</td>
                      <td className="font-sans text-ink-600">{row.unit}</td>
                      <td className="text-right">{row.relativeError === null ? "—" : `${(row.relativeError * 100).toFixed(2)} %`}</td>
                      <td className={`font-sans ${row.ok ? "text-holds-700" : "text-drift-700"}`}>
                        {row.ok ? "holds" : "off"}
                        {rowHint(row) ? <span className="block text-2xs text-ink-800">Likely slip: {rowHint(row)}</span> : null}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            ) : null}
            <details className="mt-2 text-xs text-ink-600">
              <summary className="cursor-pointer">Everything this kind derives</summary>
              <dl className="mt-2 grid grid-cols-[12rem_1fr] gap-x-3 font-mono">
                {Object.entries(result.computed).map(([key, value]) => (
                  <div key={key} className="contents">
                    <dt className="font-sans">{key}</dt>
                    <dd>{formatValue(value)}</dd>
                  </div>
                ))}
              </dl>
            </details>
          </article>
        ))}
      </section>
    </div>
  );
}
