import { errorBody } from '@rinkwright/core';
import { z } from 'zod';
import type { Route } from './route';

const jsonSchema = (schema: z.ZodType, io: 'input' | 'output') =>
  z.toJSONSchema(schema, { target: 'draft-2020-12', io, unrepresentable: 'any' });

/** OpenAPI 3.1 (whose schemas are JSON Schema 2020-12) from the same zod schemas the routes validate with. */
export function buildOpenApi(routes: Route[], serverUrl: string) {
  const paths: Record<string, Record<string, unknown>> = {};
  const errorContent = { 'application/json': { schema: jsonSchema(errorBody, 'output') } };
  for (const route of routes) {
    const path = route.path.replace(/:(\w+)/g, '{$1}');
    const parameters: unknown[] = [];
    for (const [where, schema] of [['path', route.params], ['query', route.query]] as const) {
      if (!schema) continue;
      const shape = jsonSchema(schema, 'input') as { properties?: Record<string, unknown>; required?: string[] };
      for (const [name, property] of Object.entries(shape.properties ?? {})) {
        parameters.push({ name, in: where, required: where === 'path' || (shape.required ?? []).includes(name), schema: property });
      }
    }
    const responses: Record<string, unknown> = {
      [String(route.status)]: { description: 'Success', content: { 'application/json': { schema: jsonSchema(route.response, 'output') } } },
      '400': { description: 'Invalid input, with per-field messages', content: errorContent },
    };
    if (route.access !== 'public') responses['401'] = { description: 'Not signed in', content: errorContent };
    if (route.access === 'rink') {
      responses['403'] = { description: 'Your role does not allow this', content: errorContent };
      responses['404'] = { description: 'No such rink or record, or not yours to see', content: errorContent };
    }
    (paths[path] ??= {})[route.method] = {
      summary: route.summary,
      tags: [route.path.split('/')[route.access === 'rink' ? 4 : 2] ?? 'rink'],
      'x-access': route.access,
      ...(route.permission ? { 'x-permission': route.permission } : {}),
      ...(parameters.length ? { parameters } : {}),
      ...(route.body ? { requestBody: { required: true, content: { 'application/json': { schema: jsonSchema(route.body, 'input') } } } } : {}),
      responses,
    };
  }
  return {
    openapi: '3.1.0',
    info: { title: 'Rinkwright API', version: '1.0.0', description: 'The API behind the Rinkwright app. Sign in through /api/auth (better-auth) to get the session cookie; writes must carry an Origin this server trusts.' },
    servers: [{ url: serverUrl }],
    paths,
  };
}
