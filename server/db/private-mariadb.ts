/**
 * A private MariaDB on loopback: its own data directory, port and socket, never the
 * system instance. Used by `npm start` (DATA_DIR) and by the test setup (a temp dir).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export interface PrivateDbOptions {
  /** folder holding data/, the socket, the pid file, the log and the app password */
  dir: string;
  port: number;
  database: string;
  user: string;
  /** 'database' grants only on `database`; 'all' lets the user create databases (tests) */
  grant: 'database' | 'all';
  log?: (line: string) => void;
}

export interface PrivateDb {
  connection: { host: string; port: number; user: string; password: string; database: string };
  stop(): Promise<void>;
}

const SEARCH_PATH = ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin'];

export function findBinary(name: string): string | null {
  const dirs = [...(process.env.PATH ?? '').split(':'), ...SEARCH_PATH];
  for (const d of dirs) {
    if (!d) continue;
    const p = path.join(d, name);
    try {
      fs.accessSync(p, fs.constants.X_OK);
      return p;
    } catch {
      /* keep looking */
    }
  }
  return null;
}

export const APT_COMMAND = 'sudo apt-get update && sudo DEBIAN_FRONTEND=noninteractive apt-get install -y mariadb-server';

/** Installs Debian's mariadb-server when mariadbd is missing (as root); otherwise explains. */
export function ensureMariadbInstalled(log: (l: string) => void = console.log): void {
  if (findBinary('mariadbd') && findBinary('mariadb-install-db')) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    throw new Error(`MariaDB is not installed. Install it with:\n\n  ${APT_COMMAND}\n\nthen run the command again.`);
  }
  log('MariaDB is missing: installing Debian\'s mariadb-server (about 20 s)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const upd = spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  if (upd.status !== 0) throw new Error('apt-get update failed');
  const inst = spawnSync('apt-get', ['install', '-y', '-qq', 'mariadb-server'], { stdio: 'inherit', env });
  if (inst.status !== 0 || !findBinary('mariadbd')) throw new Error('apt-get install mariadb-server failed');
}

function socketPath(dir: string): string {
  const p = path.join(dir, 'db.sock');
  // unix socket paths are limited to ~107 bytes
  if (Buffer.byteLength(p) < 100) return p;
  const h = crypto.createHash('sha1').update(dir).digest('hex').slice(0, 12);
  return path.join(os.tmpdir(), `samplewright-${h}.sock`);
}

function isRoot(): boolean {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}

function client(sock: string, sql: string): { ok: boolean; out: string } {
  const bin = findBinary('mariadb') ?? 'mariadb';
  const r = spawnSync(bin, ['--no-defaults', `--socket=${sock}`, '--user=root', '--batch', '-e', sql], {
    encoding: 'utf8',
  });
  return { ok: r.status === 0, out: `${r.stdout ?? ''}${r.stderr ?? ''}` };
}

function ping(sock: string): boolean {
  const bin = findBinary('mariadb-admin') ?? 'mariadb-admin';
  const r = spawnSync(bin, ['--no-defaults', `--socket=${sock}`, '--user=root', '--connect-timeout=1', 'ping'], {
    encoding: 'utf8',
  });
  return r.status === 0;
}

function readPid(file: string): number | null {
  try {
    const pid = Number(fs.readFileSync(file, 'utf8').trim());
    if (!Number.isInteger(pid) || pid <= 0) return null;
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitForExit(pid: number, timeoutMs: number): Promise<boolean> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    try {
      process.kill(pid, 0);
    } catch {
      return true;
    }
    await sleep(100);
  }
  return false;
}

