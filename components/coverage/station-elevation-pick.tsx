"use client";
// The link-budget block's station choice: takes the minimum elevation of a station on the
// board's list (kept by the chair), so the worst-case slant range is the one that station
// sees of the given orbit. The value and the station's name are copied into the block; typing
// another elevation afterwards drops the name (the value is then the proposer's own).
import Link from "next/link";
import { useId } from "react";
import { useBoardStations } from "./stations-input";

export function StationElevationPick({
  station,
  onPick,
}: {
  station: string | undefined;
  onPick: (s: { name: string; minimumElevation: number } | null) => void;
}) {
  const id = useId();
  const { boardId, stations, error } = useBoardStations();
  const gone = station !== undefined && stations !== null && !stations.some((s) => s.name === station);
  return (
    <div className="flex flex-wrap items-center gap-2 pl-54" data-station-elevation-pick="">
      <label htmlFor={id} className="text-xs font-semibold text-ink-700">
        Minimum elevation of a board station
      </label>
      <select
        id={id}
        value={station ?? ""}
        disabled={stations === null || (stations.length === 0 && station === undefined)}
        aria-describedby={error || gone || stations?.length === 0 ? `${id}-note` : undefined}
        onChange={(e) => {
          const s = (stations ?? []).find((x) => x.name === e.target.value);
          onPick(s ? { name: s.name, minimumElevation: s.minimumElevation } : null);
        }}
        className="rounded-chip border border-ink-300 bg-white px-2 py-0.5 text-xs"
      >
        <option value="">(none: the elevation typed above)</option>
        {(stations ?? []).map((s) => (
          <option key={s.id} value={s.name}>
            {s.name} ({s.minimumElevation}°)
          </option>
        ))}
        {gone ? <option value={station}>{station} (no longer in the board&apos;s list)</option> : null}
      </select>
      {error ? (
        <p id={`${id}-note`} className="w-full text-2xs text-void-700">
          {error}
        </p>
      ) : gone ? (
        <p id={`${id}-note`} className="w-full text-2xs text-drift-700">
          {station} is no longer in the board&apos;s list; the elevation copied from it stays until you change it.
        </p>
      ) : stations !== null && stations.length === 0 ? (
        <p id={`${id}-note`} className="w-full text-2xs text-ink-600">
          The board has no ground stations yet; its chair adds them under{" "}
          <Link href={`/boards/${boardId}/stations`} className="underline">
            Ground stations
          </Link>
          .
        </p>
      ) : null}
    </div>
  );
}
