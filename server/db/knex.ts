import path from 'node:path';
import knexFactory, { type Knex } from 'knex';

export type Db = Knex;

export interface DbConnection {
  host: string;
  port: number;
  user: string;
  password: string;
  database: string;
}

export function connectionFromUrl(url: string): DbConnection {
  const u = new URL(url);
  if (u.protocol !== 'mysql:' && u.protocol !== 'mariadb:') {
    throw new Error('DATABASE_URL must start with mysql:// or mariadb://');
  }
  return {
    host: u.hostname,
    port: u.port ? Number(u.port) : 3306,
    user: decodeURIComponent(u.username),
    password: decodeURIComponent(u.password),
    database: u.pathname.replace(/^\//, ''),
  };
}

export function createDb(connection: DbConnection, pool = { min: 0, max: 10 }): Db {
  return knexFactory({
    client: 'mysql2',
    connection: { ...connection, charset: 'utf8mb4', timezone: 'Z', dateStrings: false, supportBigNumbers: true },
    pool: {
      ...pool,
      // every connection works in UTC, whatever the server's own time zone
      afterCreate(conn: { query: (sql: string, cb: (err: Error | null) => void) => void }, done: (err: Error | null, conn: unknown) => void) {
        conn.query("SET time_zone = '+00:00'", (err) => done(err, conn));
      },
    },
  });
}

export const MIGRATIONS_DIR = path.resolve(__dirname, '..', '..', 'migrations');

export async function migrateLatest(db: Db): Promise<void> {
  await db.migrate.latest({ directory: MIGRATIONS_DIR, loadExtensions: ['.ts'], tableName: 'knex_migrations' });
}
