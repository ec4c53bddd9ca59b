/** A fresh, migrated database per test file on the run's private MariaDB. */
import crypto from 'node:crypto';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';

export interface TestDb {
  db: Db;
  name: string;
  connection: { host: string; port: number; user: string; password: string; database: string };
  drop(): Promise<void>;
}

export async function createTestDb(): Promise<TestDb> {
  const port = Number(process.env.SW_TEST_DB_PORT);
  if (!port) throw new Error('SW_TEST_DB_PORT is unset: run through jest (the api/browser globalSetup starts MariaDB)');
  const base = { host: '127.0.0.1', port, user: process.env.SW_TEST_DB_USER!, password: process.env.SW_TEST_DB_PASSWORD! };
  const name = `sw_t_${crypto.randomBytes(5).toString('hex')}`;
  const admin = createDb({ ...base, database: 'sw_test' }, { min: 0, max: 1 });
  await admin.raw(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.destroy();
  const connection = { ...base, database: name };
  const db = createDb(connection);
  await migrateLatest(db);
  return {
    db, name, connection,
    async drop() {
      await db.raw(`DROP DATABASE IF EXISTS \`${name}\``).catch(() => {});
      await db.destroy();
    },
  };
}
