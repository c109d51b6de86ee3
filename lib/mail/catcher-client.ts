import "server-only";
import { mailCatcherUrl } from "@/lib/env";

export interface CaughtMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  cc: string[];
  subject: string;
  text: string;
  html: string | null;
  attachments: { filename: string | null; contentType: string; size: number }[];
}

/** The local mail catcher's messages, or null when no catcher is configured (production). */
export async function listCaughtMessages(): Promise<CaughtMessage[] | null> {
  const base = mailCatcherUrl();
  if (!base) return null;
  const response = await fetch(`${base}/messages`, { cache: "no-store" });
  if (!response.ok) throw new Error(`mail catcher answered ${response.status}`);
  const body = (await response.json()) as { messages: CaughtMessage[] };
  // Attachment bytes stay in the catcher; the list carries their names, types and sizes.
  return body.messages.map((m) => ({
    ...m,
    attachments: m.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.size })),
  }));
}

export function mailPagesEnabled(): boolean {
  return mailCatcherUrl() !== null;
}
