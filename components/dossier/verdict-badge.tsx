// The verdict of one orbit check, in words and colour (never colour alone).
export type Verdict = "consistent" | "inconsistent" | "invalid";

const STYLE: Record<Verdict, { text: string; className: string; mark: string }> = {
  consistent: { text: "Consistent", className: "bg-holds-100 text-holds-700 border-holds-500", mark: "✓" },
  inconsistent: { text: "Inconsistent", className: "bg-drift-100 text-drift-700 border-drift-500", mark: "!" },
  invalid: { text: "Cannot be evaluated", className: "bg-void-100 text-void-700 border-void-500", mark: "?" },
};

export function VerdictBadge({ status, id, live, prefix }: { status: Verdict; id?: string; live?: boolean; prefix?: string }) {
  const s = STYLE[status];
  return (
    <span
      id={id}
      role={live ? "status" : undefined}
      aria-live={live ? "polite" : undefined}
      data-verdict={status}
      className={`inline-flex items-center gap-1 rounded-chip border px-2 py-0.5 text-xs font-semibold ${s.className}`}
    >
      <span aria-hidden className="font-mono">
        {s.mark}
      </span>
      {prefix ? `${prefix} ` : ""}
      {s.text}
    </span>
  );
}
