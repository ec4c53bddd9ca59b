import request from 'supertest';
import { makeTestApp, signIn } from '../helpers/test-server';
import { hashPassword } from '../../server/auth/passwords';

let t: Awaited<ReturnType<typeof makeTestApp>>;
let wsId: number;
let otherWsId: number;
beforeAll(async () => {
  t = await makeTestApp();
  wsId = (await t.db('workspaces').where({ slug: 'tidewater-motion' }).first()).id;
  // a second workspace with its own owner, to check that workspaces stay apart
  [otherWsId] = await t.db('workspaces').insert({ slug: 'elsewhere', name: 'Elsewhere Ltd' });
  const [uid] = await t.db('users').insert({ email: 'stranger@example.com', name: 'S', password_hash: await hashPassword('stranger-pass') });
  await t.db('memberships').insert({ workspace_id: otherWsId, user_id: uid, role: 'owner' });
});
afterAll(async () => {
  await t.cleanup();
});

const base = () => `/api/v1/workspaces/${wsId}/members`;

describe('members', () => {
  it('every member can list the members with roles', async () => {
    const { agent } = await signIn(t.app, 'viewer@example.com');
    const res = await agent.get(base()).expect(200);
    expect(res.body.members.map((m: { email: string; role: string }) => `${m.email}:${m.role}`).sort()).toEqual([
      'engineer@example.com:engineer', 'owner@example.com:owner', 'reviewer@example.com:reviewer', 'viewer@example.com:viewer',
    ]);
  });

  it('a member of another workspace gets 404, not 403', async () => {
    const { agent } = await signIn(t.app, 'stranger@example.com', 'stranger-pass');
    const res = await agent.get(base()).expect(404);
    expect(res.body.error.message).toBe('No such workspace');
    await agent.get('/api/v1/workspaces/999999/members').expect(404);
    await agent.get('/api/v1/workspaces/abc/members').expect(404);
  });

  it('signed out gets 401', async () => {
    await request(t.app).get(base()).expect(401);
  });

  it.each(['viewer', 'reviewer', 'engineer'])('a %s gets 403 for owner actions', async (role) => {
    const { agent, csrf } = await signIn(t.app, `${role}@example.com`);
    await agent.post(base()).set('X-CSRF-Token', csrf).send({ email: 'x@example.com', role: 'viewer' }).expect(403);
    const owner = (await t.db('users').where({ email: 'owner@example.com' }).first()).id;
    await agent.patch(`${base()}/${owner}`).set('X-CSRF-Token', csrf).send({ role: 'viewer' }).expect(403);
    await agent.delete(`${base()}/${owner}`).set('X-CSRF-Token', csrf).expect(403);
  });

  it('the owner adds a new person: a password shown once that signs them in', async () => {
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const res = await agent.post(base()).set('X-CSRF-Token', csrf).send({ email: 'New.Hire@Example.com', role: 'engineer' }).expect(201);
    expect(res.body.member).toEqual(expect.objectContaining({ email: 'new.hire@example.com', role: 'engineer' }));
    expect(res.body.initialPassword).toEqual(expect.any(String));
    const me = await signIn(t.app, 'new.hire@example.com', res.body.initialPassword);
    expect(me.me.memberships[0].role).toBe('engineer');
    // adding the same person again is a conflict, not a second row
    await agent.post(base()).set('X-CSRF-Token', csrf).send({ email: 'new.hire@example.com', role: 'viewer' }).expect(409);
  });

  it('adding an existing account shows no password', async () => {
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const res = await agent.post(base()).set('X-CSRF-Token', csrf).send({ email: 'stranger@example.com', role: 'viewer' }).expect(201);
    expect(res.body.initialPassword).toBeUndefined();
    const del = await agent.delete(`${base()}/${res.body.member.userId}`).set('X-CSRF-Token', csrf);
    expect(del.status).toBe(204);
  });

  it('rejects bad member input naming the field', async () => {
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const res = await agent.post(base()).set('X-CSRF-Token', csrf).send({ email: 'not-an-email', role: 'boss' }).expect(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'role']);
  });

  it('the owner changes a role; the last owner can be neither demoted nor removed', async () => {
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const ownerId = (await t.db('users').where({ email: 'owner@example.com' }).first()).id;
    const reviewerId = (await t.db('users').where({ email: 'reviewer@example.com' }).first()).id;
    const demote = await agent.patch(`${base()}/${ownerId}`).set('X-CSRF-Token', csrf).send({ role: 'engineer' }).expect(409);
    expect(demote.body.error.message).toMatch(/at least one owner/);
    await agent.delete(`${base()}/${ownerId}`).set('X-CSRF-Token', csrf).expect(409);
    const up = await agent.patch(`${base()}/${reviewerId}`).set('X-CSRF-Token', csrf).send({ role: 'owner' }).expect(200);
    expect(up.body.member.role).toBe('owner');
    // with two owners, one may step down
    await agent.patch(`${base()}/${reviewerId}`).set('X-CSRF-Token', csrf).send({ role: 'reviewer' }).expect(200);
    await agent.patch(`${base()}/999999`).set('X-CSRF-Token', csrf).send({ role: 'viewer' }).expect(404);
    const audit = await t.db('audit_events').where({ workspace_id: wsId, action: 'member.role' });
    expect(audit.length).toBe(2);
  });
});
