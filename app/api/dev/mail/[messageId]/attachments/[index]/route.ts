import { NextResponse } from "next/server";
import { fetchCaughtAttachment } from "@/lib/mail/catcher-client";

export const dynamic = "force-dynamic";

/**
 * Dev-only: one attachment of a caught message, as a download. 404 where no catcher is
 * configured or the message has no such attachment. Always served as an attachment in a
 * sandbox, never rendered in the app's origin (a caught HTML file must not run here).
 */
export async function GET(_request: Request, context: { params: Promise<{ messageId: string; index: string }> }) {
  const { messageId, index } = await context.params;
  if (!/^[0-9a-f-]{36}$/i.test(messageId) || !/^\d{1,4}$/.test(index)) return NextResponse.json({ error: "No such attachment" }, { status: 404 });
  try {
    const file = await fetchCaughtAttachment(messageId, Number(index));
    if (!file) return NextResponse.json({ error: "No such attachment" }, { status: 404 });
    const name = (file.filename ?? `attachment-${index}`).replace(/[^\w.\- ]+/g, "_");
    return new NextResponse(file.bytes, {
      status: 200,
      headers: {
        "content-type": /^[\w.+-]+\/[\w.+-]+$/.test(file.contentType) ? file.contentType : "application/octet-stream",
        "content-disposition": `attachment; filename="${name}"; filename*=UTF-8''${encodeURIComponent(file.filename ?? name)}`,
        "content-length": String(file.bytes.byteLength),
        "x-content-type-options": "nosniff",
        "content-security-policy": "sandbox; default-src 'none'",
        "cache-control": "no-store",
      },
    });
  } catch (error) {
    return NextResponse.json({ error: `The mail catcher did not answer: ${(error as Error).message}` }, { status: 503 });
  }
}
