/** Starts one private MariaDB for the whole test run (own port and data directory). */
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { ensureMariadbInstalled, startPrivateMariadb, type PrivateDb } from '../../server/db/private-mariadb';

const ROOT = path.resolve(__dirname, '..', '..');

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const addr = s.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      s.close(() => resolve(port));
    });
  });
}

declare global {
  // eslint-disable-next-line no-var
  var __samplewrightTestDb: { db: PrivateDb; dir: string } | undefined;
}

export default async function globalSetup(): Promise<void> {
  if (process.env.SW_TEST_DB_PORT) return; // already started by another project's setup
  ensureMariadbInstalled();
  const dir = path.join(ROOT, '.test-data', `run-${process.pid}`);
  fs.rmSync(dir, { recursive: true, force: true });
  const port = await freePort();
  const db = await startPrivateMariadb({ dir, port, database: 'sw_test', user: 'sw_test', grant: 'all' });
  globalThis.__samplewrightTestDb = { db, dir };
  process.env.SW_TEST_DB_PORT = String(db.connection.port);
  process.env.SW_TEST_DB_USER = db.connection.user;
  process.env.SW_TEST_DB_PASSWORD = db.connection.password;
}
