import type { Db } from './db/knex';
import { hashPassword } from './auth/passwords';
import { normalizeEmail } from './data/users';
import type { Role } from '../schemas/auth';
import { designSpecSchema, type DesignSpecInput } from '../schemas/design';
import { createDesign } from './data/designs';

/** The invented demo scenario: a small firm tuning a pan-tilt camera mount and a pump pressure loop. */
export const DEMO_PASSWORD = 'samplewright-demo';
export const DEMO_WORKSPACE = { slug: 'tidewater-motion', name: 'Tidewater Motion Lab' };
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'owner@example.com', name: 'Mira Okonkwo', role: 'owner' },
  { email: 'engineer@example.com', name: 'Tobias Lindqvist', role: 'engineer' },
  { email: 'reviewer@example.com', name: 'Priya Raman', role: 'reviewer' },
  { email: 'viewer@example.com', name: 'Jonah Pike', role: 'viewer' },
];

/** Invented demo designs of the scenario (numbers made up for the demo, not from any source). */
export const DEMO_DESIGNS: { name: string; spec: DesignSpecInput }[] = [
  {
    name: 'Camera mount — tilt axis lead',
    spec: {
      compensator: { form: 'zpk', zeros: [-4], poles: [-30], gain: 18 },
      entry: { form: 'lead', gain: 18, zero: 4, pole: 30 },
      plant: { form: 'tf', num: [42], den: [1, 6, 0] },
      sampleRateHz: 500,
      method: 'tustin',
    },
  },
  {
    name: 'Camera mount — pan axis lead–lag',
    spec: {
      compensator: { form: 'zpk', zeros: [-0.6, -5], poles: [-0.15, -40], gain: 22 },
      entry: { form: 'zpk' },
      plant: { form: 'tf', num: [30], den: [1, 4.5, 0] },
      sampleRateHz: 400,
      method: 'prewarp',
      prewarpHz: 2.2,
    },
  },
  {
    name: 'Feed pump — pressure PI-lead',
    spec: {
      compensator: { form: 'zpk', zeros: [-0.5, -2], poles: [0, -12], gain: 6 },
      entry: { form: 'zpk' },
      plant: { form: 'tf', num: [3.2], den: [1, 0.8] },
      sampleRateHz: 100,
      method: 'zoh',
      prewarpHz: 1.5,
    },
  },
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
  const existing = await db('designs').where({ workspace_id: ws.id }).count({ n: '*' }).first();
  if (Number(existing?.n ?? 0) === 0) {
    for (const d of DEMO_DESIGNS) {
      await createDesign(db, ws.id, ids.engineer!, d.name, designSpecSchema.parse(d.spec));
    }
  }
  if (extra) await extra(db, ws.id, ids);
}
