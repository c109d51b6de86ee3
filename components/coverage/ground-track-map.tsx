// Ground-track map: equirectangular, the earth's land from Natural Earth (world-atlas, public
// domain) or a plain grid for other bodies, the first day's track and each station's circle of
// visibility. SVG with a text alternative.
import { geoCircle, geoEquirectangular, geoGraticule10, geoPath } from "d3-geo";
import type { Feature, FeatureCollection, Geometry } from "geojson";
import { feature } from "topojson-client";
import type { GeometryCollection, Topology } from "topojson-specification";
import land110 from "world-atlas/land-110m.json";
import type { ContactPicture } from "@/lib/orbit";

const W = 720;
const H = 360;
const projection = geoEquirectangular()
  .scale(W / (2 * Math.PI))
  .translate([W / 2, H / 2]);
const path = geoPath(projection);

let landPath: string | null = null;
function earthLand(): string {
  if (landPath === null) {
    const topo = land110 as unknown as Topology<{ land: GeometryCollection }>;
    landPath = path(feature(topo, topo.objects.land) as FeatureCollection<Geometry> | Feature<Geometry>) ?? "";
  }
  return landPath;
}

const gridPath = () => path(geoGraticule10()) ?? "";

const deg = (v: number, pos: string, neg: string) => `${Math.abs(v).toFixed(1)}° ${v < 0 ? neg : pos}`;

export function GroundTrackMap({ picture, title }: { picture: ContactPicture; title: string }) {
  const track = path({ type: "LineString", coordinates: picture.track.map((p) => [p.lon, p.lat]) }) ?? "";
  const isEarth = picture.body === "earth";
  const titleId = `gtm-${title.replace(/[^a-z0-9]/gi, "-")}-title`;
  const descId = `${titleId}-desc`;
  const stationText = picture.stations
    .map(
      (s) =>
        `${s.name} at ${deg(s.latitude, "N", "S")}, ${deg(s.longitude, "E", "W")}, seeing the spacecraft within ${s.coverageRadius.toFixed(1)}° of arc above ${s.minimumElevation}° elevation`,
    )
    .join("; ");
  const lats = picture.track.map((p) => p.lat);
  return (
    <figure className="space-y-1">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-labelledby={`${titleId} ${descId}`}
        className="w-full max-w-3xl rounded-chip border border-ink-200 bg-white"
      >
        <title id={titleId}>{title}</title>
        <desc id={descId}>
          {`Equirectangular map of ${picture.body}${isEarth ? " with its land masses" : " on a latitude and longitude grid"}. ` +
            `The ground track of the first 24 hours runs between ${Math.min(...lats).toFixed(1)}° and ${Math.max(...lats).toFixed(1)}° latitude. ` +
            `Stations: ${stationText || "none"}.`}
        </desc>
        <rect x={0} y={0} width={W} height={H} fill="#f4f7fb" />
        <path d={gridPath()} fill="none" stroke="#c9d3e0" strokeWidth={0.5} />
        {isEarth ? <path d={earthLand()} fill="#dfe6d8" stroke="#9aa88f" strokeWidth={0.5} /> : null}
        <path d={track} fill="none" stroke="#2463a6" strokeWidth={1.2} />
        {picture.stations.map((s) => {
          const circle = path(geoCircle().center([s.longitude, s.latitude]).radius(Math.max(0.1, s.coverageRadius))()) ?? "";
          const [x, y] = projection([s.longitude, s.latitude]) ?? [0, 0];
          return (
            <g key={s.name}>
              <path d={circle} fill="#e0893a" fillOpacity={0.15} stroke="#b8601a" strokeWidth={1} />
              <circle cx={x} cy={y} r={3} fill="#b8601a" />
              <text x={x + 5} y={y - 5} fontSize={11} fill="#5b3410">
                {s.name}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className="text-xs text-ink-600">
        First 24 hours of the ground track and each station&apos;s circle of visibility at its minimum elevation.{" "}
        {isEarth ? "Land: Natural Earth 1:110m (public domain)." : "Grid every 10°."}
      </figcaption>
    </figure>
  );
}
