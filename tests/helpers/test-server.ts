/** The real app on a fresh demo-seeded database, for supertest or a listening server. */
import type { Server } from 'node:http';
import path from 'node:path';
import request from 'supertest';
import { loadConfig, type Config } from '../../server/config';
import { createApp } from '../../server/app';
import { seedDemo, DEMO_PASSWORD } from '../../server/seed';
import { ROOT } from '../../server/web-build';
import { createTestDb, type TestDb } from './test-db';
import { closeGracefully } from '../../server/http/shutdown';

export const TEST_SECRET = 'test-secret-test-secret-test-secret';

export function testConfig(overrides: Record<string, string> = {}): Config {
  return loadConfig({ NODE_ENV: 'test', PORT: '0', ...overrides });
}

export async function makeTestApp(opts: { testDb?: TestDb; config?: Record<string, string>; web?: boolean } = {}) {
  const testDb = opts.testDb ?? (await createTestDb());
  if (!opts.testDb) await seedDemo(testDb.db);
  const { app, close } = createApp({
    db: testDb.db, config: testConfig(opts.config), sessionSecret: TEST_SECRET,
    webDir: opts.web ? path.join(ROOT, 'dist') : undefined, log: () => {},
  });
  return {
    app, db: testDb.db, testDb,
    async cleanup() {
      close();
      if (!opts.testDb) await testDb.drop();
    },
  };
}

/** Signs in through the API; returns an agent with the cookie and the CSRF token. */
export async function signIn(app: Parameters<typeof request.agent>[0], email: string, password = DEMO_PASSWORD) {
  const agent = request.agent(app);
  const res = await agent.post('/api/v1/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, csrf: res.body.csrfToken as string, me: res.body };
}

/** The app listening on 127.0.0.1, port 0, serving the exported web build (built by the browser globalSetup). */
export async function startTestServer(): Promise<{ baseUrl: string; db: TestDb['db']; stop(): Promise<void> }> {
  const t = await makeTestApp({ web: true });
  const server = await new Promise<Server>((resolve) => {
    const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : 0;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    db: t.db,
    async stop() {
      await closeGracefully(server);
      await t.cleanup();
    },
  };
}
