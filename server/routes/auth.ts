import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import { changePasswordRequestSchema, loginRequestSchema, sessionInfoSchema, type SessionInfo } from '../../schemas/auth';
import type { AppContext } from '../context';
import { audit, findUserByEmail, membershipsOf } from '../data/users';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { parseOr400, unauthorized, HttpError } from '../http/errors';
import { KnexRateLimitStore } from '../auth/rate-limit-store';

export function authRoutes(ctx: AppContext): Router {
  const { db, registry, csrf } = ctx;
  const r = Router();

  async function sessionInfo(req: Request): Promise<SessionInfo> {
    const user = req.user!;
    return {
      user: { id: user.id, email: user.email, name: user.name },
      memberships: await membershipsOf(db, user.id),
      csrfToken: csrf.generateToken(req),
    };
  }

  // failed sign-ins per address per minute; successful ones are not counted
  const loginLimiter = rateLimit({
    windowMs: 60_000,
    limit: ctx.config.LOGIN_RATE_LIMIT,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new KnexRateLimitStore(db, 'login'),
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'Too many failed sign-ins from this address; wait a minute and try again')),
  });

  registry.add({ method: 'post', path: '/api/v1/auth/login', tag: 'auth', auth: 'none',
    summary: 'Sign in with e-mail and password; sets the session cookie and answers with a CSRF token',
    body: loginRequestSchema, response: sessionInfoSchema });
  r.post('/login', loginLimiter, async (req, res) => {
    const body = parseOr400(loginRequestSchema, req.body);
    req.body = body;
    const user = await new Promise<Express.User | false>((resolve, reject) => {
      ctx.passport.authenticate('local', { session: false }, (err: unknown, u: Express.User | false) =>
        err ? reject(err) : resolve(u),
      )(req, res, reject);
    });
    if (!user) throw unauthorized('Wrong e-mail or password');
    // req.login regenerates the session id (passport 0.7), which drops the old CSRF token
    await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
    res.json(await sessionInfo(req));
  });

  registry.add({ method: 'post', path: '/api/v1/auth/logout', tag: 'auth', status: 204, summary: 'Sign out' });
  r.post('/logout', csrf.csrfSynchronisedProtection, async (req, res) => {
    await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('sw.sid');
    res.status(204).end();
  });

  registry.add({ method: 'get', path: '/api/v1/auth/me', tag: 'auth',
    summary: 'The signed-in user, their workspace memberships with roles, and a CSRF token', response: sessionInfoSchema });
  r.get('/me', async (req, res) => {
    if (!req.user) throw unauthorized('Not signed in');
    res.json(await sessionInfo(req));
  });

  registry.add({ method: 'post', path: '/api/v1/auth/password', tag: 'auth', status: 204, body: changePasswordRequestSchema,
    summary: 'Change the signed-in user\'s password (the current one is asked again); other sessions of the user end' });
  r.post('/password', loginLimiter, csrf.csrfSynchronisedProtection, async (req, res) => {
    if (!req.user) throw unauthorized('Not signed in');
    const body = parseOr400(changePasswordRequestSchema, req.body);
    const row = await findUserByEmail(db, req.user.email);
    if (!row || !(await verifyPassword(body.currentPassword, row.password_hash))) {
      throw new HttpError(400, 'The current password is wrong', [{ path: 'currentPassword', message: 'This is not your current password' }]);
    }
    await db('users').where({ id: row.id }).update({ password_hash: await hashPassword(body.newPassword) });
    // end every other session of this user (a shared or leaked password stops working everywhere)
    await db('auth_sessions')
      .whereRaw("JSON_VALUE(sess, '$.passport.user.id') = ?", [row.id])
      .andWhereNot({ sid: req.sessionID })
      .delete();
    ctx.sessions.forgetUser(row.id, req.sessionID);
    await audit(db, { userId: row.id, action: 'user.password', subject: row.email });
    res.status(204).end();
  });

  return r;
}
