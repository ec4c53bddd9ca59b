import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Server } from 'node:http';
import { loadConfig, resolveDataDir, type Config } from './config';
import { connectionFromUrl, createDb, migrateLatest, type Db, type DbConnection } from './db/knex';
import { ensureMariadbInstalled, startPrivateMariadb, type PrivateDb } from './db/private-mariadb';
import { createApp } from './app';
import { closeGracefully } from './http/shutdown';
import { seedDemo } from './seed';
import { ensureWebBuild, ROOT } from './web-build';

/** The demo workspace is seeded when asked for, and never in production. */
export const shouldSeedDemo = (config: Config) => config.SEED_DEMO && config.NODE_ENV !== 'production';

export interface Running {
  config: Config;
  db: Db;
  server: Server;
  url: string;
  stop(): Promise<void>;
}

function sessionSecret(config: Config, dataDir: string): string {
  if (config.SESSION_SECRET) return config.SESSION_SECRET;
  const file = path.join(dataDir, 'session-secret');
  if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
  fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  const s = crypto.randomBytes(32).toString('hex');
  fs.writeFileSync(file, `${s}\n`, { mode: 0o600 });
  return s;
}

/** Everything `npm start` does: database (private or external), migrations, seed, web build, listen. */
export async function boot(env: Record<string, string | undefined> = process.env, log: (l: string) => void = console.log): Promise<Running> {
  const config = loadConfig(env);
  const dataDir = resolveDataDir(config, ROOT);
  let privateDb: PrivateDb | null = null;
  let connection: DbConnection;
  if (config.DATABASE_URL) {
    connection = connectionFromUrl(config.DATABASE_URL);
    log(`Using the external MariaDB at ${connection.host}:${connection.port}/${connection.database}`);
  } else {
    ensureMariadbInstalled(log);
    privateDb = await startPrivateMariadb({
      dir: path.join(dataDir, 'mariadb'), port: config.DB_PORT, database: 'samplewright', user: 'samplewright', grant: 'database', log,
    });
    connection = privateDb.connection;
  }
  const db = createDb(connection);
  try {
    await migrateLatest(db);
    if (shouldSeedDemo(config)) {
      await seedDemo(db);
      log('Demo workspace ready (sign in as owner@example.com / samplewright-demo)');
    }
    const webDir = path.resolve(ROOT, config.WEB_DIR);
    if (config.BUILD_WEB) ensureWebBuild(webDir, log);
    const { app, close } = createApp({
      db, config, sessionSecret: sessionSecret(config, dataDir), webDir, sessionCleanupMs: 15 * 60_000,
    });
    const server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(config.PORT, config.HOST, () => resolve(s));
      s.once('error', reject);
    });
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : config.PORT;
    const url = `http://${config.HOST}:${port}`;
    let stopping: Promise<void> | null = null;
    return {
      config, db, server, url,
      stop: () =>
        (stopping ??= (async () => {
          close();
          await closeGracefully(server);
          await db.destroy();
          await privateDb?.stop();
        })()),
    };
  } catch (e) {
    await db.destroy().catch(() => {});
    await privateDb?.stop();
    throw e;
  }
}
