/**
 * Response headers: API answers carry the API set (OWASP REST Security Cheat Sheet, from
 * memory: no-store, nosniff, no framing); the web app's pages carry helmet's set with the
 * content security policy of the exported build.
 */
import request from 'supertest';
import { makeTestApp, signIn } from '../helpers/test-server';

let t: Awaited<ReturnType<typeof makeTestApp>>;
beforeAll(async () => {
  t = await makeTestApp();
});
afterAll(async () => {
  await t.cleanup();
});

const expectApiSet = (h: Record<string, string>) => {
  expect(h['cache-control']).toBe('no-store');
  expect(h['x-content-type-options']).toBe('nosniff');
  expect(h['content-security-policy']).toBe("default-src 'none'; frame-ancestors 'none'");
  expect(h['x-frame-options']).toBe('DENY');
  expect(h['referrer-policy']).toBe('no-referrer');
};

it('API answers, errors included, carry the API set', async () => {
  expectApiSet((await request(t.app).get('/api/v1/health').expect(200)).headers);
  expectApiSet((await request(t.app).get('/api/v1/no-such-route').expect(404)).headers);
  expectApiSet((await request(t.app).get('/api/v2/anything').expect(404)).headers);
  const { agent, csrf } = await signIn(t.app, 'viewer@example.com');
  const res = await agent.post('/api/v1/discretize').set('X-CSRF-Token', csrf)
    .send({ compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 }, sampleRateHz: 250, seriesFormat: 'packed' }).expect(200);
  expectApiSet(res.headers);
  expect(res.headers['content-type']).toMatch(/^application\/json/);
});

it('web pages carry helmet\'s set with our content security policy', async () => {
  const h = (await request(t.app).get('/').expect(200)).headers;
  expect(h['content-security-policy']).toMatch(/default-src 'self'/);
  expect(h['content-security-policy']).toMatch(/style-src 'self' 'unsafe-inline'/);
  expect(h['x-content-type-options']).toBe('nosniff');
  expect(h['strict-transport-security']).toBeUndefined(); // HTTPS=false
});
