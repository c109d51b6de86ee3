import { z } from "zod";
import { orbitCheckRequestSchema, orbitCheckResponseSchema } from "@/lib/orbit";
import { defineOperations } from "../registry";

export const systemOperations = defineOperations([
  {
    method: "get",
    path: "/api/v1/openapi.json",
    operationId: "getOpenApiDocument",
    summary: "This document",
    tag: "system",
    access: "public",
    response: z.object({ openapi: z.string() }).loose(),
  },
  {
    method: "post",
    path: "/api/v1/orbit-checks",
    operationId: "postOrbitCheck",
    summary: "Recompute orbit, transfer and propulsion claims (two-body screening estimates); stores nothing",
    tag: "orbit checks",
    access: "public",
    body: orbitCheckRequestSchema,
    response: orbitCheckResponseSchema,
    errors: { 413: "Request body over 256 KB", 429: "Too many requests from this address; see Retry-After" },
  },
]);
