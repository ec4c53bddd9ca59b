import crypto from 'node:crypto';
import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { csrfSync } from 'csrf-sync';
import type { RequestHandler } from 'express';
import type { Db } from '../db/knex';
import { dummyVerify, verifyPassword } from './passwords';
import { findUserByEmail, findUserById } from '../data/users';
import type { User } from '../../schemas/auth';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // the signed-in user as routes see it
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User {
      id: number;
      email: string;
      name: string;
    }
  }
}

export interface SessionOptions {
  db: Db;
  secret: string;
  secureCookies: boolean;
  /** how often expired sessions are swept, ms; 0 disables the timer (tests) */
  cleanupIntervalMs: number;
  /** how long a session read from the database is reused by this process, ms (0: never) */
  cacheMs: number;
}

export const SESSION_COOKIE = 'sw.sid';

/**
 * The Knex session store, with three changes:
 * - a failing get, set, touch or destroy reports to its callback only, instead of also
 *   leaving an unhandled rejection (which would end the process);
 * - a session is touched in the database at most once a minute per process (every request
 *   would otherwise write);
 * - a session read from the database is reused by this process for `cacheMs` (a database
 *   round trip per request otherwise costs more than the rest of a small request). Sign-out,
 *   a password change and every write through this process update the cache at once;
 *   another process sees a session ended elsewhere at most `cacheMs` later (config key
 *   SESSION_CACHE_MS; 0 reads the database on every request).
 */
export class SessionStore extends ConnectSessionKnexStore {
  private lastTouch = new Map<string, number>();
  /** sid → the session as JSON (each hit gets its own copy), its user and when it was read */
  private recent = new Map<string, { json: string; userId: number | null; readAt: number }>();
  private readonly cacheMs: number;

  constructor(options: ConstructorParameters<typeof ConnectSessionKnexStore>[0] & { cacheMs: number }) {
    const { cacheMs, ...rest } = options;
    super(rest);
    this.cacheMs = cacheMs;
  }

  private remember(sid: string, sess: session.SessionData | null): void {
    if (this.cacheMs <= 0) return;
    if (!sess) {
      this.recent.delete(sid);
      return;
    }
    this.recent.delete(sid);
    // full: drop the oldest read (a Map iterates in insertion order)
    if (this.recent.size >= MAX_CACHED_SESSIONS) this.recent.delete(this.recent.keys().next().value!);
    this.recent.set(sid, { json: JSON.stringify(sess), userId: sessionUserId(sess), readAt: Date.now() });
  }

  /** Forget the cached sessions of a user (their other sessions were just ended), except `keepSid`. */
  forgetUser(userId: number, keepSid?: string): void {
    for (const [sid, e] of this.recent) if (e.userId === userId && sid !== keepSid) this.recent.delete(sid);
  }

  override async touch(sid: string, session: session.SessionData, callback?: (err?: unknown) => void): Promise<void> {
    const now = Date.now();
    const last = this.lastTouch.get(sid);
    if (last !== undefined && now - last < TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    if (this.lastTouch.size > 10_000) this.lastTouch.clear();
    try {
      await super.touch(sid, session);
      this.lastTouch.set(sid, now);
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  override async get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): Promise<session.SessionData | null> {
    const hit = this.recent.get(sid);
    if (hit) {
      const now = Date.now();
      const s = now - hit.readAt < this.cacheMs ? (JSON.parse(hit.json) as session.SessionData) : null;
      const expires = s?.cookie?.expires;
      if (s && (!expires || new Date(expires).getTime() > now)) {
        callback(null, s);
        return s;
      }
      this.recent.delete(sid);
    }
    try {
      const s = await super.get(sid, () => {});
      this.remember(sid, s);
      callback(null, s);
      return s;
    } catch (err) {
      callback(err);
      return null;
    }
  }

  override async set(sid: string, sess: session.SessionData, callback?: (err?: unknown) => void): Promise<void> {
    try {
      await super.set(sid, sess);
      this.lastTouch.set(sid, Date.now());
      this.remember(sid, sess);
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  override async destroy(sid: string, callback?: (err?: unknown) => void): Promise<number> {
    this.lastTouch.delete(sid);
    this.recent.delete(sid);
    try {
      const n = await super.destroy(sid);
      callback?.();
      return n;
    } catch (err) {
      callback?.(err);
      return 0;
    }
  }
}

const TOUCH_EVERY_MS = 60_000;
/** Most sessions one process keeps cached (the oldest reads go first). */
const MAX_CACHED_SESSIONS = 10_000;

/** The user id passport keeps in a session, if any. */
function sessionUserId(sess: session.SessionData): number | null {
  const user = (sess as { passport?: { user?: unknown } }).passport?.user;
  if (user && typeof user === 'object' && 'id' in user) return Number((user as { id: unknown }).id);
  return typeof user === 'number' ? user : null;
}

export function createSessionMiddleware(opts: SessionOptions): { middleware: RequestHandler; store: SessionStore } {
  const store = new SessionStore({
    cacheMs: opts.cacheMs,
    knex: opts.db,
    tableName: 'auth_sessions',
    createTable: false,
    cleanupInterval: opts.cleanupIntervalMs,
  });
  const middleware = session({
    name: SESSION_COOKIE,
    secret: opts.secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: opts.secureCookies,
      maxAge: 1000 * 60 * 60 * 12,
    },
  });
  return { middleware, store };
}

/** A passport instance of our own (not the global singleton), so that apps in one process stay apart. */
export function createPassport(db: Db): passport.PassportStatic {
  const p = new passport.Passport() as passport.PassportStatic;
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      (async () => {
        const row = await findUserByEmail(db, email);
        const ok = row ? await verifyPassword(password, row.password_hash) : await dummyVerify(password);
        if (!row || !ok) return done(null, false);
        return done(null, { id: row.id, email: row.email, name: row.name });
      })().catch(done);
    }),
  );
  // the session keeps the user's id, e-mail and name: no query per request to know who it is
  // (roles are read per request by requireRole, so a removed membership takes effect at once)
  p.serializeUser((user, done) => {
    const u = user as User;
    done(null, { id: u.id, email: u.email, name: u.name });
  });
  p.deserializeUser((stored: unknown, done) => {
    if (stored && typeof stored === 'object' && 'id' in stored && 'email' in stored && 'name' in stored) {
      const u = stored as User;
      return done(null, { id: Number(u.id), email: String(u.email), name: String(u.name) });
    }
    // a session written by an older server held only the id
    findUserById(db, Number(stored))
      .then((u) => done(null, u ?? false))
      .catch(done);
  });
  return p;
}

/** CSRF protection (synchronizer token kept in the session). Requests carrying an API
 *  token in `Authorization: Bearer` do not use the cookie and need no token. */
export function createCsrf() {
  return csrfSync({
    getTokenFromRequest: (req) => {
      const h = req.headers['x-csrf-token'];
      return Array.isArray(h) ? h[0] : h;
    },
    // nothing to protect without a signed-in session (the route answers 401); API-token
    // requests carry no cookie authority
    skipCsrfProtection: (req) => !req.user || /^Bearer\s/i.test(req.headers.authorization ?? ''),
    errorConfig: { statusCode: 403, code: 'EBADCSRFTOKEN', message: 'invalid csrf token' },
  });
}

export const randomSecret = () => crypto.randomBytes(32).toString('hex');
