// A small SVG bar chart of reviewers' weighted totals, binned to the rubric's levels.
export function ScoreChart({
  distribution,
  mean,
  scale,
  label,
}: {
  distribution: { level: number; count: number }[];
  mean: number | null;
  scale: { min: number; max: number };
  label: string;
}) {
  const width = 120;
  const height = 36;
  const max = Math.max(1, ...distribution.map((d) => d.count));
  const bar = width / Math.max(1, distribution.length);
  const x = (value: number) => ((value - scale.min + 0.5) / (scale.max - scale.min + 1)) * width;
  const description = distribution.map((d) => `${d.count} at ${d.level}`).join(", ");
  return (
    <svg
      width={width}
      height={height + 12}
      viewBox={`0 0 ${width} ${height + 12}`}
      role="img"
      aria-label={`${label}: ${description}${mean !== null ? `; mean ${mean.toFixed(2)}` : ""}`}
    >
      {distribution.map((d, i) => {
        const h = (d.count / max) * height;
        return <rect key={d.level} x={i * bar + 2} y={height - h} width={bar - 4} height={h} rx={1.5} className="fill-trajectory-400" />;
      })}
      <line x1={0} x2={width} y1={height + 0.5} y2={height + 0.5} className="stroke-ink-300" />
      {mean !== null ? <line x1={x(mean)} x2={x(mean)} y1={0} y2={height} className="stroke-ink-900" strokeWidth={1.5} strokeDasharray="3 2" /> : null}
      {distribution.map((d, i) => (
        <text key={d.level} x={i * bar + bar / 2} y={height + 10} textAnchor="middle" className="fill-ink-500 font-mono" fontSize={8}>
          {d.level}
        </text>
      ))}
    </svg>
  );
}
