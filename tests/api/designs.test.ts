import { makeTestApp, signIn } from '../helpers/test-server';
import { hashPassword } from '../../server/auth/passwords';

let t: Awaited<ReturnType<typeof makeTestApp>>;
let wsId: number;
beforeAll(async () => {
  t = await makeTestApp();
  wsId = (await t.db('workspaces').where({ slug: 'tidewater-motion' }).first()).id;
});
afterAll(async () => {
  await t.cleanup();
});

const base = () => `/api/v1/workspaces/${wsId}/designs`;
const spec = (pole = 18) => ({
  compensator: { form: 'zpk', zeros: [-3], poles: [-pole], gain: 25 },
  entry: { form: 'lead', gain: 25, zero: 3, pole },
  plant: { form: 'tf', num: [8], den: [1, 5, 0] },
  sampleRateHz: 250,
  method: 'tustin',
});

describe('designs and versions', () => {
  it('an engineer creates, saves (new version only on change), renames, archives; a viewer reads', async () => {
    const { agent, csrf } = await signIn(t.app, 'engineer@example.com');
    const created = await agent.post(base()).set('X-CSRF-Token', csrf).send({ name: 'Tilt axis lead', spec: spec() }).expect(201);
    const id = created.body.design.id;
    expect(created.body.latest.number).toBe(1);
    expect(created.body.latest.status).toBe('draft');
    expect(created.body.latest.spec.tolerances).toEqual({ poleDriftPct: 5, dcGainDriftPct: 1, magErrorDb: 1, phaseErrorDeg: 5 });

    const same = await agent.put(`${base()}/${id}/spec`).set('X-CSRF-Token', csrf).send({ spec: spec() }).expect(200);
    expect(same.body).toEqual({ created: false, version: { number: 1, status: 'draft' } });
    const changed = await agent.put(`${base()}/${id}/spec`).set('X-CSRF-Token', csrf).send({ spec: spec(20) }).expect(200);
    expect(changed.body).toEqual({ created: true, version: { number: 2, status: 'draft' } });

    const v1 = await agent.get(`${base()}/${id}/versions/1`).expect(200);
    expect(v1.body.version.spec.compensator.poles).toEqual([-18]);
    expect(v1.body.version.specHash).toMatch(/^[0-9a-f]{64}$/);

    await agent.patch(`${base()}/${id}`).set('X-CSRF-Token', csrf).send({ name: 'Tilt axis lead, rev B' }).expect(200);
    const list = await agent.get(base()).expect(200);
    expect(list.body.designs).toHaveLength(4); // three demo designs and this one
    expect(list.body.designs[0]).toEqual(
      expect.objectContaining({ id, name: 'Tilt axis lead, rev B', archived: false, latestVersion: expect.objectContaining({ number: 2, authorName: 'Tobias Lindqvist' }) }),
    );
    await agent.patch(`${base()}/${id}`).set('X-CSRF-Token', csrf).send({ archived: true }).expect(200);
    const ids = (r: { body: { designs: { id: number }[] } }) => r.body.designs.map((d) => d.id);
    expect(ids(await agent.get(base()).expect(200))).not.toContain(id);
    expect(ids(await agent.get(`${base()}?archived=true`).expect(200))).toEqual([id]);

    const viewer = await signIn(t.app, 'viewer@example.com');
    const detail = await viewer.agent.get(`${base()}/${id}`).expect(200);
    expect(detail.body.versions.map((v: { number: number }) => v.number)).toEqual([2, 1]);
    await viewer.agent.put(`${base()}/${id}/spec`).set('X-CSRF-Token', viewer.csrf).send({ spec: spec(30) }).expect(403);
    const reviewer = await signIn(t.app, 'reviewer@example.com');
    await reviewer.agent.post(base()).set('X-CSRF-Token', reviewer.csrf).send({ name: 'x', spec: spec() }).expect(403);
  });

  it('keeps designs of other workspaces invisible (404)', async () => {
    const { agent, csrf } = await signIn(t.app, 'engineer@example.com');
    const created = await agent.post(base()).set('X-CSRF-Token', csrf).send({ name: 'Pump loop PI-lead', spec: spec() }).expect(201);
    const [otherWs] = await t.db('workspaces').insert({ slug: 'other-co', name: 'Other Co' });
    const [uid] = await t.db('users').insert({ email: 'outsider@example.com', name: 'O', password_hash: await hashPassword('outsider-pass') });
    await t.db('memberships').insert({ workspace_id: otherWs, user_id: uid, role: 'owner' });
    const out = await signIn(t.app, 'outsider@example.com', 'outsider-pass');
    await out.agent.get(`${base()}/${created.body.design.id}`).expect(404);
    await out.agent.get(`/api/v1/workspaces/${otherWs}/designs/${created.body.design.id}`).expect(404);
    await agent.get(`${base()}/${created.body.design.id}/versions/99`).expect(404);
    await agent.get(`${base()}/not-a-number`).expect(404);
  });

  it('rejects bad specs with field paths', async () => {
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const bad = { ...spec(), sampleRateHz: -5, method: 'euler-ish', compensator: { form: 'zpk', zeros: [-3], poles: ['x'], gain: 25 } };
    const res = await agent.post(base()).set('X-CSRF-Token', csrf).send({ name: '', spec: bad }).expect(400);
    const paths = res.body.error.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'spec.sampleRateHz', 'spec.method', 'spec.compensator.poles.0']));
  });
});
