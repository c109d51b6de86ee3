/**
 * The one error type the engine's physics raises for input it cannot evaluate.
 * `check.ts` turns it into an `invalid` claim with the message shown to the proposer,
 * so messages are written for that reader: say what is wrong and what to give instead.
 */
export class OrbitInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "OrbitInputError";
  }
}

export function fail(message: string): never {
  throw new OrbitInputError(message);
}

/** Formats a number for messages without drowning the reader in digits. */
export function fmt(x: number, digits = 6): string {
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a !== 0 && (a >= 1e9 || a < 1e-4)) return x.toExponential(digits - 1);
  return String(Number(x.toPrecision(digits)));
}
