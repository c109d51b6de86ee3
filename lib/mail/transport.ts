import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

const globalForMail = globalThis as unknown as { visvivaMailTransport?: Transporter };

/** The SMTP transport from SMTP_URL: the local catcher in demo and tests, a relay in production. */
export function mailTransport(): Transporter {
  globalForMail.visvivaMailTransport ??= nodemailer.createTransport(env().SMTP_URL, {
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 15_000,
  });
  return globalForMail.visvivaMailTransport;
}

export function mailFrom(): string {
  return env().MAIL_FROM;
}

export async function checkMailTransport(): Promise<void> {
  await mailTransport().verify();
}
