import {
  extendZodWithOpenApi,
  OpenApiGeneratorV31,
  OpenAPIRegistry,
  type RouteConfig,
  type ZodRequestBody,
} from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { idSchema } from '@/lib/ids';
import type { DeclaredSpec, Method, RouteHandler } from './route';

// The generator describes parameters through zod's prototype extension (documentation only).
extendZodWithOpenApi(z);

// The API document is generated from the route declarations (lib/http/route.ts), never written by hand:
// each declared method of each route file becomes one OpenAPI 3.1 operation with its caller, params,
// query, body, success answer and the error answers the declaration can give.

export type RouteModules = Record<string, Partial<Record<Method, RouteHandler>> & Record<string, unknown>>;

const METHODS: Method[] = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'];

const errorSchema = z
  .object({
    error: z.object({
      code: z.string().meta({ description: 'invalid, unauthenticated, forbidden, not_found, conflict, too_many, unavailable' }),
      message: z.string(),
      fields: z.record(z.string(), z.array(z.string())).optional().meta({ description: 'Each field named, with what is wrong.' }),
    }),
  })
  .meta({ id: 'Error' });

/** The declared handlers of one route module, checked against the export names they sit under. */
export function declaredMethods(mod: RouteModules[string]): { method: Method; spec: DeclaredSpec }[] {
  return METHODS.flatMap((m) => {
    const handler = mod[m];
    if (!handler) return [];
    if (typeof handler !== 'function' || !('declaration' in handler))
      throw new Error(`${m} is exported without a route() declaration`);
    if (handler.declaration.method !== m)
      throw new Error(`${m} is exported but declared as ${handler.declaration.method}`);
    return [{ method: m, spec: handler.declaration }];
  });
}

export function whoText(who: DeclaredSpec['who']): string {
  if (who === 'anonymous') return 'anyone';
  if (who === 'signed-in') return 'anyone signed in';
  if (who === 'signature') return 'the payment processor (signed request)';
  return `signed in as ${who.join(' or ')}`;
}

type JsonSchema = { properties?: Record<string, object>; required?: string[] };
const inputSchema = (schema: z.ZodType) =>
  z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', target: 'draft-2020-12' }) as JsonSchema;

/** Path parameters (ids are UUIDs, everything else a string) and the query's fields, from zod's own JSON Schema. */
function parameters(path: string, spec: DeclaredSpec) {
  const names = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
  const shape = (spec.params as z.ZodObject | undefined)?.shape ?? {};
  const inPath = names.map((name) => ({
    name,
    in: 'path',
    required: true,
    schema: shape[name] === idSchema ? { type: 'string', format: 'uuid' } : { type: 'string' },
  }));
  const query = spec.query ? inputSchema(spec.query) : {};
  const inQuery = Object.entries(query.properties ?? {}).map(([name, schema]) => {
    const { $schema: _drop, ...rest } = schema as Record<string, unknown>;
    return { name, in: 'query', required: (query.required ?? []).includes(name), schema: rest };
  });
  return [...inPath, ...inQuery];
}

function requestBody(spec: DeclaredSpec): ZodRequestBody | undefined {
  const body = spec.body;
  if (!body) return undefined;
  switch (body.kind) {
    case 'json':
      return { required: true, content: { 'application/json': { schema: body.doc ?? body.schema } } };
    case 'multipart':
      return {
        required: true,
        description: `At most ${Math.round(body.maxBytes / 1024)} KiB.`,
        content: { 'multipart/form-data': { schema: body.doc ?? body.schema } },
      };
    case 'text':
      return {
        required: true,
        description: 'Read as raw text: the signature covers the exact bytes.',
        content: Object.fromEntries(body.contentTypes.map((t) => [t, { schema: z.string() }])),
      };
    case 'form':
      return {
        required: true,
        content: { 'application/x-www-form-urlencoded': { schema: z.record(z.string(), z.string()) } },
      };
  }
}

function responses(spec: DeclaredSpec): RouteConfig['responses'] {
  const err = (description: string) => ({ description, content: { 'application/json': { schema: errorSchema } } });
  const out: RouteConfig['responses'] = {};
  const status = String(spec.status ?? 200);
  if (spec.produces) {
    out[status] = {
      description: spec.produces.description,
      content: { [spec.produces.contentType]: { schema: z.string() } },
    };
  } else {
    out[status] = {
      description: 'Success.',
      content: { 'application/json': { schema: spec.response ?? z.looseObject({}) } },
    };
  }
  if (spec.query || spec.body) out['400'] = err('A field is wrong; `fields` names each one.');
  if (spec.who !== 'anonymous' && spec.who !== 'signature') out['401'] = err('Nobody is signed in.');
  if (Array.isArray(spec.who) || spec.method !== 'GET')
    out['403'] = err('The role does not allow it, or a change with a session came from another origin.');
  if (spec.params) out['404'] = err('No such record in the caller’s space (also for a malformed id).');
  if (spec.body?.kind === 'multipart') out['413'] = err('The upload is larger than its limit.');
  if (spec.body) out['415'] = err('The body was sent with another Content-Type.');
  out['503'] = err('The database or a service it depends on is unavailable; try again shortly.');
  return out;
}

/** The OpenAPI 3.1 document of the given route modules (keyed by their OpenAPI path). */
export function openApiDocument(routes: RouteModules, serverUrl: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'session', {
    type: 'apiKey',
    in: 'cookie',
    name: 'next-auth.session-token',
    description: 'The session cookie set by signing in. Changes must come from the app’s own origin.',
  });
  registry.registerComponent('securitySchemes', 'processorSignature', {
    type: 'apiKey',
    in: 'header',
    name: 'Stripe-Signature',
    description: 'HMAC-SHA256 of "timestamp.body" with the webhook signing secret.',
  });
  for (const [path, mod] of Object.entries(routes).sort(([a], [b]) => a.localeCompare(b))) {
    for (const { method, spec } of declaredMethods(mod)) {
      const tag = path.split('/')[2] ?? 'api';
      registry.registerPath({
        method: method.toLowerCase() as Lowercase<Method>,
        path,
        operationId: `${method.toLowerCase()}${path.replace(/[^A-Za-z0-9]+(.)?/g, (_, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
        summary: spec.summary,
        description: [spec.description, `Who may call: ${whoText(spec.who)}.`].filter(Boolean).join('\n\n'),
        tags: [tag],
        security:
          spec.who === 'anonymous' ? [] : spec.who === 'signature' ? [{ processorSignature: [] }] : [{ session: [] }],
        'x-ohm-who': Array.isArray(spec.who) ? [...spec.who] : spec.who,
        parameters: parameters(path, spec),
        request: { body: requestBody(spec) },
        responses: responses(spec),
      } as RouteConfig);
    }
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Ohmstead API',
      version: '1.0.0',
      description:
        'Every route of the app, generated from its declaration (lib/http/route.ts). Errors answer ' +
        '{ error: { code, message, fields? } }; a malformed or another space’s id is a 404.',
    },
    servers: [{ url: serverUrl }],
  });
}
