"use client";
// Proposers start a proposal in an open call, with co-authors named by their full e-mail
// address (the board's proposers are not listed to other proposers).
import { useState } from "react";
import { useRouter } from "next/navigation";
import { SelectField, TextField } from "@/components/ui/form-controls";
import { MISSION_TYPES } from "@/lib/validation/dossier-vocabulary";

export function NewProposalForm({ boardId, calls }: { boardId: string; calls: { id: string; title: string }[] }) {
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
          coauthorEmails: String(form.get("coauthorEmails") ?? "")
            .split(/[\s,;]+/)
            .filter(Boolean),
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
      <TextField
        name="coauthorEmails"
        label="Co-authors' e-mail addresses"
        hint="Optional. Type each co-author's full address, separated by commas; they must be proposers on this board."
        autoComplete="off"
        maxLength={2000}
      />
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
