// Call requirements: any member reads them; only chairs (and admins) add or remove them.
import { addRequirement } from "@/lib/dal/requirements";
import { requirementInputSchema } from "@/lib/validation/requirements";
import { asSessionUser } from "../../support/factories";
import { makeCall } from "./dossiers";
import type { MatrixCast, MatrixRole, RouteCase } from "./types";

const board = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;

const members: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 200, chair: 200, admin: 200 };
const chairOnly: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: [200, 201], admin: [200, 201] };

/** An open call on the cast's board with one 25-year disposal requirement. */
export async function callWithRequirement(cast: MatrixCast) {
  const call = await makeCall(cast);
  const requirement = await addRequirement(
    asSessionUser(cast.chair),
    cast.board.id,
    call.id,
    requirementInputSchema.parse({ type: "disposalDeadline", params: { years: 25 }, rationale: "" }),
  );
  return { call, requirement };
}

export const requirementRouteCases: RouteCase[] = [
  {
    operationId: "listCallRequirements",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await callWithRequirement(cast)).call.id}/requirements` }),
    expect: members,
  },
  {
    operationId: "addCallRequirement",
    prepare: async (cast) => ({
      path: `${board(cast)}/calls/${(await makeCall(cast)).id}/requirements`,
      body: { type: "deltaVMargin", params: { deterministicMargin: 0.05, statisticalMargin: 0.1 }, rationale: "Margins per phase." },
    }),
    expect: chairOnly,
  },
  {
    operationId: "removeCallRequirement",
    prepare: async (cast) => {
      const { call, requirement } = await callWithRequirement(cast);
      return { path: `${board(cast)}/calls/${call.id}/requirements/${requirement.id}` };
    },
    expect: { ...chairOnly, chair: 200, admin: 200 },
  },
];
