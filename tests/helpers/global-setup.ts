/** Starts one private MariaDB for the whole test run (own port and data directory). */
import fs from 'node:fs';
import path from 'node:path';
import { ensureMariadbInstalled, startPrivateMariadb, type PrivateDb } from '../../server/db/private-mariadb';
import { freePort } from '../../server/http/ports';

const ROOT = path.resolve(__dirname, '..', '..');


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
