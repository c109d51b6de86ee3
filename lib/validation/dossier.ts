// zod schemas for calls, proposals, drafts and attachments: shared by the forms, the
// route handlers, the server actions and the OpenAPI document.
import { z } from "zod";
import { proposalStatuses } from "@/db/vocabulary";
import { FILE_TOLERANCE_RULES, FILE_TOLERANCE_UNITS, parseFileToleranceValue } from "@/lib/orbit-files/tolerance";

export const TOLERANCE_UNITS = ["km", "km/s", "deg", "s", "kg", "deg/day", "rev/day"] as const;

/**
 * A call's tolerance policy (orbit-check contract version 2): a relative bound, and an
 * absolute bound per unit (angles are held to `deg` alone). Each message names its field.
 */
export const tolerancePolicySchema = z.strictObject(
  {
    relative: z
      .number("the relative bound must be a finite number, as a fraction (0.001 is 0.1 %)")
      .min(0, "the relative bound cannot be negative")
      .lt(0.5, "the relative bound must be below 0.5 (50 %); a bound that wide checks nothing"),
    absolute: z
      .partialRecord(
        z.enum(TOLERANCE_UNITS, `absolute bounds take these units only: ${TOLERANCE_UNITS.join(", ")}`),
        z.number("an absolute bound must be a finite number in its unit").min(0, "an absolute bound cannot be negative"),
      )
      .optional(),
  },
  "a tolerance policy takes relative and absolute only",
);
export type TolerancePolicyInput = z.infer<typeof tolerancePolicySchema>;

/**
 * A call's tolerance for comparing orbit files with the text: each bound as a number in its
 * unit or as typed ("500 m", "6 arcmin", "1 min"); null returns to the product's defaults.
 */
function fileBound(unit: (typeof FILE_TOLERANCE_UNITS)[number]) {
  const rule = FILE_TOLERANCE_RULES[unit];
  return z.union([z.number(), z.string().max(60)], `type a bound for ${rule.what} such as ${rule.example}`).transform((raw, ctx) => {
    const parsed = parseFileToleranceValue(unit, raw);
    if (parsed.ok) return parsed.value;
    ctx.addIssue({ code: "custom", message: parsed.message });
    return z.NEVER;
  });
}

export const fileToleranceInputSchema = z
  .strictObject(
    { km: fileBound("km"), deg: fileBound("deg"), "1": fileBound("1"), s: fileBound("s") },
    "the file tolerance takes km, deg, 1 (eccentricity) and s only",
  )
  .nullable();

/** A call's file-comparison bounds as the API shows them (absolute, in km, deg, 1, s). */
export const fileToleranceSchema = z
  .object({ km: z.number(), deg: z.number(), "1": z.number(), s: z.number() })
  .describe("absolute bounds for comparing attached orbit files with the text: km (altitudes), deg (inclination), 1 (eccentricity), s (period)");

/** The contract version 2 default for a new call: 0.1 % relative (absolute bounds: the contract's). */
export const DEFAULT_CALL_TOLERANCE = { relative: 0.001 };

const dateInput = z.coerce.date("must be a date and time (ISO 8601)");

const sectionName = z.string().trim().min(1, "a section name cannot be empty").max(120, "section names are at most 120 characters");

export const callInputSchema = z
  .strictObject({
    title: z.string().trim().min(3, "give the call a title of at least 3 characters").max(200),
    description: z.string().max(5000).default(""),
    opensAt: dateInput,
    closesAt: dateInput,
    tolerance: tolerancePolicySchema.default(DEFAULT_CALL_TOLERANCE),
    /** Absent: unchanged (defaults for a new call); null: back to the defaults. */
    fileTolerance: fileToleranceInputSchema.optional(),
    requiredSections: z.array(sectionName).max(30, "at most 30 required sections").default([]),
    reviewersPerProposal: z.coerce.number().int().min(1, "at least one reviewer per proposal").max(10, "at most 10 reviewers per proposal").default(2),
  })
  .refine((c) => c.closesAt.getTime() > c.opensAt.getTime(), { message: "the call must close after it opens", path: ["closesAt"] });
export type CallInput = z.infer<typeof callInputSchema>;

export const callSchema = z.object({
  id: z.uuid(),
  boardId: z.uuid(),
  title: z.string(),
  description: z.string(),
  opensAt: z.string(),
  closesAt: z.string(),
  tolerance: tolerancePolicySchema,
  fileTolerance: fileToleranceSchema,
  /** True while the call uses the product's default file tolerance. */
  fileToleranceIsDefault: z.boolean(),
  requiredSections: z.array(z.string()),
  reviewersPerProposal: z.number().int(),
  state: z.enum(["upcoming", "open", "closed"]),
});

// The lists the browser forms need live in dossier-vocabulary.ts (no zod there).
export { ATTACHMENT_TYPES, MISSION_TYPES } from "./dossier-vocabulary";

export const proposalCreateSchema = z.strictObject({
  title: z.string().trim().min(3, "give the proposal a title of at least 3 characters").max(200),
  missionType: z.string().trim().max(80).default(""),
  callId: z.uuid("choose a call"),
  coauthorIds: z.array(z.uuid()).max(20, "at most 20 co-authors").default([]),
  /** Co-authors by their full e-mail address (the board's proposers are not listed to proposers). */
  coauthorEmails: z
    .array(z.string().trim().toLowerCase().max(320).pipe(z.email("type each co-author's full e-mail address")))
    .max(20, "at most 20 co-authors")
    .default([]),
});
export type ProposalCreateInput = Omit<z.infer<typeof proposalCreateSchema>, "coauthorEmails"> & { coauthorEmails?: string[] };

