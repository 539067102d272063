/** Builds the OpenAPI 3.1 document from the route contracts (zod schemas → JSON Schema). */
import { createDocument, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject } from 'zod-openapi';
import { z } from 'zod';
import { allSpecs } from './index';

const errorSchema = z
  .object({
    error: z.object({
      code: z.string(),
      message: z.string(),
      issues: z.array(z.object({ path: z.array(z.union([z.string(), z.number()])), message: z.string() })).optional(),
    }),
  })
  .meta({ id: 'Error' });

const errorResponse = (description: string) => ({
  description,
  content: { 'application/json': { schema: errorSchema } },
});

function operation(spec: (typeof allSpecs)[number]): ZodOpenApiOperationObject {
  const access =
    spec.access === 'public'
      ? 'Public.'
      : spec.access === 'signed-in'
        ? 'Any signed-in user.'
        : `Roles: ${spec.access.join(', ')}.`;
  const status = String(spec.status ?? 200);
  const ok = spec.response
    ? { description: 'Success', content: { 'application/json': { schema: spec.response } } }
    : spec.responseType
      ? { description: 'Success', content: { [spec.responseType]: { schema: { type: 'string', format: 'binary' } } } }
      : { description: 'Success, no content' };
  return {
    summary: spec.summary,
    description: access,
    tags: [spec.tag],
    ...(spec.params ? { requestParams: { path: spec.params as z.ZodObject } } : {}),
    ...(spec.query
      ? {
          requestParams: {
            ...(spec.params ? { path: spec.params as z.ZodObject } : {}),
            query: spec.query as z.ZodObject,
          },
        }
      : {}),
    ...(spec.body
      ? {
          requestBody: {
            content: { [spec.multipart ? 'multipart/form-data' : 'application/json']: { schema: spec.body } },
          },
        }
      : {}),
    responses: {
      [status]: ok,
      ...(spec.access !== 'public'
        ? { '401': errorResponse('Not signed in'), '403': errorResponse('Missing role') }
        : {}),
      ...(spec.body || spec.query || spec.params
        ? { '422': errorResponse('Invalid input, with the offending fields') }
        : {}),
    },
  } as ZodOpenApiOperationObject;
}

export function buildOpenApiDocument(serverUrl: string) {
  const paths: ZodOpenApiPathsObject = {};
  for (const spec of allSpecs) {
    paths[spec.path] ??= {};
    (paths[spec.path] as Record<string, ZodOpenApiOperationObject>)[spec.method.toLowerCase()] = operation(spec);
  }
  return createDocument({
    openapi: '3.1.0',
    info: {
      title: 'Swardkeep API',
      version: '1',
      description: 'Grassland conversion screening and soil-carbon accounting. Errors always use the Error schema.',
    },
    servers: [{ url: serverUrl }],
    components: { securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'better-auth.session_token' } } },
    security: [{ session: [] }],
    paths,
  });
}
