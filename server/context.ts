import type passport from 'passport';
import type { Config } from './config';
import type { Db } from './db/knex';
import type { OpenApiRegistry } from './openapi';
import type { createCsrf, SessionStore } from './auth/session';

/** What every route module receives from the app factory. */
export interface AppContext {
  db: Db;
  config: Config;
  registry: OpenApiRegistry;
  passport: passport.PassportStatic;
  csrf: ReturnType<typeof createCsrf>;
  log: (msg: string, err?: unknown) => void;
  /** the session store (routes that end sessions tell its cache) */
  sessions: Pick<SessionStore, 'forgetUser'>;
}
