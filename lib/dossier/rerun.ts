/**
 * Today's rules on an old version: the stored record of a submitted version stays as it
 * was (with the contract version that produced it); a chair may recompute the same blocks
 * with today's engine and the call's current policy and see what would differ. Nothing is
 * written. Pure.
 */
import { evaluateBlocks, extractOrbitChecks, ORBIT_CHECK_CONTRACT_VERSION, type ToleranceInput } from "./claims";
import { storedRows, type ExplainedRow } from "./verdict-text";

type Status = "consistent" | "inconsistent" | "invalid";

export interface StoredRecord {
  blockId: string;
  label: string;
  kind: string;
  status: Status;
  result: Record<string, unknown>;
  contractVersion: number;
}

export interface RowChange {
  quantity: string;
  stored: ExplainedRow | null;
  today: ExplainedRow | null;
}

export interface BlockRerun {
  blockId: string;
  label: string;
  kind: string;
  storedStatus: Status | null;
  storedContractVersion: number | null;
  todayStatus: Status;
  /** Check rows whose verdict differs (or that exist on one side only). */
  changes: RowChange[];
  todayMessages: string[];
}

export interface Rerun {
  contractVersion: number;
  tolerance: ToleranceInput;
  blocks: BlockRerun[];
  /** Blocks whose status or any check row differs. */
  differing: number;
}

export function rerunWithTodaysRules(document: unknown, stored: readonly StoredRecord[], tolerance: ToleranceInput): Rerun {
  const byBlock = new Map(stored.map((s) => [s.blockId, s]));
  const blocks = evaluateBlocks(extractOrbitChecks(document), tolerance).map((ev): BlockRerun => {
    const record = byBlock.get(ev.block.blockId) ?? null;
    const before = new Map(storedRows(record?.result).map((r) => [r.quantity, r]));
    const after = new Map(storedRows(ev.result).map((r) => [r.quantity, r]));
    const changes: RowChange[] = [];
    for (const quantity of new Set([...before.keys(), ...after.keys()])) {
      const s = before.get(quantity) ?? null;
      const t = after.get(quantity) ?? null;
      if (!s || !t || s.ok !== t.ok) changes.push({ quantity, stored: s, today: t });
    }
    return {
      blockId: ev.block.blockId,
      label: ev.block.label,
      kind: ev.block.claim.kind,
      storedStatus: record?.status ?? null,
      storedContractVersion: record?.contractVersion ?? null,
      todayStatus: ev.result.status,
      changes,
      todayMessages: ev.result.messages,
    };
  });
  return {
    contractVersion: ORBIT_CHECK_CONTRACT_VERSION,
    tolerance,
    blocks,
    differing: blocks.filter((b) => b.storedStatus !== b.todayStatus || b.changes.length > 0).length,
  };
}
