/**
 * The OpenAPI 3.1 document of the API, generated from the route registry (lib/openapi/routes.ts)
 * and the zod schemas the routes parse with, through zod 4's own JSON Schema output
 * (`z.toJSONSchema`, draft 2020-12 — the dialect OpenAPI 3.1 uses). Request shapes are described as
 * the routes accept them (`io: "input"`: defaults make a field optional).
 */
import { z } from "zod";
import { API_ROUTES, type ApiRoute } from "./routes";

type Json = Record<string, unknown>;

/** The error body every route answers on failure (lib/api.ts `ErrorBody`). */
export const errorBodySchema = z.object({
  error: z.object({
    code: z.string().describe("bad_request, unauthorized, not_found, conflict, too_large, rate_limited, …"),
    message: z.string().describe("a sentence for a person"),
    details: z
      .record(z.string(), z.unknown())
      .optional()
      .describe("e.g. `fields`: messages per invalid field"),
  }),
});

const STATUS_TEXT: Record<number, string> = {
  400: "the input is not valid (`details.fields` names each field)",
  401: "no valid API token or session",
  403: "your role may not do this",
  404: "no such resource in a team you belong to",
  409: "the resource is not in a state that allows this",
  413: "the body is too large",
  429: "too many requests; `Retry-After` says when to try again",
  500: "a fault on our side (nothing internal is shown)",
};

function jsonSchema(schema: z.ZodType): Json {
  const out = z.toJSONSchema(schema, {
    io: "input",
    unrepresentable: "any",
    target: "draft-2020-12",
  }) as Json;
  delete out.$schema;
  return out;
}

function parameters(route: ApiRoute): Json[] {
  const list: Json[] = [];
  for (const [where, obj] of [
    ["path", route.params],
    ["query", route.query],
  ] as const) {
    if (!obj) continue;
    const s = jsonSchema(obj) as { properties?: Record<string, Json>; required?: string[] };
    for (const [name, schema] of Object.entries(s.properties ?? {})) {
      const { description, ...rest } = schema;
      list.push({
        name,
        in: where,
        required: where === "path" || (s.required ?? []).includes(name),
        ...(description ? { description } : {}),
        schema: rest,
      });
    }
  }
  return list;
}

function operation(route: ApiRoute): Json {
  const errorRef = { $ref: "#/components/schemas/Error" };
  const errors = [...new Set([...(route.auth === "token" ? [401] : []), ...(route.errors ?? []), 500])];
  const responses: Json = {
    [String(route.ok.status)]: {
      description: route.ok.description,
      ...(route.ok.status === 204
        ? {}
        : {
            content: {
              [route.ok.contentType ?? "application/json"]: {
                schema: route.ok.contentType ? { type: "string" } : {},
              },
            },
          }),
    },
  };
  for (const status of errors)
    responses[String(status)] = {
      description: STATUS_TEXT[status] ?? "error",
      content: { "application/json": { schema: errorRef } },
    };
  const body = route.body
    ? {
        required: true,
        content: {
          "application/json": { schema: jsonSchema(route.body) },
          ...Object.fromEntries(
            Object.entries(route.otherBodies ?? {}).map(([type, description]) => [
              type,
              { schema: { type: "string", description } },
            ]),
          ),
        },
      }
    : undefined;
  const params = parameters(route);
  return {
    tags: [route.tag],
    summary: route.summary,
    ...(route.description ? { description: route.description } : {}),
    operationId: `${route.method}${route.path.replace(/[^A-Za-z0-9]+(.)?/g, (_, c: string | undefined) => (c ?? "").toUpperCase())}`,
    security: route.auth === "token" ? [{ apiToken: [] }, { session: [] }] : [],
    ...(params.length ? { parameters: params } : {}),
    ...(body ? { requestBody: body } : {}),
    responses,
  };
}

/** The whole document. `origin`: the server's address as the caller reached it (optional). */
export function openApiDocument(origin?: string): Json {
  const paths: Record<string, Json> = {};
  for (const route of API_ROUTES) {
    paths[route.path] = { ...(paths[route.path] ?? {}), [route.method]: operation(route) };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Phasewright API",
      version: "1.0",
      description:
        "Solve netlists, save and compare runs, comment and review. Call it with an API token from " +
        "Settings → API tokens: `Authorization: Bearer pw_…`. A resource of a team you are not in is a 404.",
    },
    servers: [{ url: origin ?? "/" }],
    tags: [...new Set(API_ROUTES.map((r) => r.tag))].map((name) => ({ name })),
    components: {
      securitySchemes: {
        apiToken: { type: "http", scheme: "bearer", description: "an API token from Settings → API tokens" },
        session: {
          type: "apiKey",
          in: "cookie",
          name: "next-auth.session-token",
          description: "the web app's sign-in",
        },
      },
      schemas: { Error: jsonSchema(errorBodySchema) },
    },
    paths,
  };
}
