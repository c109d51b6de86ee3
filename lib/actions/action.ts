import "server-only";
import type { z } from "zod";
import { fromDatabaseInputError, isAppError } from "@/lib/errors";
import { containsNul, NUL_MESSAGE } from "@/lib/http/nul";
import { requireUser, type SessionUser } from "@/lib/auth/session";

export type ActionResult<T> = { ok: true; data: T } | { ok: false; error: string; fieldErrors?: Record<string, string[]>; status?: number };

function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
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
        return { ok: false, error: "Some fields need attention.", fieldErrors: fieldErrorsOf(parsed.error), status: 422 };
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
        return { ok: false, error: "Some fields need attention.", fieldErrors: fieldErrorsOf(parsed.error), status: 422 };
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
