// The shapes of everything the accounts area accepts and returns. Forms, server actions,
// route handlers and the OpenAPI document all use these same schemas.
import { z } from "zod";

export const MIN_PASSWORD_LENGTH = 12;
export const MAX_PASSWORD_LENGTH = 256;

export const boardRoleSchema = z.enum(["proposer", "reviewer", "chair"]);
export const membershipStatusSchema = z.enum(["active", "deactivated"]);

export const emailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .min(1, "Enter an e-mail address.")
  .max(254, "That e-mail address is too long.")
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.org." }))
  .transform((value) => value.toLowerCase());

export const personNameSchema = z.string({ error: "Enter a name." }).trim().min(1, "Enter a name.").max(120, "Keep the name under 120 characters.");

export const newPasswordSchema = z
  .string({ error: "Choose a password." })
  .min(MIN_PASSWORD_LENGTH, `Choose a password of at least ${MIN_PASSWORD_LENGTH} characters.`)
  .max(MAX_PASSWORD_LENGTH, `Keep the password under ${MAX_PASSWORD_LENGTH} characters.`);

/** An empty form field means "not given". */
const optional = <S extends z.ZodType>(schema: S) => z.preprocess((v) => (v === "" || v === null ? undefined : v), schema.optional());

const formBoolean = z.preprocess((v) => (v === "on" || v === "true" ? true : v === "false" || v === "off" ? false : v), z.boolean());

// ---------- sign-in and accounts ----------

export const signInLinkRequestSchema = z.object({ email: emailSchema });

export const passwordResetRequestSchema = z.object({ email: emailSchema });

export const passwordResetSchema = z
  .object({
    token: z.string().min(10, "This reset link is incomplete: open it again from the e-mail.").max(200),
    password: newPasswordSchema,
    confirmPassword: z.string().max(MAX_PASSWORD_LENGTH),
  })
  .refine((v) => v.password === v.confirmPassword, { path: ["confirmPassword"], message: "The two passwords differ." });

export const changePasswordSchema = z
  .object({
    currentPassword: z.string({ error: "Enter your current password." }).min(1, "Enter your current password.").max(MAX_PASSWORD_LENGTH),
    newPassword: newPasswordSchema,
  })
  .refine((v) => v.currentPassword !== v.newPassword, { path: ["newPassword"], message: "The new password must differ from the current one." });

export const acceptInvitationSchema = z.object({
  token: z.string().min(10, "This invitation link is incomplete.").max(200),
  /** Needed only when the invitation creates a new account. */
  name: optional(personNameSchema),
  password: optional(newPasswordSchema),
});

export const registerProposerSchema = z.object({
  board: z.string().min(1).max(120),
  email: emailSchema,
  name: personNameSchema,
  organisation: optional(z.string().trim().max(160, "Keep the organisation under 160 characters.")),
  password: newPasswordSchema,
});

// ---------- boards ----------

export const boardSlugSchema = z
  .string()
  .trim()
  .min(3, "The short name needs at least 3 characters.")
  .max(60, "Keep the short name under 60 characters.")
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "Use lower-case letters, digits and single hyphens, like kestrel-small-missions.");

export const createBoardSchema = z.object({
  name: z.string().trim().min(3, "Give the board a name of at least 3 characters.").max(160, "Keep the name under 160 characters."),
  slug: optional(boardSlugSchema),
  description: optional(z.string().trim().max(2000, "Keep the description under 2000 characters.")),
});

