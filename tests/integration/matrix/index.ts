// Each feature area keeps its matrix entries in its own file here; add one line per area.
import type { ActionCase, RouteCase } from "./types";
import { reviewRouteCases } from "./review";
import { dossierRouteCases } from "./dossiers";
import { requirementRouteCases } from "./requirements";
import { systemRouteCases } from "./system";
import { accountActionCases, accountRouteCases } from "./accounts";
import { decisionActionCases, decisionRouteCases } from "./decisions";
import { stationActionCases, stationRouteCases } from "./stations";

export const routeCases: RouteCase[] = [
  ...dossierRouteCases,
  ...requirementRouteCases,
  ...systemRouteCases,
  ...accountRouteCases,
  ...reviewRouteCases,
  ...decisionRouteCases,
  ...stationRouteCases,
];
export const actionCases: ActionCase[] = [...accountActionCases, ...decisionActionCases, ...stationActionCases];
