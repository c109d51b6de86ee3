import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { decisionLetterUrl } from "@/lib/decisions";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { letterDownloadQuery } from "@/lib/validation/decisions";

/** A short-lived link to the letter PDF; with ?redirect=1 the browser is sent straight to it. */
export const GET = route(async (request, params) => {
  const user = await requireUser();
  const query = parseWith(letterDownloadQuery, searchParamsObject(request), 400);
  const link = await decisionLetterUrl(user, params.boardId ?? "", params.decisionId ?? "");
  if (query.redirect) return NextResponse.redirect(link.url, { status: 302, headers: { "Cache-Control": "no-store" } });
  return json(link);
});
