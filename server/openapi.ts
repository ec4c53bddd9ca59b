import { z } from 'zod';
import { apiErrorSchema } from '../schemas/error';

/** Routes describe themselves here when mounted; GET /api/v1/openapi.json renders them. */
export interface RouteDoc {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** Express-style path, e.g. /api/v1/workspaces/:workspaceId/members */
  path: string;
  summary: string;
  tag: string;
  body?: z.ZodType;
  query?: z.ZodType;
  response?: z.ZodType;
  /** which side of `response` is on the wire: 'output' (default), or 'input' where parsing
   *  the answer transforms it (e.g. packed series that parse to numbers) */
  responseIo?: 'input' | 'output';
  /** status of a successful answer, default 200 */
  status?: number;
  /** content type of a non-JSON answer, e.g. application/zip */
  produces?: string;
  auth?: 'none' | 'session' | 'session-or-token';
}

export class OpenApiRegistry {
  private routes: RouteDoc[] = [];

  add(doc: RouteDoc): void {
    this.routes.push(doc);
  }

  list(): readonly RouteDoc[] {
    return this.routes;
  }

  document(version: string): Record<string, unknown> {
    const toSchema = (s: z.ZodType, io: 'input' | 'output') =>
      z.toJSONSchema(s, { io, unrepresentable: 'any', target: 'openapi-3.0' }) as Record<string, unknown>;
    const paths: Record<string, Record<string, unknown>> = {};
    for (const r of this.routes) {
      const oaPath = r.path.replace(/:(\w+)/g, '{$1}');
      const params = [...r.path.matchAll(/:(\w+)/g)].map((m) => ({
        name: m[1], in: 'path', required: true, schema: { type: 'string' },
      }));
      const ok = String(r.status ?? 200);
      const responses: Record<string, unknown> = {
        [ok]: r.produces
          ? { description: 'OK', content: { [r.produces]: { schema: { type: 'string', format: 'binary' } } } }
          : r.response
            ? { description: 'OK', content: { 'application/json': { schema: toSchema(r.response, r.responseIo ?? 'output') } } }
            : { description: 'OK' },
        '4XX': { description: 'Bad request, not signed in, forbidden, not found, conflict, too large or too many',
          content: { 'application/json': { schema: toSchema(apiErrorSchema, 'output') } } },
      };
      const op: Record<string, unknown> = {
        summary: r.summary, tags: [r.tag], responses,
        security: r.auth === 'none' ? [] : r.auth === 'session-or-token' ? [{ session: [] }, { apiToken: [] }] : [{ session: [] }],
      };
      if (params.length) op.parameters = params;
      if (r.body) op.requestBody = { required: true, content: { 'application/json': { schema: toSchema(r.body, 'input') } } };
      (paths[oaPath] ??= {})[r.method] = op;
    }
    return {
      openapi: '3.0.3',
      info: { title: 'Samplewright API', version, description: 'Continuous compensators to reviewed fixed-point C bundles.' },
      paths,
      components: {
        securitySchemes: {
          session: { type: 'apiKey', in: 'cookie', name: 'sw.sid', description: 'non-GET requests also send X-CSRF-Token' },
          apiToken: { type: 'http', scheme: 'bearer' },
        },
      },
    };
  }
}
