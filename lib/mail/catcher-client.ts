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
  attachments: CaughtAttachment[];
}

export interface CaughtAttachment {
  filename: string | null;
  contentType: string;
  size: number;
  /** Where the app serves the attachment's bytes (GET, as a download). */
  url: string;
}

/** The app's download path for one caught attachment. */
export function caughtAttachmentPath(messageId: string, index: number): string {
  return `/api/dev/mail/${encodeURIComponent(messageId)}/attachments/${index}`;
}

/** The local mail catcher's messages, or null when no catcher is configured (production). */
export async function listCaughtMessages(): Promise<CaughtMessage[] | null> {
  const base = mailCatcherUrl();
  if (!base) return null;
  const response = await fetch(`${base}/messages`, { cache: "no-store" });
  if (!response.ok) throw new Error(`mail catcher answered ${response.status}`);
  const body = (await response.json()) as { messages: (Omit<CaughtMessage, "attachments"> & { attachments: Omit<CaughtAttachment, "url">[] })[] };
  // Attachment bytes stay in the catcher; the list carries their names, types, sizes and the
  // path that downloads them.
  return body.messages.map((m) => ({
    ...m,
    attachments: m.attachments.map((a, index) => ({ filename: a.filename, contentType: a.contentType, size: a.size, url: caughtAttachmentPath(m.id, index) })),
  }));
}

/** One caught attachment's bytes and type; null when there is no catcher or no such file. */
export async function fetchCaughtAttachment(
  messageId: string,
  index: number,
): Promise<{ bytes: ArrayBuffer; contentType: string; filename: string | null } | null> {
  const base = mailCatcherUrl();
  if (!base) return null;
  const list = await listCaughtMessages();
  const meta = list?.find((m) => m.id === messageId)?.attachments[index];
  if (!meta) return null;
  const response = await fetch(`${base}/messages/${encodeURIComponent(messageId)}/attachments/${index}`, { cache: "no-store" });
  if (response.status === 404) return null;
  if (!response.ok) throw new Error(`mail catcher answered ${response.status}`);
  return { bytes: await response.arrayBuffer(), contentType: meta.contentType, filename: meta.filename };
}

export function mailPagesEnabled(): boolean {
  return mailCatcherUrl() !== null;
}
