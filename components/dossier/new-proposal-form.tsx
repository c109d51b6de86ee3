"use client";
// Proposers start a proposal in an open call, with co-authors from the board's proposers.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { SelectField, TextField } from "@/components/ui/form-controls";
import { MISSION_TYPES } from "@/lib/validation/dossier";

export function NewProposalForm({
  boardId,
  calls,
  candidates,
}: {
  boardId: string;
  calls: { id: string; title: string }[];
  candidates: { id: string; name: string; email: string }[];
}) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  if (calls.length === 0) return <p className="text-ink-600">No call is open right now, so no proposal can be started.</p>;

  const onSubmit = async (event: React.FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setSaving(true);
    setError(null);
    try {
      const response = await fetch(`/api/v1/boards/${boardId}/proposals`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({
          title: String(form.get("title") ?? ""),
          missionType: String(form.get("missionType") ?? ""),
          callId: String(form.get("callId") ?? ""),
          coauthorIds: form.getAll("coauthorIds").map(String),
        }),
      });
      const body = (await response.json().catch(() => ({}))) as { error?: string; proposal?: { id: string } };
      if (!response.ok) {
        setError(body.error ?? `The proposal was not created (${response.status}).`);
        return;
      }
      router.push(`/boards/${boardId}/proposals/${body.proposal!.id}`);
    } finally {
      setSaving(false);
    }
  };

  return (
    <form onSubmit={(e) => void onSubmit(e)} className="grid max-w-xl gap-4">
      <TextField name="title" label="Title" required minLength={3} maxLength={200} />
      <SelectField name="missionType" label="Mission type" defaultValue="science">
        {MISSION_TYPES.map((t) => (
          <option key={t} value={t}>
            {t.replace(/-/g, " ")}
          </option>
        ))}
      </SelectField>
      <SelectField name="callId" label="Call" required>
        {calls.map((c) => (
          <option key={c.id} value={c.id}>
            {c.title}
          </option>
        ))}
      </SelectField>
      {candidates.length > 0 ? (
        <fieldset className="space-y-1">
          <legend className="text-sm font-semibold text-ink-800">Co-authors</legend>
          {candidates.map((c) => (
            <label key={c.id} className="flex items-center gap-2 text-sm">
              <input type="checkbox" name="coauthorIds" value={c.id} className="h-4 w-4 accent-trajectory-600" />
              {c.name} <span className="text-ink-500">({c.email})</span>
            </label>
          ))}
        </fieldset>
      ) : null}
      {error ? (
        <p role="alert" className="rounded-chip bg-void-100 p-2 text-sm text-void-700">
          {error}
        </p>
      ) : null}
      <div>
        <button
          type="submit"
          disabled={saving}
          className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-50"
        >
          {saving ? "Creating…" : "Start proposal"}
        </button>
      </div>
    </form>
  );
}
