// System area: the OpenAPI document and the orbit-check engine are public.
import type { RouteCase } from "./types";

export const systemRouteCases: RouteCase[] = [
  {
    operationId: "getOpenApiDocument",
    prepare: async () => ({ path: "/api/v1/openapi.json" }),
    expect: { anonymous: 200, outsider: 200, proposer: 200, reviewer: 200, chair: 200, admin: 200 },
  },
  {
    operationId: "postOrbitCheck",
    prepare: async () => ({
      path: "/api/v1/orbit-checks",
      body: { claims: [{ id: "c1", kind: "orbit", body: "earth", given: { periapsisAltitude: 500, apoapsisAltitude: 800 }, claimed: { period: 5863 } }] },
    }),
    expect: { anonymous: 200, outsider: 200, proposer: 200, reviewer: 200, chair: 200, admin: 200 },
  },
];
