import { NextResponse } from "next/server";
import { listCaughtMessages } from "@/lib/mail/catcher-client";

export const dynamic = "force-dynamic";

/** Dev-only: every message the local mail catcher received. 404 where no catcher is configured. */
export async function GET() {
  try {
    const messages = await listCaughtMessages();
    if (messages === null) return NextResponse.json({ error: "Not found" }, { status: 404 });
    return NextResponse.json({ messages });
  } catch (error) {
    return NextResponse.json({ error: `The mail catcher did not answer: ${(error as Error).message}` }, { status: 503 });
  }
}
