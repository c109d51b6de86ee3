"use client";
import { useRouter } from "next/navigation";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { createStationAction } from "../actions";

/** The chair's form for one more ground station; values in the units people write. */
export function StationForm({ boardId }: { boardId: string }) {
  const router = useRouter();
  const { pending, answer, onSubmit, fieldError } = useActionForm(createStationAction, (_data, form) => {
    form.reset();
    router.refresh();
  });
  return (
    <form onSubmit={onSubmit} className="grid items-end gap-4 md:grid-cols-3" aria-label="Add a ground station" noValidate>
      <input type="hidden" name="boardId" value={boardId} />
      <div className="md:col-span-3">
        <ActionNotice answer={answer} success={answer?.ok ? `Station ${answer.data.name} added.` : undefined} />
      </div>
      <TextField label="Station name" name="name" maxLength={80} required error={fieldError("name")} />
      <TextField label="Latitude (°)" hint="North positive, e.g. 64.8 or 64.8° N" name="latitude" inputMode="decimal" required error={fieldError("latitude")} />
      <TextField
        label="Longitude (°)"
        hint="East positive, e.g. −147.7 or 147.7° W"
        name="longitude"
        inputMode="decimal"
        required
        error={fieldError("longitude")}
      />
      <TextField label="Height above sea level" hint="e.g. 210 m or 0.21 km; empty for 0" name="altitude" error={fieldError("altitude")} />
      <TextField
        label="Minimum elevation (°)"
        hint="Lowest usable elevation above the horizon, e.g. 10"
        name="minimumElevation"
        inputMode="decimal"
        required
        error={fieldError("minimumElevation")}
      />
      <SubmitButton pending={pending}>Add station</SubmitButton>
    </form>
  );
}
