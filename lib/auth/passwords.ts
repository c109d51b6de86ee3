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
