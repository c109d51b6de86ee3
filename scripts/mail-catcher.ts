// A local mail catcher: an SMTP server on loopback that keeps every message it receives
// (in a JSON-lines file, so messages survive restarts) and lists them over a small HTTP API:
//   GET /messages            all messages, newest last
//   GET /messages/:id/attachments/:index   one attachment's bytes
//   DELETE /messages         forget all messages
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import crypto from "node:crypto";
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject } from "mailparser";

const smtpPort = Number(process.env.MAIL_CATCHER_SMTP_PORT ?? 54322);
const apiPort = Number(process.env.MAIL_CATCHER_API_PORT ?? 54323);
const directory = process.env.MAIL_CATCHER_DIR ?? ".data/demo/mail";
const store = path.join(directory, "messages.jsonl");

interface CaughtMessage {
  id: string;
  receivedAt: string;
  envelope: { from: string | null; to: string[] };
  from: string;
  to: string[];
  cc: string[];
  subject: string;
  messageId: string | null;
  headers: Record<string, string>;
  text: string;
  html: string | null;
  attachments: { filename: string | null; contentType: string; size: number; contentBase64: string }[];
}

fs.mkdirSync(directory, { recursive: true });
let messages: CaughtMessage[] = fs.existsSync(store)
  ? fs
      .readFileSync(store, "utf8")
      .split("\n")
      .filter(Boolean)
      .map((line) => JSON.parse(line) as CaughtMessage)
  : [];

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  if (!value) return [];
  const list = Array.isArray(value) ? value : [value];
  return list.flatMap((a) => a.value.map((v) => v.address ?? "")).filter(Boolean);
}

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  logger: false,
  size: 50 * 1024 * 1024,
  onAuth(_auth, _session, callback) {
    callback(null, { user: "local" });
  },
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((parsed) => {
        const headers: Record<string, string> = {};
        for (const [key, value] of parsed.headers) headers[key] = typeof value === "string" ? value : JSON.stringify(value);
        const message: CaughtMessage = {
          id: crypto.randomUUID(),
          receivedAt: new Date().toISOString(),
          envelope: {
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            to: session.envelope.rcptTo.map((r) => r.address),
          },
          from: parsed.from?.text ?? "",
          to: addresses(parsed.to),
          cc: addresses(parsed.cc),
          subject: parsed.subject ?? "",
          messageId: parsed.messageId ?? null,
          headers,
          text: parsed.text ?? "",
          html: typeof parsed.html === "string" ? parsed.html : null,
          attachments: parsed.attachments.map((a) => ({
            filename: a.filename ?? null,
            contentType: a.contentType,
            size: a.size,
            contentBase64: a.content.toString("base64"),
          })),
        };
        messages.push(message);
        fs.appendFileSync(store, `${JSON.stringify(message)}\n`);
        callback();
      })
      .catch((error: Error) => callback(error));
  },
});

const api = http.createServer((req, res) => {
  const url = new URL(req.url ?? "/", `http://127.0.0.1:${apiPort}`);
  const send = (status: number, body: unknown) => {
    res.writeHead(status, { "content-type": "application/json" });
    res.end(JSON.stringify(body));
  };
  if (url.pathname === "/messages" && req.method === "GET") {
    return send(200, { messages });
  }
  if (url.pathname === "/messages" && req.method === "DELETE") {
    messages = [];
    fs.writeFileSync(store, "");
    return send(200, { deleted: true });
  }
  const attachment = url.pathname.match(/^\/messages\/([^/]+)\/attachments\/(\d+)$/);
  if (attachment && req.method === "GET") {
    const message = messages.find((m) => m.id === attachment[1]);
    const file = message?.attachments[Number(attachment[2])];
    if (!file) return send(404, { error: "No such attachment" });
    res.writeHead(200, { "content-type": file.contentType });
    return res.end(Buffer.from(file.contentBase64, "base64"));
  }
  if (url.pathname === "/health") return send(200, { ok: true });
  return send(404, { error: "Not found" });
});

smtp.listen(smtpPort, "127.0.0.1", () => console.log(`mail catcher SMTP on 127.0.0.1:${smtpPort}`));
api.listen(apiPort, "127.0.0.1", () => console.log(`mail catcher API on http://127.0.0.1:${apiPort}`));

for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    smtp.close(() => api.close(() => process.exit(0)));
    setTimeout(() => process.exit(0), 2000).unref();
  });
}
