/**
 * Errors that carry an HTTP status and a message fit to show the person who caused them.
 * Route handlers and server actions turn these into 4xx answers; anything else is a 500
 * with a generic message (and the detail goes to the server log only).
 */
export class AppError extends Error {
  constructor(
    readonly status: 400 | 401 | 403 | 404 | 409 | 413 | 422 | 429 | 503,
    message: string,
    readonly details?: unknown,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const unauthenticated = (message = "Sign in to continue.") => new AppError(401, message);
export const forbidden = (message = "You do not have permission to do that.") => new AppError(403, message);
export const notFound = (what = "That resource") => new AppError(404, `${what} was not found.`);
export const conflict = (message: string, details?: unknown) => new AppError(409, message, details);
export const unprocessable = (message: string, details?: unknown) => new AppError(422, message, details);
export const badRequest = (message: string, details?: unknown) => new AppError(400, message, details);
export const tooManyRequests = (message: string, retryAfterSeconds: number) =>
  new AppError(429, message, { retryAfterSeconds }, { "Retry-After": String(Math.max(1, Math.ceil(retryAfterSeconds))) });

export function isAppError(error: unknown): error is AppError {
  return error instanceof AppError;
}

/**
 * A malformed identifier that reached the database (PostgreSQL "invalid text
 * representation", e.g. a non-UUID id) is the caller's mistake: answer 404 like any unknown
 * resource rather than 500. Data-access functions check ids first; this is the safety net.
 */
export function fromDatabaseInputError(error: unknown): AppError | null {
  const codeOf = (e: unknown) => (typeof e === "object" && e !== null ? (e as { code?: unknown }).code : undefined);
  const code = codeOf(error) ?? codeOf((error as { cause?: unknown } | null)?.cause);
  return code === "22P02" ? notFound("That resource") : null;
}
