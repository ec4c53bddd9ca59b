/**
 * What `npm start` does, end to end, on its own private MariaDB: start, change data, stop
 * (server and mariadbd), start again and find every row.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { boot } from '../../server/boot';
import { DEMO_PASSWORD } from '../../server/seed';
import { freePort } from '../../server/http/ports';


async function login(url: string) {
  const res = await fetch(`${url}/api/v1/auth/login`, {
    method: 'POST', headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'owner@example.com', password: DEMO_PASSWORD }),
  });
  expect(res.status).toBe(200);
  const body = (await res.json()) as { csrfToken: string; memberships: { workspace: { id: number } }[] };
  return { cookie: res.headers.get('set-cookie')!.split(';')[0]!, csrf: body.csrfToken, wsId: body.memberships[0]!.workspace.id };
}

it('keeps data across a stop and a start of the private database', async () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'sw-restart-'));
  const env = { NODE_ENV: 'development', DATA_DIR: dir, DB_PORT: String(await freePort()), PORT: '0', BUILD_WEB: 'false' };
  const quiet = () => {};
  try {
    const first = await boot(env, quiet);
    const a = await login(first.url);
    const add = await fetch(`${first.url}/api/v1/workspaces/${a.wsId}/members`, {
      method: 'POST', headers: { 'Content-Type': 'application/json', cookie: a.cookie, 'X-CSRF-Token': a.csrf },
      body: JSON.stringify({ email: 'kept@example.com', role: 'viewer' }),
    });
    expect(add.status).toBe(201);
    await first.stop();
    expect(fs.existsSync(path.join(dir, 'mariadb', 'db.pid'))).toBe(false); // mariadbd stopped cleanly

    const second = await boot(env, quiet);
    try {
      const b = await login(second.url);
      const list = await fetch(`${second.url}/api/v1/workspaces/${b.wsId}/members`, { headers: { cookie: b.cookie } });
      const emails = ((await list.json()) as { members: { email: string }[] }).members.map((m) => m.email);
      expect(emails).toContain('kept@example.com');
      // the seed ran again without duplicating anything
      expect(emails.filter((e) => e === 'owner@example.com')).toHaveLength(1);
      const designs = await second.db('designs').count({ n: '*' }).first();
      expect(Number(designs?.n)).toBe(3);
    } finally {
      await second.stop();
    }
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}, 120_000);
