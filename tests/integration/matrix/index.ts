// Each feature area keeps its matrix entries in its own file here; add one line per area.
import type { ActionCase, RouteCase } from "./types";
import { reviewRouteCases } from "./review";
import { dossierRouteCases } from "./dossiers";
import { requirementRouteCases } from "./requirements";
import { systemRouteCases } from "./system";
import { accountActionCases, accountRouteCases } from "./accounts";
import { decisionActionCases, decisionRouteCases } from "./decisions";
import { orbitFileRouteCases } from "./orbit-files";
import { stationActionCases, stationRouteCases } from "./stations";
import { reportRouteCases } from "./reports";
import { responseRouteCases } from "./responses";
import { meetingRouteCases } from "./meetings";

export const routeCases: RouteCase[] = [
  ...dossierRouteCases,
  ...requirementRouteCases,
  ...systemRouteCases,
  ...accountRouteCases,
  ...reviewRouteCases,
  ...decisionRouteCases,
  ...orbitFileRouteCases,
  ...stationRouteCases,
  ...reportRouteCases,
  ...responseRouteCases,
  ...meetingRouteCases,
];
export const actionCases: ActionCase[] = [...accountActionCases, ...decisionActionCases, ...stationActionCases];
