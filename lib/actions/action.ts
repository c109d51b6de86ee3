import "server-only";
import type { z } from "zod";
import { fromDatabaseInputError, isAppError } from "@/lib/errors";
import { containsNul, NUL_MESSAGE } from "@/lib/http/nul";
import { requireUser, type SessionUser } from "@/lib/auth/session";
import { humanFieldErrors, humanIssue } from "@/lib/validation/messages";

export type ActionResult<T> = { ok: true; data: T } | { ok: false; error: string; fieldErrors?: Record<string, string[]>; status?: number };

/**
 * The form's message. Problems with a field show beside that field (fieldErrors), so the
 * message only repeats the ones that belong to no field, as sentences.
 */
function summaryOf(error: z.ZodError): string {
  const general = error.issues.filter((i) => i.path.length === 0).map(humanIssue);
  if (general.length > 0) return general.join(" ");
  return error.issues.length === 1
    ? "One field needs attention: its message says what to change."
    : "Some fields need attention: each message says what to change.";
}

function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  return humanFieldErrors(error.issues);
}

/**
 * The one server-action wrapper: sign-in check, then zod, then the handler. The handler does
 * its own policy check through lib/dal. Raw database errors never reach the browser.
 */
export function action<S extends z.ZodType, T>(schema: S, handler: (input: z.infer<S>, user: SessionUser) => Promise<T>) {
  return async (input: unknown): Promise<ActionResult<T>> => {
    try {
      const user = await requireUser();
      const raw = input instanceof FormData ? Object.fromEntries(input.entries()) : input;
      if (containsNul(raw)) return { ok: false, error: NUL_MESSAGE, status: 400 };
      const parsed = schema.safeParse(raw);
      if (!parsed.success) {
        return { ok: false, error: summaryOf(parsed.error), fieldErrors: fieldErrorsOf(parsed.error), status: 422 };
      }
      return { ok: true, data: await handler(parsed.data, user) };
    } catch (caught) {
      const error = fromDatabaseInputError(caught) ?? caught;
      if (isAppError(error)) return { ok: false, error: error.message, status: error.status };
      console.error("[action] unexpected error", error);
      return { ok: false, error: "Something went wrong on our side; nothing was saved. Try again.", status: 500 };
    }
  };
}

/** For actions open to anonymous callers (sign-in link requests, invitation acceptance). */
export function publicAction<S extends z.ZodType, T>(schema: S, handler: (input: z.infer<S>) => Promise<T>) {
  return async (input: unknown): Promise<ActionResult<T>> => {
    try {
      const raw = input instanceof FormData ? Object.fromEntries(input.entries()) : input;
      if (containsNul(raw)) return { ok: false, error: NUL_MESSAGE, status: 400 };
      const parsed = schema.safeParse(raw);
      if (!parsed.success) {
        return { ok: false, error: summaryOf(parsed.error), fieldErrors: fieldErrorsOf(parsed.error), status: 422 };
      }
      return { ok: true, data: await handler(parsed.data) };
    } catch (caught) {
      const error = fromDatabaseInputError(caught) ?? caught;
      if (isAppError(error)) return { ok: false, error: error.message, status: error.status };
      console.error("[action] unexpected error", error);
      return { ok: false, error: "Something went wrong on our side; nothing was saved. Try again.", status: 500 };
    }
  };
}
