"use client";
// The call page imports the requirements panel through this loader: the panel brings the
// requirement registry and zod (its parameter schemas), which the rest of the page does not
// need, so they travel as a chunk of their own.
import dynamic from "next/dynamic";

export const CallRequirementsLoader = dynamic(() => import("./call-requirements").then((m) => m.CallRequirements), {
  loading: () => (
    <p className="text-sm text-ink-600" aria-busy="true">
      Loading the requirements…
    </p>
  ),
});
