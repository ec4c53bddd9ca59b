import crypto from 'node:crypto';
import { makeTestApp, signIn } from '../helpers/test-server';

let t: Awaited<ReturnType<typeof makeTestApp>>;
let wsId: number;
beforeAll(async () => {
  t = await makeTestApp();
  wsId = (await t.db('workspaces').where({ slug: 'tidewater-motion' }).first()).id;
});
afterAll(async () => {
  await t.cleanup();
});

const lead = { form: 'zpk', zeros: [-4], poles: [-30], gain: 18 };
const settings = { wordLength: 16, inputScale: 3.3 / 4096, outputScale: 1 / 1000, outputLimits: { min: -1000, max: 1000 }, prefix: 'tilt_lead' };
const sha = (b: Buffer) => crypto.createHash('sha256').update(b).digest('hex');

function binary(res: import('node:http').IncomingMessage, cb: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

describe('POST /api/v1/implement (preview)', () => {
  it('answers the analysis and the C files for a lead', async () => {
    const { agent, csrf } = await signIn(t.app, 'viewer@example.com');
    const res = await agent.post('/api/v1/implement').set('X-CSRF-Token', csrf)
      .send({ compensator: lead, sampleRateHz: 500, method: 'tustin', settings }).expect(200);
    expect(res.body.analysis.wordLength).toBe(16);
    expect(res.body.analysis.coefficients.length).toBeGreaterThan(0);
    const paths = res.body.files.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(['include/tilt_lead.h', 'src/tilt_lead.c', 'test/vectors.csv', 'Makefile', 'manifest.json', 'README.md']));
  });

  it.each([
    ['a C keyword as prefix', { ...settings, prefix: 'int' }, 'settings.prefix'],
    ['word length 12', { ...settings, wordLength: 12 }, 'settings.wordLength'],
    ['limits reversed', { ...settings, outputLimits: { min: 1000, max: -1000 } }, 'settings.outputLimits.max'],
    ['an output scale of 0', { ...settings, outputScale: 0 }, 'settings.outputScale'],
  ])('refuses %s with 400 naming the field', async (_w, bad, path) => {
    const { agent, csrf } = await signIn(t.app, 'engineer@example.com');
    const res = await agent.post('/api/v1/implement').set('X-CSRF-Token', csrf)
      .send({ compensator: lead, sampleRateHz: 500, method: 'tustin', settings: bad }).expect(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain(path);
  });
});

describe('bundles of design versions', () => {
  it('generates once per version, downloads the same bytes, regenerates them identically', async () => {
    const eng = await signIn(t.app, 'engineer@example.com');
    const created = await eng.agent.post(`/api/v1/workspaces/${wsId}/designs`).set('X-CSRF-Token', eng.csrf)
      .send({ name: 'Bundle check', spec: { compensator: lead, sampleRateHz: 500, method: 'tustin' } }).expect(201);
    const id = created.body.design.id;
    const vbase = (n: number) => `/api/v1/workspaces/${wsId}/designs/${id}/versions/${n}`;

    // version 1 has no implementation settings
    const missing = await eng.agent.post(`${vbase(1)}/bundle`).set('X-CSRF-Token', eng.csrf).expect(400);
    expect(missing.body.error.issues[0].path).toBe('spec.implementation');

    const saved = await eng.agent.put(`/api/v1/workspaces/${wsId}/designs/${id}/spec`).set('X-CSRF-Token', eng.csrf)
      .send({ spec: { ...created.body.latest.spec, implementation: settings } }).expect(200);
    expect(saved.body.version.number).toBe(2);

    const viewer = await signIn(t.app, 'viewer@example.com');
    await viewer.agent.post(`${vbase(2)}/bundle`).set('X-CSRF-Token', viewer.csrf).expect(403);
    await viewer.agent.get(`${vbase(2)}/bundle`).expect(404);

    const first = await eng.agent.post(`${vbase(2)}/bundle`).set('X-CSRF-Token', eng.csrf).expect(201);
    expect(first.body.bundle).toEqual(expect.objectContaining({ fileName: 'tilt_lead-v2.zip', versionNumber: 2, sha256: expect.stringMatching(/^[0-9a-f]{64}$/) }));
    const again = await eng.agent.post(`${vbase(2)}/bundle`).set('X-CSRF-Token', eng.csrf).expect(200);
    expect(again.body.bundle.sha256).toBe(first.body.bundle.sha256);

    const zip = await viewer.agent.get(`${vbase(2)}/bundle.zip`).buffer(true).parse(binary as never).expect(200);
    expect(zip.headers['content-type']).toBe('application/zip');
    expect(zip.headers['content-disposition']).toBe('attachment; filename="tilt_lead-v2.zip"');
    expect(sha(zip.body as Buffer)).toBe(first.body.bundle.sha256);
    expect((zip.body as Buffer).length).toBe(first.body.bundle.sizeBytes);
    const downloads = await t.db('downloads').count({ n: '*' }).first();
    expect(Number(downloads?.n)).toBe(1);

    const files = await viewer.agent.get(`${vbase(2)}/bundle/files`).expect(200);
    const manifest = JSON.parse(files.body.files.find((f: { path: string }) => f.path === 'manifest.json').content);
    expect(JSON.stringify(manifest)).toContain('Bundle check');

    // drop the stored bundle and generate again: byte-identical
    await t.db('bundles').delete();
    const regenerated = await eng.agent.post(`${vbase(2)}/bundle`).set('X-CSRF-Token', eng.csrf).expect(201);
    expect(regenerated.body.bundle.sha256).toBe(first.body.bundle.sha256);

    await eng.agent.get(`${vbase(9)}/bundle.zip`).expect(404);
  });
});
