// A 24-hour contact timeline: one row per day of the span, a bar for each contact (the union
// of the stations' passes). SVG with a text alternative that lists the contacts per day.
import type { ContactPicture } from "@/lib/orbit";

const DAY = 86_400;
const LEFT = 56;
const WIDTH = 720;
const ROW = 16;
const TOP = 22;

const clock = (s: number) => {
  const t = Math.round(s);
  const h = Math.floor(t / 3600) % 24;
  const m = Math.floor((t % 3600) / 60);
  return `${String(h).padStart(2, "0")}:${String(m).padStart(2, "0")}`;
};
const minutes = (s: number) => `${Math.floor(s / 60)} min ${Math.round(s % 60)} s`;

export function ContactTimeline({ picture, title }: { picture: ContactPicture; title: string }) {
  const days = picture.days;
  const rows: { day: number; bars: { from: number; to: number }[] }[] = Array.from({ length: days }, (_, d) => ({ day: d, bars: [] }));
  for (const iv of picture.contact) {
    for (let d = Math.floor(iv.start / DAY); d < days && d * DAY < iv.end; d++) {
      rows[d]!.bars.push({ from: Math.max(iv.start, d * DAY) - d * DAY, to: Math.min(iv.end, (d + 1) * DAY) - d * DAY });
    }
  }
  const height = TOP + days * ROW + 8;
  const x = (s: number) => LEFT + ((WIDTH - LEFT - 8) * s) / DAY;
  const titleId = `ctl-${title.replace(/[^a-z0-9]/gi, "-")}-title`;
  const descId = `${titleId}-desc`;
  const description = rows
    .map((r) => {
      const total = r.bars.reduce((s, b) => s + b.to - b.from, 0);
      return `Day ${r.day + 1}: ${r.bars.length} contact${r.bars.length === 1 ? "" : "s"}, ${minutes(total)} in all${r.bars.length ? ` (${r.bars.map((b) => `${clock(b.from)} to ${clock(b.to)}`).join(", ")})` : ""}.`;
    })
    .join(" ");
  return (
    <figure className="space-y-1">
      <svg
        viewBox={`0 0 ${WIDTH} ${height}`}
        role="img"
        aria-labelledby={`${titleId} ${descId}`}
        className="w-full max-w-3xl rounded-chip border border-ink-200 bg-white"
      >
        <title id={titleId}>{title}</title>
        <desc id={descId}>{`Hours from time zero, 0 to 24, across; one row per day. ${description}`}</desc>
        {[0, 3, 6, 9, 12, 15, 18, 21, 24].map((h) => (
          <g key={h}>
            <line x1={x(h * 3600)} x2={x(h * 3600)} y1={TOP - 4} y2={height - 8} stroke="#d5dce6" strokeWidth={0.6} />
            <text x={x(h * 3600)} y={TOP - 8} fontSize={10} textAnchor="middle" fill="#4a5568">
              {`${h} h`}
            </text>
          </g>
        ))}
        {rows.map((r) => (
          <g key={r.day}>
            <text x={LEFT - 6} y={TOP + r.day * ROW + 11} fontSize={10} textAnchor="end" fill="#4a5568">
              {`Day ${r.day + 1}`}
            </text>
            <rect x={LEFT} y={TOP + r.day * ROW + 2} width={WIDTH - LEFT - 8} height={ROW - 4} fill="#f4f7fb" />
            {r.bars.map((b, i) => (
              <rect key={i} x={x(b.from)} y={TOP + r.day * ROW + 2} width={Math.max(1, x(b.to) - x(b.from))} height={ROW - 4} fill="#2463a6">
                <title>{`Day ${r.day + 1}, ${clock(b.from)} to ${clock(b.to)} (${minutes(b.to - b.from)})`}</title>
              </rect>
            ))}
          </g>
        ))}
      </svg>
      <figcaption className="text-xs text-ink-600">Contact with any of the stations, hour by hour from time zero (the given state).</figcaption>
    </figure>
  );
}
