// Any /api path that no route handler claims: a JSON 404 that points at the list of routes,
// instead of the HTML not-found page. It reads and returns nothing else, so it needs no
// sign-in; Next routes every more specific handler (/api/v1/**, /api/auth, /api/health) first.
import { NextResponse } from "next/server";

function unknownRoute(request: Request): Response {
  const { pathname } = new URL(request.url);
  return NextResponse.json(
    { error: `There is no API route ${request.method} ${pathname}. The routes are listed at /api/v1/openapi.json.` },
    { status: 404, headers: { "cache-control": "no-store" } },
  );
}

export const GET = unknownRoute;
export const POST = unknownRoute;
export const PUT = unknownRoute;
export const PATCH = unknownRoute;
export const DELETE = unknownRoute;
