import "server-only";
import { db, type Database, type Transaction } from "@/db/client";

/** A database handle a dal function reads or writes through: the pool, or an open transaction. */
export type Tx = Database | Transaction;
export type { Transaction };

/**
 * Runs `work` in one transaction. Use cases (lib/decisions, lib/review, ...) call this and pass
 * the transaction to each dal function, so a write, its audit row and its outbox message commit
 * together or not at all.
 */
export function inTransaction<T>(work: (tx: Transaction) => Promise<T>): Promise<T> {
  return db().transaction(work);
}
