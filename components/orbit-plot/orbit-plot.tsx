// A to-scale drawing of the conic(s) of a claim around its body, from r(θ) = p / (1 + e cos θ)
// (the polar equation of a conic about its focus). Pure SVG with a text alternative; runs
// on the server and in the browser.
import type { ConicPlot, PlotConic } from "@/lib/orbit";

const STROKES = ["#4b52d1", "#d98a1c", "#2f9e6e", "#8c1d3b"];

/** Radius up to which open orbits are drawn: a few periapsis radii, and at least the closed orbits shown. */
function openLimit(plot: ConicPlot): number {
  const closed = plot.conics.filter((c) => c.e < 1 && c.apoapsisRadius !== null).map((c) => c.apoapsisRadius as number);
  const open = plot.conics.filter((c) => c.e >= 1).map((c) => c.periapsisRadius);
  return Math.max(...closed, ...open.map((r) => 4 * r), 3 * plot.bodyRadius, 1);
}

interface Path {
  conic: PlotConic;
  d: string;
  periapsis: [number, number];
  apoapsis: [number, number] | null;
  marker: [number, number] | null;
  extent: number;
}

const DEG = Math.PI / 180;

function pointAt(c: PlotConic, thetaDeg: number): [number, number] | null {
  const theta = thetaDeg * DEG;
  const denom = 1 + c.e * Math.cos(theta);
  if (denom <= 1e-9) return null;
  const r = c.p / denom;
  const angle = theta + c.argPeriapsis * DEG;
  // SVG y grows downwards; flip so the drawing has the usual counter-clockwise sense.
  return [r * Math.cos(angle), -r * Math.sin(angle)];
}

function pathOf(c: PlotConic, limit: number): Path | null {
  if (!(c.p > 0) || !(c.e >= 0) || !Number.isFinite(c.p) || !Number.isFinite(c.e)) return null;
  let from: number;
  let to: number;
  if (c.trueAnomalyRange) {
    [from, to] = c.trueAnomalyRange;
    if (to < from) to += 360;
  } else if (c.e < 1) {
    from = -180;
    to = 180;
  } else {
    // Open orbit: up to where r reaches the drawing limit, r = p / (1 + e cos θ).
    const cosMax = (c.p / limit - 1) / c.e;
    const thetaMax = cosMax <= -1 ? 179 : cosMax >= 1 ? 0 : Math.acos(cosMax) / DEG;
    from = -thetaMax;
    to = thetaMax;
  }
  if (c.e >= 1) {
    const asymptote = Math.acos(-1 / c.e) / DEG - 0.5;
    from = Math.max(from, -asymptote);
    to = Math.min(to, asymptote);
  }
  const steps = 240;
  const points: [number, number][] = [];
  for (let i = 0; i <= steps; i++) {
    const pt = pointAt(c, from + ((to - from) * i) / steps);
    if (pt && Math.hypot(pt[0], pt[1]) <= limit * 1.05) points.push(pt);
  }
  if (points.length < 2) return null;
  const closedLoop = !c.trueAnomalyRange && c.e < 1;
  const d = points.map(([x, y], i) => `${i === 0 ? "M" : "L"}${x.toFixed(2)} ${y.toFixed(2)}`).join(" ") + (closedLoop ? " Z" : "");
  const extent = Math.max(...points.map(([x, y]) => Math.max(Math.abs(x), Math.abs(y))));
  return {
    conic: c,
    d,
    periapsis: pointAt(c, 0)!,
    apoapsis: c.e < 1 ? pointAt(c, 180) : null,
    marker: c.marker !== undefined ? pointAt(c, c.marker) : null,
    extent,
  };
}

const km = (v: number) => `${Math.round(v).toLocaleString("en-GB")} km`;

export function describeConic(c: PlotConic): string {
  const type = c.e < 1e-6 ? "circular" : c.e < 1 ? "elliptic" : c.e === 1 ? "parabolic" : "hyperbolic";
  const parts = [`${c.label}: ${type}, e = ${c.e.toFixed(4)}, periapsis radius ${km(c.periapsisRadius)}`];
  if (c.apoapsisRadius !== null && c.e >= 1e-6) parts.push(`apoapsis radius ${km(c.apoapsisRadius)}`);
  if (c.trueAnomalyRange) parts.push(`arc from ${c.trueAnomalyRange[0].toFixed(1)}° to ${c.trueAnomalyRange[1].toFixed(1)}° true anomaly`);
  return parts.join(", ");
}

export function OrbitPlot({ plot, title, size = 260 }: { plot: ConicPlot; title: string; size?: number }) {
  const limit = openLimit(plot);
  const paths = plot.conics.map((c) => pathOf(c, limit)).filter((p): p is Path => p !== null);
  if (paths.length === 0) {
    return <p className="text-sm text-ink-500">{plot.message ? `No plot: ${plot.message}.` : "No orbit to draw yet."}</p>;
  }
  const extent = Math.max(...paths.map((p) => p.extent), plot.bodyRadius) * 1.12;
  const stroke = extent / 160;
  const dot = extent / 45;
  const description = [`Drawn to scale around a body of radius ${km(plot.bodyRadius)}.`, ...paths.map((p) => describeConic(p.conic) + ".")].join(" ");
  return (
    <figure className="space-y-1">
      <svg
        role="img"
        aria-label={`${title}. ${description}`}
        viewBox={`${-extent} ${-extent} ${2 * extent} ${2 * extent}`}
        width={size}
        height={size}
        className="rounded-panel border border-ink-200 bg-ink-950"
      >
        <title>{title}</title>
        <desc>{description}</desc>
        <circle cx={0} cy={0} r={Math.max(plot.bodyRadius, stroke)} fill="#2c3858" stroke="#8d98ba" strokeWidth={stroke / 2} />
        {paths.map((p, i) => (
          <g key={`${p.conic.label}-${i}`}>
            <path
              d={p.d}
              fill="none"
              stroke={STROKES[i % STROKES.length]}
              strokeWidth={stroke}
              strokeDasharray={p.conic.label.includes("transfer") ? `${stroke * 4} ${stroke * 3}` : undefined}
            />
            <circle cx={p.periapsis[0]} cy={p.periapsis[1]} r={dot} fill={STROKES[i % STROKES.length]}>
              <title>{`${p.conic.label} periapsis`}</title>
            </circle>
            {p.apoapsis && p.conic.e > 1e-6 ? (
              <rect
                x={p.apoapsis[0] - dot}
                y={p.apoapsis[1] - dot}
                width={dot * 2}
                height={dot * 2}
                fill="none"
                stroke={STROKES[i % STROKES.length]}
                strokeWidth={stroke}
              >
                <title>{`${p.conic.label} apoapsis`}</title>
              </rect>
            ) : null}
            {p.marker ? <circle cx={p.marker[0]} cy={p.marker[1]} r={dot * 0.8} fill="#fdfcf8" /> : null}
          </g>
        ))}
      </svg>
      <figcaption className="text-2xs text-ink-600">
        <ul className="space-y-0.5">
          {paths.map((p, i) => (
            <li key={`${p.conic.label}-${i}`} className="flex items-center gap-1.5">
              <span aria-hidden className="inline-block h-0.5 w-4" style={{ background: STROKES[i % STROKES.length] }} />
              {describeConic(p.conic)}
            </li>
          ))}
        </ul>
        <span>Dot: periapsis; square: apoapsis. To scale, body radius {km(plot.bodyRadius)}.</span>
      </figcaption>
    </figure>
  );
}
