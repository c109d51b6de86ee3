// The environment, validated once. In production every service URL must be given; the demo
// and test profiles get theirs from scripts/service-config.ts.
import { z } from "zod";

const mode = z.enum(["production", "demo", "test"]);

const schema = z.object({
  VISVIVA_MODE: mode.default("production"),
  DATABASE_URL: z.string().url(),
  S3_ENDPOINT: z.string().url(),
  S3_ACCESS_KEY: z.string().min(1),
  S3_SECRET_KEY: z.string().min(1),
  S3_BUCKET: z.string().min(3),
  S3_REGION: z.string().min(1).default("us-east-1"),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, "must start with smtp:// or smtps://"),
  MAIL_FROM: z.string().min(3).default("VisViva <no-reply@visviva.example.org>"),
  MAIL_CATCHER_URL: z.string().url().optional(),
  APP_URL: z.string().url(),
  NEXTAUTH_SECRET: z.string().min(16),
  /**
   * Proxies in front of the app that each append to X-Forwarded-For. 0 (the default): the
   * header is ignored and the connecting peer is the client (lib/http/client-address.ts).
   */
  TRUSTED_PROXY_HOPS: z.coerce.number().int().min(0).max(10).default(0),
  UPLOAD_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(100 * 1024 * 1024),
});

export type AppEnv = z.infer<typeof schema>;

export const REQUIRED_VARIABLES = [
  "DATABASE_URL",
  "S3_ENDPOINT",
  "S3_ACCESS_KEY",
  "S3_SECRET_KEY",
  "S3_BUCKET",
  "SMTP_URL",
  "APP_URL",
  "NEXTAUTH_SECRET",
] as const;

export class EnvironmentError extends Error {}

export function parseEnv(source: Record<string, string | undefined>): AppEnv {
  const missing = REQUIRED_VARIABLES.filter((name) => !source[name]);
  if (missing.length > 0) {
    throw new EnvironmentError(`VisViva cannot start: missing environment variables: ${missing.join(", ")} (see .env.example)`);
  }
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new EnvironmentError(`VisViva cannot start: invalid environment: ${problems}`);
  }
  return parsed.data;
}

let cached: AppEnv | undefined;

export function env(): AppEnv {
  cached ??= parseEnv(process.env);
  return cached;
}

/**
 * The local mail catcher, for the /dev/mail pages: only in demo and test mode, and only where
 * a catcher is configured. In production mode these pages do not exist, whatever is set.
 */
export function mailCatcherUrl(): string | null {
  return mailCatcherUrlFor(env());
}

export function mailCatcherUrlFor(e: AppEnv): string | null {
  if (e.VISVIVA_MODE !== "demo" && e.VISVIVA_MODE !== "test") return null;
  if (!e.MAIL_CATCHER_URL) return null;
  return e.MAIL_CATCHER_URL;
}
