"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { deleteStationAction } from "../actions";

export function RemoveStationButton({ boardId, stationId, name }: { boardId: string; stationId: string; name: string }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <span>
      <button
        type="button"
        className="rounded border border-ink-300 px-2 py-1 text-sm text-ink-800 hover:bg-ink-50 focus-visible:outline focus-visible:outline-2 focus-visible:outline-trajectory-600"
        disabled={pending}
        aria-label={`Remove station ${name}`}
        onClick={async () => {
          setPending(true);
          const answer = await deleteStationAction({ boardId, stationId });
          setPending(false);
          if (answer.ok) router.refresh();
          else setError(answer.error);
        }}
      >
        {pending ? "Removing…" : "Remove"}
      </button>
      {error ? (
        <span role="alert" className="ml-2 text-sm text-void-700">
          {error}
        </span>
      ) : null}
    </span>
  );
}
