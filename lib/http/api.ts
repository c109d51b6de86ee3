import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import { AppError, badRequest, fromDatabaseInputError, isAppError } from "@/lib/errors";
import { humanIssue } from "@/lib/validation/messages";
import { containsNul, NUL_MESSAGE } from "./nul";

export interface ErrorBody {
  error: string;
  details?: unknown;
}

export function json<T>(data: T, init?: number | ResponseInit): NextResponse<T> {
  return NextResponse.json(data, typeof init === "number" ? { status: init } : init);
}

export function errorResponse(caught: unknown): NextResponse<ErrorBody> {
  const error = fromDatabaseInputError(caught) ?? caught;
  if (isAppError(error)) {
    return NextResponse.json(
      { error: error.message, ...(error.details === undefined ? {} : { details: error.details }) },
      { status: error.status, headers: error.headers },
    );
  }
  // Never leak a stack trace or a raw database message; the detail goes to the server log.
  console.error("[api] unexpected error", error);
  return NextResponse.json({ error: "Something went wrong on our side. Try again; if it persists, tell the board's administrator." }, { status: 500 });
}

type RouteContext = { params: Promise<Record<string, string | string[]>> };

/**
 * Wraps a route handler: awaits params, maps AppError to its 4xx JSON answer and anything
 * else to a generic 500. Authorization stays inside `handler` (requireUser + policy).
 */
export function route(handler: (request: Request, params: Record<string, string>) => Promise<Response>) {
  return async (request: Request, context: RouteContext): Promise<Response> => {
    try {
      const raw = context?.params ? await context.params : {};
      const params: Record<string, string> = {};
      for (const [key, value] of Object.entries(raw)) params[key] = Array.isArray(value) ? value.join("/") : value;
      if (containsNul(params)) throw badRequest(NUL_MESSAGE);
      return await handler(request, params);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

export const DEFAULT_BODY_LIMIT = 1024 * 1024;

/** Reads a JSON body with a size cap and validates it; 413/400/422 with a clear message otherwise. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S, maxBytes = DEFAULT_BODY_LIMIT): Promise<z.infer<S>> {
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > maxBytes) throw new AppError(413, `The request body is larger than ${Math.round(maxBytes / 1024)} KB.`);
  const text = await request.text();
  if (Buffer.byteLength(text, "utf8") > maxBytes) throw new AppError(413, `The request body is larger than ${Math.round(maxBytes / 1024)} KB.`);
  let body: unknown;
  try {
    body = text.length === 0 ? undefined : JSON.parse(text);
  } catch (error) {
    throw badRequest("The request body is not valid JSON.", { parser: (error as Error).message });
  }
  if (containsNul(body)) throw badRequest(NUL_MESSAGE);
  return parseWith(schema, body);
}

/** Validates a value (body, params, search params) with a zod schema; 422 listing each problem. */
export function parseWith<S extends z.ZodType>(schema: S, value: unknown, status: 400 | 422 = 422): z.infer<S> {
  if (containsNul(value)) throw badRequest(NUL_MESSAGE);
  const parsed = schema.safeParse(value);
  if (!parsed.success) {
    // Sentences a person can act on ("The title can be at most 200 characters."), each issue
    // also listed with its field path for programs.
    const issues = parsed.error.issues.map((i) => ({ path: i.path.join("."), message: humanIssue(i) }));
    throw new AppError(status, issues.map((i) => i.message).join(" "), { issues });
  }
  return parsed.data;
}

export function searchParamsObject(request: Request): Record<string, string> {
  return Object.fromEntries(new URL(request.url).searchParams.entries());
}