/** Starts (or adopts a still-running) private mariadbd and makes database and user exist. */
export async function startPrivateMariadb(opts: PrivateDbOptions): Promise<PrivateDb> {
  const log = opts.log ?? (() => {});
  const dir = path.resolve(opts.dir);
  const dataDir = path.join(dir, 'data');
  const sock = socketPath(dir);
  const pidFile = path.join(dir, 'db.pid');
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });

  if (!fs.existsSync(path.join(dataDir, 'mysql'))) {
    log(`Initialising a private MariaDB data directory in ${dataDir}`);
    fs.rmSync(dataDir, { recursive: true, force: true });
    const args = ['--no-defaults', `--datadir=${dataDir}`, '--auth-root-authentication-method=socket', '--skip-test-db'];
    if (isRoot()) args.push('--user=root');
    const r = spawnSync(findBinary('mariadb-install-db') ?? 'mariadb-install-db', args, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stdout}\n${r.stderr}`);
  }

  let child: ChildProcess | null = null;
  let pid = readPid(pidFile);
  if (pid && ping(sock)) {
    log(`Reusing the private MariaDB already running (pid ${pid})`);
  } else {
    const args = [
      '--no-defaults', `--datadir=${dataDir}`, `--port=${opts.port}`, '--bind-address=127.0.0.1',
      `--socket=${sock}`, `--pid-file=${pidFile}`, `--log-error=${path.join(dir, 'db-error.log')}`,
      '--skip-name-resolve', '--character-set-server=utf8mb4', '--collation-server=utf8mb4_unicode_ci',
      '--innodb-buffer-pool-size=64M', '--max-connections=300',
    ];
    if (isRoot()) args.push('--user=root');
    child = spawn(findBinary('mariadbd') ?? 'mariadbd', args, { stdio: 'ignore', detached: false });
    let exited: number | null = null;
    child.on('exit', (code) => {
      exited = code ?? -1;
    });
    const end = Date.now() + 30_000;
    while (!ping(sock)) {
      if (exited !== null) {
        const tail = safeTail(path.join(dir, 'db-error.log'));
        throw new Error(`mariadbd exited (${exited}) before answering; is port ${opts.port} taken?\n${tail}`);
      }
      if (Date.now() > end) throw new Error('mariadbd did not answer within 30 s');
      await sleep(100);
    }
    pid = child.pid ?? readPid(pidFile);
    log(`Private MariaDB listening on 127.0.0.1:${opts.port}`);
  }

  const pwFile = path.join(dir, `${opts.user}.password`);
  let password: string;
  if (fs.existsSync(pwFile)) password = fs.readFileSync(pwFile, 'utf8').trim();
  else {
    password = crypto.randomBytes(18).toString('base64url');
    fs.writeFileSync(pwFile, `${password}\n`, { mode: 0o600 });
  }
  const grant = opts.grant === 'all' ? '*.*' : `\`${opts.database}\`.*`;
  const sql = [
    `CREATE DATABASE IF NOT EXISTS \`${opts.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
    `CREATE USER IF NOT EXISTS '${opts.user}'@'127.0.0.1' IDENTIFIED BY '${password}'`,
    `ALTER USER '${opts.user}'@'127.0.0.1' IDENTIFIED BY '${password}'`,
    `GRANT ALL PRIVILEGES ON ${grant} TO '${opts.user}'@'127.0.0.1'`,
    'FLUSH PRIVILEGES',
  ].join(';\n');
  const r = client(sock, sql);
  if (!r.ok) throw new Error(`could not create database and user: ${r.out}`);

  const ownPid = pid;
  let stopped = false;
  return {
    connection: { host: '127.0.0.1', port: opts.port, user: opts.user, password, database: opts.database },
    async stop() {
      if (stopped) return;
      stopped = true;
      const admin = findBinary('mariadb-admin') ?? 'mariadb-admin';
      spawnSync(admin, ['--no-defaults', `--socket=${sock}`, '--user=root', 'shutdown'], { encoding: 'utf8' });
      if (ownPid && !(await waitForExit(ownPid, 20_000))) {
        try {
          process.kill(ownPid, 'SIGKILL');
        } catch {
          /* already gone */
        }
      }
      log('Private MariaDB stopped');
    },
  };
}

function safeTail(file: string): string {
  try {
    return fs.readFileSync(file, 'utf8').split('\n').slice(-15).join('\n');
  } catch {
    return '';
  }
}
