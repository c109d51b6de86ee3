import { z } from "zod";
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
]);
