// Plain lists the dossier forms show in the browser. They live apart from the zod schemas in
// dossier.ts so that a form needing only a list does not bring zod (and the database schema
// it reads its enums from) into the page's JavaScript.

export const MISSION_TYPES = ["earth-observation", "communications", "science", "technology-demonstration", "lunar", "planetary", "other"] as const;

/** Types an attachment may be declared as, with the file name endings each allows. */
export const ATTACHMENT_TYPES: Record<string, readonly string[]> = {
  "application/pdf": [".pdf"],
  "image/png": [".png"],
  "image/jpeg": [".jpg", ".jpeg"],
  "text/csv": [".csv"],
  // Plain text covers CCSDS orbit data messages in KVN and two-line element sets.
  "text/plain": [".txt", ".oem", ".opm", ".omm", ".kvn", ".tle", ".3le"],
  // CCSDS orbit data messages in their XML form (read with entities off).
  "text/xml": [".xml"],
};
