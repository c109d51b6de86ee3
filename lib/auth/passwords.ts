import "server-only";
import { hash, verify } from "@node-rs/argon2";

// Argon2id (the library's default algorithm) with the OWASP-recommended minimum cost
// (19 MiB, 2 iterations, 1 lane) — common practice, not a published standard.
const options = { memoryCost: 19_456, timeCost: 2, parallelism: 1 };

export function hashPassword(password: string): Promise<string> {
  return hash(password, options);
}

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  if (!passwordHash) return false;
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

let dummyHash: Promise<string> | undefined;

/**
 * Checks a password against an account that may not exist. Without an account a dummy hash
 * is verified anyway, so the answer takes as long for unknown addresses as for known ones.
 */
export async function verifyPasswordOrDummy(passwordHash: string | null | undefined, password: string): Promise<boolean> {
  if (passwordHash) return verifyPassword(passwordHash, password);
  dummyHash ??= hash("not a password anyone can sign in with", options);
  await verifyPassword(await dummyHash, password);
  return false;
}
