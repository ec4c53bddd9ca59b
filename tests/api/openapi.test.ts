import request from 'supertest';
import { makeTestApp, signIn } from '../helpers/test-server';

let t: Awaited<ReturnType<typeof makeTestApp>>;
beforeAll(async () => {
  t = await makeTestApp();
});
afterAll(async () => {
  await t.cleanup();
});

describe('GET /api/v1/openapi.json', () => {
  it('is an OpenAPI 3 document with request and answer schemas', async () => {
    const res = await request(t.app).get('/api/v1/openapi.json').expect(200);
    expect(res.body.openapi).toMatch(/^3\./);
    const login = res.body.paths['/api/v1/auth/login'].post;
    expect(login.requestBody.content['application/json'].schema.properties.email).toBeDefined();
    expect(login.responses['200'].content['application/json'].schema.properties.csrfToken).toBeDefined();
    expect(res.body.paths['/api/v1/workspaces/{workspaceId}/members/{userId}'].patch.parameters).toHaveLength(2);
  });

  it('lists only routes that exist: each documented route answers, none with "No such API route"', async () => {
    const doc = (await request(t.app).get('/api/v1/openapi.json').expect(200)).body;
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const ops: string[] = [];
    for (const [p, methods] of Object.entries(doc.paths as Record<string, Record<string, unknown>>)) {
      for (const m of Object.keys(methods)) {
        if (p === '/api/v1/auth/logout') continue; // would end the session of this test
        const url = p.replace(/\{[^}]+\}/g, '1');
        const r = await (agent as unknown as Record<string, (u: string) => request.Test>)[m]!(url).set('X-CSRF-Token', csrf).send({});
        expect(r.status).toBeLessThan(500);
        if (r.status === 404) expect(r.body.error.message).not.toMatch(/No such API route/);
        ops.push(`${m.toUpperCase()} ${p}`);
      }
    }
    // the routes of the foundation, designs and compute are all there
    expect(ops).toEqual(expect.arrayContaining([
      'POST /api/v1/auth/login', 'GET /api/v1/auth/me', 'GET /api/v1/workspaces/{workspaceId}/members',
      'POST /api/v1/workspaces/{workspaceId}/members', 'DELETE /api/v1/workspaces/{workspaceId}/members/{userId}',
      'GET /api/v1/workspaces/{workspaceId}/designs', 'PUT /api/v1/workspaces/{workspaceId}/designs/{designId}/spec',
      'GET /api/v1/openapi.json',
    ]));
  });
});
