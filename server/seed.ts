import type { Db } from './db/knex';
import { hashPassword } from './auth/passwords';
import { normalizeEmail } from './data/users';
import type { Role } from '../schemas/auth';

/** The invented demo scenario: a small firm tuning a pan-tilt camera mount and a pump pressure loop. */
export const DEMO_PASSWORD = 'samplewright-demo';
export const DEMO_WORKSPACE = { slug: 'tidewater-motion', name: 'Tidewater Motion Lab' };
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'owner@example.com', name: 'Mira Okonkwo', role: 'owner' },
  { email: 'engineer@example.com', name: 'Tobias Lindqvist', role: 'engineer' },
  { email: 'reviewer@example.com', name: 'Priya Raman', role: 'reviewer' },
  { email: 'viewer@example.com', name: 'Jonah Pike', role: 'viewer' },
];

/** Idempotent: creates what is missing, leaves existing rows (and changed passwords) alone. */
export async function seedDemo(db: Db, extra?: (db: Db, workspaceId: number, users: Record<string, number>) => Promise<void>): Promise<void> {
  let ws = await db('workspaces').where({ slug: DEMO_WORKSPACE.slug }).first();
  if (!ws) {
    await db('workspaces').insert(DEMO_WORKSPACE);
    ws = await db('workspaces').where({ slug: DEMO_WORKSPACE.slug }).first();
  }
  const hash = await hashPassword(DEMO_PASSWORD);
  const ids: Record<string, number> = {};
  for (const u of DEMO_USERS) {
    const email = normalizeEmail(u.email);
    let row = await db('users').where({ email }).first();
    if (!row) {
      await db('users').insert({ email, name: u.name, password_hash: hash });
      row = await db('users').where({ email }).first();
    }
    ids[u.role] = row.id;
    const m = await db('memberships').where({ workspace_id: ws.id, user_id: row.id }).first();
    if (!m) await db('memberships').insert({ workspace_id: ws.id, user_id: row.id, role: u.role });
  }
  if (extra) await extra(db, ws.id, ids);
}
