import { json, route } from "@/lib/http/api";
import { openApiDocument } from "@/lib/openapi";

export const GET = route(async () => json(openApiDocument()));
