// A worker process the outbox tests kill with SIGKILL in the middle of a send. It prints
// "ready", then for each message id read on stdin claims it through the real processOutbox
// and hangs inside the SMTP hand-off (a transport that never answers) after printing
// "claimed"; if another worker got the row first it prints "missed" and waits for the next id.
import readline from "node:readline";
import { processOutbox } from "@/lib/mail/outbox";

const input = readline.createInterface({ input: process.stdin });
input.on("line", (line) => {
  const id = line.trim();
  let claimed = false;
  processOutbox({
    ids: [id],
    transport: {
      sendMail: () => {
        claimed = true;
        process.stdout.write("claimed\n");
        return new Promise(() => {});
      },
    },
  })
    .then(() => {
      if (!claimed) process.stdout.write("missed\n");
    })
    .catch((error) => {
      process.stderr.write(`crash worker: ${error instanceof Error ? error.message : String(error)}\n`);
      process.exit(2);
    });
});
process.stdout.write("ready\n");
