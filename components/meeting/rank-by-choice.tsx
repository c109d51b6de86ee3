"use client";
// The chair's choice of the figure the call overview ranks by; both columns stay visible.
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { callApi } from "@/components/review/api";
import { FormNotice } from "@/components/ui/form-controls";

export function RankByChoice({ boardId, callId, rankBy }: { boardId: string; callId: string; rankBy: "raw" | "calibrated" }) {
  const router = useRouter();
  const [value, setValue] = useState(rankBy);
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const choose = (next: "raw" | "calibrated") => {
    setValue(next);
    setError(null);
    startTransition(async () => {
      const answer = await callApi(`/api/v1/boards/${boardId}/calls/${callId}/rank-by`, { method: "PUT", body: { rankBy: next } });
      if (answer.ok) router.refresh();
      else {
        setValue(rankBy);
        setError(answer.error);
      }
    });
  };
  return (
    <fieldset className="flex flex-wrap items-center gap-4 text-sm" aria-busy={pending}>
      <legend className="mb-1 font-semibold">Rank proposals by</legend>
      {(
        [
          ["raw", "Raw means"],
          ["calibrated", "Calibrated means"],
        ] as const
      ).map(([key, label]) => (
        <label key={key} className="flex items-center gap-2">
          <input
            type="radio"
            name="rank-by"
            value={key}
            checked={value === key}
            disabled={pending}
            onChange={() => choose(key)}
            className="accent-trajectory-600"
          />
          {label}
        </label>
      ))}
      {error ? <FormNotice tone="error">{error}</FormNotice> : null}
    </fieldset>
  );
}
