/** The OpenAPI 3.1 document, generated from the route declarations and their zod schemas. */
import { z } from 'zod';
import { errorBody } from '../shared/common.js';
import type { RouteSpec } from './routing.js';

function jsonSchema(schema: z.ZodType, io: 'input' | 'output') {
  const { $schema: _ignored, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any' }) as Record<string, unknown>;
  return rest;
}

function parameters(schema: z.ZodType | undefined, location: 'path' | 'query') {
  if (!schema) return [];
  const object = jsonSchema(schema, 'input') as { properties?: Record<string, unknown>; required?: string[] };
  return Object.entries(object.properties ?? {}).map(([name, property]) => ({
    name,
    in: location,
    required: location === 'path' || (object.required ?? []).includes(name),
    schema: property,
  }));
}

const errorResponse = (description: string) => ({
  description,
  content: { 'application/json': { schema: jsonSchema(errorBody, 'output') } },
});

export function buildOpenApiDocument(routes: RouteSpec[], version: string) {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const spec of routes) {
    const path = `/api${spec.path}`.replace(/:(\w+)/g, '{$1}');
    const status = String(spec.status ?? 200);
    const success = spec.produces
      ? { description: 'OK', content: { [spec.produces]: {} } }
      : status === '204'
        ? { description: 'No content' }
        : { description: 'OK', content: { 'application/json': { schema: spec.response ? jsonSchema(spec.response, 'output') : {} } } };
    const responses: Record<string, unknown> = { [status]: success, '400': errorResponse('Invalid input; details name the field') };
    if (spec.access !== 'public') {
      responses['401'] = errorResponse('Not signed in');
      responses['403'] = errorResponse('Role not allowed or CSRF token missing');
    }
    if (spec.path.includes(':id')) responses['404'] = errorResponse('Not found, or another organisation’s');
    if (spec.method === 'patch') responses['409'] = errorResponse('Stale version: someone saved first');
    (paths[path] ??= {})[spec.method] = {
      summary: spec.summary,
      tags: [spec.tag],
      'x-roles': spec.access,
      parameters: [...parameters(spec.params, 'path'), ...parameters(spec.query, 'query')],
      ...(spec.body ? { requestBody: { required: true, content: { 'application/json': { schema: jsonSchema(spec.body, 'input') } } } } : {}),
      responses,
    };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Statorline API',
      version,
      description:
        'JSON over /api. Sign in with POST /api/auth/login; state-changing requests carry the token of GET /api/auth/csrf in the x-csrf-token header. Lists take page, pageSize, sort (field or -field) and answer { items, total, page, pageSize }. Errors: { error: { code, message, details } }.',
    },
    components: { securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'statorline.sid' } } },
    security: [{ session: [] }],
    paths,
  };
}
