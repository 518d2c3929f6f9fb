import { firstUnitOf, request, type RouteCase } from "../../support/matrix";

// Cases for the stored-analysis routes (read-only, scoped to the engine's or unit's vessel).

export const routeCases: Record<string, RouteCase> = {
  "GET /api/engines/[engineId]/analysis": async (w) => ({
    request: request("GET", `/api/engines/${w.engine1}/analysis`),
    params: { engineId: String(w.engine1) },
  }),
  "GET /api/units/[unitId]/analysis": async (w) => {
    const unitId = await firstUnitOf(w.engine1);
    return { request: request("GET", `/api/units/${unitId}/analysis`), params: { unitId: String(unitId) } };
  },
};
