import request from 'supertest';
import { makeTestApp, signIn } from '../helpers/test-server';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/seed';
import { hashPassword } from '../../server/auth/passwords';

let t: Awaited<ReturnType<typeof makeTestApp>>;
beforeAll(async () => {
  t = await makeTestApp();
});
afterAll(async () => {
  await t.cleanup();
});

describe('sign-in', () => {
  it.each(DEMO_USERS)('$email signs in and /me shows the role $role', async (u) => {
    const { agent, me } = await signIn(t.app, u.email);
    expect(me.user.email).toBe(u.email);
    expect(typeof me.csrfToken).toBe('string');
    const res = await agent.get('/api/v1/auth/me').expect(200);
    expect(res.body.memberships).toEqual([
      expect.objectContaining({ role: u.role, workspace: expect.objectContaining({ slug: 'tidewater-motion' }) }),
    ]);
  });

  it('sets an httpOnly, SameSite=Lax session cookie and a new session id at login', async () => {
    const agent = request.agent(t.app);
    // an anonymous session first (a CSRF token is only kept once signed in, so force one via a login failure)
    const res = await agent.post('/api/v1/auth/login').send({ email: 'owner@example.com', password: DEMO_PASSWORD }).expect(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/sw\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
    const sid1 = /sw\.sid=([^;]+)/.exec(cookie)![1];
    const again = await agent.post('/api/v1/auth/login').send({ email: 'owner@example.com', password: DEMO_PASSWORD }).expect(200);
    const sid2 = /sw\.sid=([^;]+)/.exec(String(again.headers['set-cookie']))![1];
    expect(sid2).not.toBe(sid1);
  });

  it('answers a wrong e-mail and a wrong password with the same 401', async () => {
    const a = await request(t.app).post('/api/v1/auth/login').send({ email: 'nobody@example.com', password: 'x' });
    const b = await request(t.app).post('/api/v1/auth/login').send({ email: 'owner@example.com', password: 'wrong' });
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body).toEqual(b.body);
    expect(a.body).toEqual({ error: { message: 'Wrong e-mail or password' } });
  });

  it('/me without a session is 401 in the error shape', async () => {
    const res = await request(t.app).get('/api/v1/auth/me').expect(401);
    expect(res.body.error.message).toEqual(expect.any(String));
  });

  it('rejects a login body with bad fields naming them', async () => {
    const res = await request(t.app).post('/api/v1/auth/login').send({ email: 42 }).expect(400);
    const paths = res.body.error.issues.map((i: { path: string }) => i.path).sort();
    expect(paths).toEqual(['email', 'password']);
  });

  it('answers malformed JSON with 400 in the error shape', async () => {
    const res = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"email": "owner@example.com", ')
      .expect(400);
    expect(res.body).toEqual({ error: { message: 'Malformed JSON body' } });
  });

  it('answers an oversized body with 413', async () => {
    const res = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@b.c', password: 'x'.repeat(300 * 1024) }))
      .expect(413);
    expect(res.body.error.message).toMatch(/larger than the limit/);
  });

  it('signs out: the cookie no longer works', async () => {
    const { agent, csrf } = await signIn(t.app, 'viewer@example.com');
    await agent.post('/api/v1/auth/logout').set('X-CSRF-Token', csrf).expect(204);
    await agent.get('/api/v1/auth/me').expect(401);
  });

  it('refuses a state-changing request without the CSRF token with 403', async () => {
    const { agent, csrf } = await signIn(t.app, 'owner@example.com');
    const res = await agent.post('/api/v1/auth/logout').expect(403);
    expect(res.body.error.message).toMatch(/CSRF/);
    const wrong = await agent.post('/api/v1/auth/logout').set('X-CSRF-Token', 'not-the-token').expect(403);
    expect(wrong.body.error.message).toMatch(/CSRF/);
    await agent.get('/api/v1/auth/me').expect(200); // still signed in
    await agent.post('/api/v1/auth/logout').set('X-CSRF-Token', csrf).expect(204);
  });

  it('answers unknown API routes with 404 JSON', async () => {
    const res = await request(t.app).get('/api/v1/no-such-thing').expect(404);
    expect(res.body.error.message).toMatch(/No such API route/);
  });
});

describe('password change', () => {
  it('asks for the current password, then the new one signs in, the old one does not, and other sessions end', async () => {
    const [uid] = await t.db('users').insert({ email: 'pw@example.com', name: 'P', password_hash: await hashPassword('first-password-123') });
    const wsId = (await t.db('workspaces').first()).id;
    await t.db('memberships').insert({ workspace_id: wsId, user_id: uid, role: 'viewer' });
    const other = await signIn(t.app, 'pw@example.com', 'first-password-123');
    const { agent, csrf } = await signIn(t.app, 'pw@example.com', 'first-password-123');
    const wrong = await agent.post('/api/v1/auth/password').set('X-CSRF-Token', csrf)
      .send({ currentPassword: 'nope', newPassword: 'second-password-456' }).expect(400);
    expect(wrong.body.error.issues[0].path).toBe('currentPassword');
    const short = await agent.post('/api/v1/auth/password').set('X-CSRF-Token', csrf)
      .send({ currentPassword: 'first-password-123', newPassword: 'short' }).expect(400);
    expect(short.body.error.issues[0].path).toBe('newPassword');
    await agent.post('/api/v1/auth/password').send({ currentPassword: 'first-password-123', newPassword: 'second-password-456' }).expect(403);
    await agent.post('/api/v1/auth/password').set('X-CSRF-Token', csrf)
      .send({ currentPassword: 'first-password-123', newPassword: 'second-password-456' }).expect(204);
    await agent.get('/api/v1/auth/me').expect(200); // this session goes on
    await other.agent.get('/api/v1/auth/me').expect(401); // the other one ended
    await request(t.app).post('/api/v1/auth/login').send({ email: 'pw@example.com', password: 'first-password-123' }).expect(401);
    await signIn(t.app, 'pw@example.com', 'second-password-456');
    await t.db('rate_limit_hits').delete();
  });
});

describe('login rate limit', () => {
  it('answers the 11th failed login in a minute from one address with 429, counted in the database', async () => {
    const email = 'engineer@example.com';
    await t.db('rate_limit_hits').delete(); // failures of the tests above
    for (let i = 0; i < 10; i++) {
      await request(t.app).post('/api/v1/auth/login').send({ email, password: `wrong-${i}` }).expect(401);
    }
    const res = await request(t.app).post('/api/v1/auth/login').send({ email, password: DEMO_PASSWORD }).expect(429);
    expect(res.body.error.message).toMatch(/Too many failed sign-ins/);
    const rows = await t.db('rate_limit_hits').where('key', 'like', 'login:%');
    expect(rows.length).toBe(1);
    expect(rows[0].hits).toBeGreaterThanOrEqual(11);
    await t.db('rate_limit_hits').delete();
  });
});