export const updateBoardSchema = z
  .object({
    name: z.string().trim().min(3, "Give the board a name of at least 3 characters.").max(160).optional(),
    description: z.string().trim().max(2000, "Keep the description under 2000 characters.").optional(),
    openRegistration: formBoolean.optional(),
    hideProposerNames: formBoolean.optional(),
    reviewersSeeAllVersions: formBoolean.optional(),
    shareReviewItemsAfterSubmit: formBoolean.optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Change at least one setting.");

export const boardSettingsFormSchema = z.object({
  boardId: z.uuid(),
  name: z.string().trim().min(3, "Give the board a name of at least 3 characters.").max(160),
  description: z.string().trim().max(2000, "Keep the description under 2000 characters.").default(""),
  // Unchecked boxes are absent from the form data.
  openRegistration: formBoolean.default(false),
  hideProposerNames: formBoolean.default(false),
  reviewersSeeAllVersions: formBoolean.default(false),
  shareReviewItemsAfterSubmit: formBoolean.default(false),
});

export const boardSchema = z.object({
  id: z.string(),
  slug: z.string(),
  name: z.string(),
  description: z.string(),
  openRegistration: z.boolean(),
  hideProposerNames: z.boolean(),
  reviewersSeeAllVersions: z.boolean(),
  shareReviewItemsAfterSubmit: z.boolean(),
  createdAt: z.date().or(z.string()),
  /** The caller's role on the board; null for an admin who is not a member. */
  myRole: boardRoleSchema.nullable(),
});

export const boardListSchema = z.object({ boards: z.array(boardSchema) });

// ---------- members ----------

export const memberSortSchema = z.enum(["name", "email", "role", "status", "joined"]);

const pageNumber = z.coerce.number({ error: "page must be a whole number" }).int().min(1, "page starts at 1").max(100_000).default(1);
const pageSize = z.coerce
  .number({ error: "pageSize must be a whole number" })
  .int()
  .min(5, "pageSize is at least 5")
  .max(100, "pageSize is at most 100")
  .default(25);

export const memberListQuerySchema = z.object({
  page: pageNumber,
  pageSize,
  sort: memberSortSchema.default("name"),
  dir: z.enum(["asc", "desc"]).default("asc"),
  q: z.string().trim().max(200, "Keep the search under 200 characters.").optional(),
  role: boardRoleSchema.optional(),
  status: membershipStatusSchema.optional(),
});
export type MemberListQuery = z.infer<typeof memberListQuerySchema>;

export const updateMemberSchema = z
  .object({ role: boardRoleSchema.optional(), status: membershipStatusSchema.optional() })
  .strict()
  .refine((v) => v.role !== undefined || v.status !== undefined, "Give a new role or a new status.");

export const updateMemberFormSchema = z.object({
  boardId: z.uuid(),
  memberId: z.uuid(),
  role: boardRoleSchema.optional(),
  status: membershipStatusSchema.optional(),
});

export const memberSchema = z.object({
  id: z.string(),
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  organisation: z.string().nullable(),
  role: boardRoleSchema,
  status: membershipStatusSchema,
  accountStatus: z.enum(["active", "deactivated", "unverified"]),
  joinedAt: z.date().or(z.string()),
});

export const memberPageSchema = z.object({
  members: z.array(memberSchema),
  /** Whether another page follows (one extra row is fetched; members are not counted per request). */
  hasMore: z.boolean(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

// ---------- invitations ----------

export const INVITATION_DAYS = 7;

export const createInvitationSchema = z.object({
  email: emailSchema,
  name: optional(personNameSchema),
  role: boardRoleSchema,
});

export const inviteMemberFormSchema = createInvitationSchema.extend({ boardId: z.uuid() });
export const revokeInvitationFormSchema = z.object({ boardId: z.uuid(), invitationId: z.uuid() });

export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string().nullable(),
  role: boardRoleSchema,
  status: z.enum(["pending", "accepted", "revoked", "expired"]),
  expiresAt: z.date().or(z.string()),
  createdAt: z.date().or(z.string()),
  invitedBy: z.string().nullable(),
});

export const invitationListQuerySchema = z.object({
  /** `pending` (default): links that still work; `all`: accepted, withdrawn and expired too. */
  show: z.enum(["pending", "all"], { error: "show is pending or all" }).default("pending"),
  page: pageNumber,
  pageSize,
});
export type InvitationListQuery = z.infer<typeof invitationListQuerySchema>;

export const invitationListSchema = z.object({
  invitations: z.array(invitationSchema),
  /** Invitations matching `show` in all pages. */
  total: z.number().int(),
  /** Pending invitations of the board, whatever `show` is. */
  pendingTotal: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

// ---------- my account ----------

export const meSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  organisation: z.string().nullable(),
  isAdmin: z.boolean(),
  boards: z.array(z.object({ boardId: z.string(), slug: z.string(), name: z.string(), role: boardRoleSchema })),
  otherActiveSessions: z.number().int(),
});

export const okSchema = z.object({ ok: z.literal(true) });
export const revokedSessionsSchema = z.object({ revoked: z.number().int() });

// ---------- audit ----------

export const auditQuerySchema = z.object({
  page: pageNumber,
  pageSize: z.coerce
    .number({ error: "pageSize must be a whole number" })
    .int()
    .min(5, "pageSize is at least 5")
    .max(200, "pageSize is at most 200")
    .default(50),
  q: z.string().trim().max(200, "Keep the search under 200 characters.").optional(),
  action: z.string().trim().max(80).optional(),
  dir: z.enum(["asc", "desc"]).default("desc"),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export const auditEventSchema = z.object({
  id: z.string(),
  occurredAt: z.date().or(z.string()),
  actorEmail: z.string().nullable(),
  boardId: z.string().nullable(),
  action: z.string(),
  target: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
  ipAddress: z.string().nullable(),
});

/** `hasMore`: whether another page follows (one extra row is fetched; the log is not counted per request). */
export const auditPageSchema = z.object({ events: z.array(auditEventSchema), hasMore: z.boolean(), page: z.number().int(), pageSize: z.number().int() });
