// Each feature area keeps its matrix entries in its own file here; add one line per area.
import type { ActionCase, RouteCase } from "./types";

export const routeCases: RouteCase[] = [];
export const actionCases: ActionCase[] = [];