export const proposalUpdateSchema = z.strictObject({
  title: z.string().trim().min(3).max(200).optional(),
  missionType: z.string().trim().max(80).optional(),
  coauthorIds: z.array(z.uuid()).max(20).optional(),
});
export type ProposalUpdateInput = z.infer<typeof proposalUpdateSchema>;

export const proposalSortColumns = ["title", "status", "updatedAt", "createdAt", "callTitle", "latestVersion"] as const;

export const proposalListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  sort: z.enum(proposalSortColumns).default("updatedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  q: z.string().trim().max(200).optional(),
  status: z.enum(proposalStatuses).optional(),
  callId: z.uuid().optional(),
  /** The `nextCursor` of the previous page: keyset paging for API clients (it wins over `page`). */
  cursor: z.string().trim().min(1).max(2000).optional(),
});
export type ProposalListQuery = z.infer<typeof proposalListQuerySchema>;

export const proposalRowSchema = z.object({
  id: z.uuid(),
  title: z.string(),
  missionType: z.string(),
  status: z.enum(proposalStatuses),
  callId: z.uuid(),
  callTitle: z.string(),
  latestVersion: z.number().int(),
  isOwner: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});

export const proposalPageSchema = z.object({
  rows: z.array(proposalRowSchema),
  /** The page number asked for (echoed; with a cursor it is the caller's own count). */
  page: z.number().int(),
  pageSize: z.number().int(),
  /** Whether at least one more row follows (one extra row is fetched); the list does not count its rows. */
  hasMore: z.boolean(),
  /** Pass as `cursor` to fetch the next page by keyset; null on the last page. */
  nextCursor: z.string().nullable(),
  /** Pass as `cursor` to fetch the page before this one by keyset; null on the first page. */
  prevCursor: z.string().nullable(),
});

export const draftSaveSchema = z.strictObject({
  revision: z.number("send the revision you loaded").int().min(1),
  document: z.record(z.string(), z.unknown(), "document must be a Tiptap JSON object"),
});
export type DraftSaveInput = z.infer<typeof draftSaveSchema>;

export const draftSchema = z.object({
  proposalId: z.uuid(),
  revision: z.number().int(),
  basedOnVersion: z.number().int(),
  document: z.record(z.string(), z.unknown()),
  updatedAt: z.string(),
  dropped: z.array(z.string()).optional(),
});

export const submitSchema = z.strictObject({
  /** The draft revision the author saw; a newer saved draft makes the submission 409. */
  revision: z.number().int().min(1).optional(),
});

export const presignUploadSchema = z.strictObject({
  filename: z
    .string()
    .trim()
    .min(1, "the file needs a name")
    .max(255, "file names are at most 255 characters")
    .refine((s) => !/[\u0000-\u001f/\\]/.test(s), "the file name contains characters that are not allowed"),
  contentType: z.string().trim().toLowerCase().max(100),
  size: z.number("declare the file size in bytes").int().min(1, "the file is empty").max(Number.MAX_SAFE_INTEGER),
});
export type PresignUploadInput = z.infer<typeof presignUploadSchema>;

export const attachmentSchema = z.object({
  id: z.uuid(),
  proposalId: z.uuid(),
  filename: z.string(),
  contentType: z.string(),
  size: z.number().nullable(),
  sha256: z.string().nullable(),
  status: z.enum(["pending", "confirmed", "removed"]),
  textKind: z.string().nullable().optional(),
  createdAt: z.string(),
  contentPath: z.string(),
});

export const presignUploadResponseSchema = z.object({
  attachment: attachmentSchema,
  uploadUrl: z.string(),
  method: z.literal("PUT"),
  headers: z.record(z.string(), z.string()),
  expiresAt: z.string(),
});

export const versionSummarySchema = z.object({
  id: z.uuid(),
  number: z.number().int(),
  title: z.string(),
  submittedAt: z.string(),
  attachments: z.array(z.object({ attachmentId: z.string(), filename: z.string(), contentType: z.string(), size: z.number(), sha256: z.string() })),
  counts: z.object({ consistent: z.number().int(), inconsistent: z.number().int(), invalid: z.number().int() }),
});

export const checkResultSchema = z.object({
  blockId: z.string(),
  label: z.string(),
  kind: z.string(),
  status: z.enum(["consistent", "inconsistent", "invalid"]),
  claim: z.record(z.string(), z.unknown()),
  result: z.record(z.string(), z.unknown()),
  requirements: z
    .array(
      z
        .object({ requirementId: z.string(), type: z.string(), title: z.string(), status: z.enum(["met", "notMet", "notEvaluated"]), reason: z.string() })
        .loose(),
    )
    .describe("the call's requirements judged on this claim at submission: met, notMet or notEvaluated with the reason"),
});

export const versionNumberSchema = z.coerce
  .number("the version number must be a whole number")
  .int("the version number must be a whole number")
  .min(1)
  .max(100000);
