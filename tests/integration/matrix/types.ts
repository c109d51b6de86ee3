// The authorization matrix: for every /api/v1 operation (by operationId) and every server
// action, what each role gets. authorization-matrix.test.ts walks these lists and fails
// when an operation in the OpenAPI document or an exported server action has no entry.
import type { createBoardWithCast } from "../../support/factories";
import type { SessionUser } from "@/lib/auth/session";

export type MatrixRole = "anonymous" | "outsider" | "proposer" | "reviewer" | "chair" | "admin";
export const matrixRoles: MatrixRole[] = ["anonymous", "outsider", "proposer", "reviewer", "chair", "admin"];

/** A board with one member of each role, an admin, and a chair of another board (the outsider). */
export type MatrixCast = Awaited<ReturnType<typeof createBoardWithCast>>;

export interface RouteCase {
  operationId: string;
  /**
   * Called afresh for each role (so a mutating call never sees another role's effect):
   * make whatever the request needs on the cast's board and return the concrete request.
   */
  prepare: (cast: MatrixCast, role: MatrixRole) => Promise<{ path: string; body?: unknown; query?: Record<string, string> }>;
  /** HTTP status expected per role (a list when several are right, e.g. [200, 201]). */
  expect: Record<MatrixRole, number | number[]>;
}

export interface ActionCase {
  /** "<file under app/>#<exported action name>", e.g. "app/(board)/boards/[boardId]/members/actions.ts#inviteMemberAction". */
  action: string;
  /**
   * Runs the data-access function the action delegates to, as `user` (null: anonymous),
   * with input made afresh on the cast's board. It should throw the AppError the policy raises.
   */
  run: (user: SessionUser | null, cast: MatrixCast, role: MatrixRole) => Promise<unknown>;
  /** "allow", or the status of the AppError expected per role. */
  expect: Record<MatrixRole, "allow" | 401 | 403 | 404>;
}
