/**
 * The JSON API's operations, described once with the same zod schemas that validate the
 * requests. The OpenAPI 3.1 document at /api/v1/openapi.json is generated from this list,
 * and the authorization matrix test walks it: a route missing here fails that test.
 */
import { z } from "zod";

export type HttpMethod = "get" | "post" | "put" | "patch" | "delete";

export interface ApiOperation {
  method: HttpMethod;
  /** OpenAPI-style path, e.g. /api/v1/boards/{boardId}/members */
  path: string;
  operationId: string;
  summary: string;
  tag: string;
  /** public: no sign-in; signed-in: 401 without a session, then the policy decides. */
  access: "public" | "signed-in";
  body?: z.ZodType;
  query?: z.ZodObject;
  response?: z.ZodType;
  /** Media types of the 200 answer when not only JSON (e.g. text/html, application/pdf); JSON uses `response`. */
  mediaTypes?: string[];
  /** Extra documented statuses beyond the defaults for the access level. */
  errors?: Partial<Record<400 | 403 | 404 | 409 | 413 | 422 | 429, string>>;
}

export function defineOperations(operations: ApiOperation[]): ApiOperation[] {
  return operations;
}

const errorBody = z.object({ error: z.string(), details: z.unknown().optional() });

function schemaOf(schema: z.ZodType, io: "input" | "output"): Record<string, unknown> {
  try {
    const out = z.toJSONSchema(schema, { target: "draft-2020-12", io, unrepresentable: "any" }) as Record<string, unknown>;
    delete out.$schema;
    return out;
  } catch {
    return {};
  }
}

export function buildOpenApiDocument(operations: ApiOperation[], version: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of operations) {
    const parameters = [
      ...[...op.path.matchAll(/\{(\w+)\}/g)].map((m) => ({ name: m[1], in: "path", required: true, schema: { type: "string" } })),
      ...(op.query
        ? Object.entries(op.query.shape).map(([name, schema]) => ({
            name,
            in: "query",
            required: !(schema as z.ZodType).safeParse(undefined).success,
            schema: schemaOf(schema as z.ZodType, "input"),
          }))
        : []),
    ];
    const responses: Record<string, unknown> = {
      "200": {
        description: "OK",
        content: op.mediaTypes
          ? Object.fromEntries(
              op.mediaTypes.map((type) => [
                type,
                {
                  schema:
                    type === "application/json"
                      ? op.response
                        ? schemaOf(op.response, "output")
                        : {}
                      : { type: "string", ...(type === "application/pdf" ? { format: "binary" } : {}) },
                },
              ]),
            )
          : { "application/json": { schema: op.response ? schemaOf(op.response, "output") : {} } },
      },
      "400": { description: "Malformed request", content: { "application/json": { schema: schemaOf(errorBody, "output") } } },
      "422": { description: "Request failed validation", content: { "application/json": { schema: schemaOf(errorBody, "output") } } },
    };
    if (op.access === "signed-in") {
      responses["401"] = { description: "Not signed in" };
      responses["403"] = { description: "Signed in without the right" };
      responses["404"] = { description: "Unknown resource, or a board you are not a member of" };
    }
    for (const [status, description] of Object.entries(op.errors ?? {})) responses[status] = { description };
    paths[op.path] ??= {};
    paths[op.path]![op.method] = {
      operationId: op.operationId,
      summary: op.summary,
      tags: [op.tag],
      security: op.access === "public" ? [] : [{ sessionCookie: [] }],
      parameters,
      ...(op.body ? { requestBody: { required: true, content: { "application/json": { schema: schemaOf(op.body, "input") } } } } : {}),
      responses,
    };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "VisViva API",
      version,
      description:
        "Review boards for spacecraft mission proposals. Orbit checks are two-body screening estimates, not a substitute for high-fidelity analysis.",
    },
    servers: [{ url: "/" }],
    components: {
      securitySchemes: { sessionCookie: { type: "apiKey", in: "cookie", name: "next-auth.session-token" } },
    },
    paths,
  };
}
