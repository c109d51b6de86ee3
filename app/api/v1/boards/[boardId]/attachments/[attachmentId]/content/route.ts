import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { attachmentDownloadUrl } from "@/lib/dal/attachments";
import { route } from "@/lib/http/api";

/** Redirects to a short-lived presigned GET that downloads the file (Content-Disposition: attachment). */
export const GET = route(async (_request, { boardId, attachmentId }) => {
  const user = await requireUser();
  const url = await attachmentDownloadUrl(user, boardId!, attachmentId!);
  return NextResponse.redirect(url, { status: 302, headers: { "Cache-Control": "private, no-store" } });
});
