// Reads messages from the local mail catcher. Other tests' mail is there too, so always
// filter by recipient (and usually by subject).
export interface CatcherMessage {
  id: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  messageId: string | null;
  headers: Record<string, string>;
  attachments: { filename: string | null; contentType: string; size: number; contentBase64: string }[];
}

export async function caughtMessages(): Promise<CatcherMessage[]> {
  const base = process.env.MAIL_CATCHER_URL;
  if (!base) throw new Error("MAIL_CATCHER_URL is not set; the test global setup provides it");
  const response = await fetch(`${base}/messages`);
  if (!response.ok) throw new Error(`mail catcher answered ${response.status}`);
  return ((await response.json()) as { messages: CatcherMessage[] }).messages;
}

/** Polls the catcher until a message to `recipient` matching `subject` arrives (the app's outbox worker sends it). */
export async function waitForMail(recipient: string, subject: RegExp = /./, timeoutMs = 15_000): Promise<CatcherMessage> {
  const deadline = Date.now() + timeoutMs;
  const wanted = recipient.toLowerCase();
  for (;;) {
    const found = (await caughtMessages()).find((m) => m.to.some((t) => t.toLowerCase().includes(wanted)) && subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${recipient} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

/** The first URL in a message's plain text that contains `pathPart`. */
export function linkIn(message: { text: string }, pathPart: string): string {
  const url = message.text.match(/https?:\/\/\S+/g)?.find((u) => u.includes(pathPart));
  if (!url) throw new Error(`no link containing ${pathPart} in:\n${message.text}`);
  return url;
}
