// Each feature area keeps its matrix entries in its own file here; add one line per area.
import type { ActionCase, RouteCase } from "./types";
import { dossierRouteCases } from "./dossiers";

export const routeCases: RouteCase[] = [...dossierRouteCases];
export const actionCases: ActionCase[] = [];
