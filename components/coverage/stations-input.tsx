"use client";
// Picks ground stations for a contact check from the board's list (kept by the chair). The
// chosen stations' values are copied into the claim, so the dossier stays self-contained.
import Link from "next/link";
import { useParams } from "next/navigation";
import { useEffect, useId, useState } from "react";

export interface BoardStation {
  id: string;
  name: string;
  latitude: number;
  longitude: number;
  altitude: number;
  minimumElevation: number;
}

export interface ClaimStation {
  name: string;
  latitude: number;
  longitude: number;
  altitude?: number;
  minimumElevation: number;
}

const deg = (v: number, pos: string, neg: string) => `${Math.abs(v).toFixed(2)}° ${v < 0 ? neg : pos}`;

/** The board's ground stations (kept by the chair), read once per mount; null while loading. */
export function useBoardStations(): { boardId: string | undefined; stations: BoardStation[] | null; error: string | null } {
  const params = useParams<{ boardId?: string }>();
  const boardId = params?.boardId;
  const [stations, setStations] = useState<BoardStation[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (!boardId) return;
    let live = true;
    fetch(`/api/v1/boards/${boardId}/stations`, { headers: { accept: "application/json" } })
      .then(async (res) => {
        if (!res.ok)
          throw new Error(res.status === 404 ? "this board's stations are not available to you" : `the station list could not be read (${res.status})`);
        return (await res.json()) as { stations: BoardStation[] };
      })
      .then((json) => live && setStations(json.stations))
      .catch((e: unknown) => live && setError(e instanceof Error ? e.message : "the station list could not be read"));
    return () => {
      live = false;
    };
  }, [boardId]);
  return { boardId, stations, error };
}

export function StationsInput({ value, onChange }: { value: unknown; onChange: (v: ClaimStation[] | undefined) => void }) {
  const { boardId, stations: board, error } = useBoardStations();
  const legendId = useId();
  const chosen: ClaimStation[] = Array.isArray(value) ? (value as ClaimStation[]) : [];
  const chosenNames = new Set(chosen.map((s) => s.name));
  const gone = chosen.filter((s) => board !== null && !board.some((b) => b.name === s.name));
  const toggle = (s: BoardStation, on: boolean) => {
    const rest = chosen.filter((c) => c.name !== s.name);
    const next = on
      ? [...rest, { name: s.name, latitude: s.latitude, longitude: s.longitude, altitude: s.altitude, minimumElevation: s.minimumElevation }]
      : rest;
    onChange(next.length > 0 ? next : undefined);
  };
  return (
    <fieldset className="rounded-chip border border-ink-200 p-2" aria-labelledby={legendId}>
      <legend id={legendId} className="px-1 text-xs font-semibold text-ink-700">
        Ground stations (from the board&apos;s list)
      </legend>
      {error ? <p className="text-xs text-void-700">{error}</p> : null}
      {board === null && !error ? <p className="text-xs text-ink-500">Loading the board&apos;s stations…</p> : null}
      {board !== null && board.length === 0 ? (
        <p className="text-xs text-ink-600">
          The board has no ground stations yet; its chair adds them under{" "}
          <Link href={`/boards/${boardId}/stations`} className="underline">
            Ground stations
          </Link>
          .
        </p>
      ) : null}
      <ul className="space-y-1">
        {(board ?? []).map((s) => (
          <li key={s.id}>
            <label className="flex items-center gap-2 text-xs">
              <input type="checkbox" checked={chosenNames.has(s.name)} onChange={(e) => toggle(s, e.target.checked)} />
              <span>
                {s.name} ({deg(s.latitude, "N", "S")}, {deg(s.longitude, "E", "W")}, minimum elevation {s.minimumElevation}°)
              </span>
            </label>
          </li>
        ))}
        {gone.map((s) => (
          <li key={`gone-${s.name}`}>
            <label className="flex items-center gap-2 text-xs">
              <input
                type="checkbox"
                checked
                onChange={() => onChange(chosen.filter((c) => c.name !== s.name).length ? chosen.filter((c) => c.name !== s.name) : undefined)}
              />
              <span>
                {s.name} ({deg(s.latitude, "N", "S")}, {deg(s.longitude, "E", "W")}), no longer in the board&apos;s list
              </span>
            </label>
          </li>
        ))}
      </ul>
    </fieldset>
  );
}
