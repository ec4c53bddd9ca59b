import type { Db } from '../db/knex';
import type { Membership, Role, User } from '../../schemas/auth';

export interface UserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string;
}

export const normalizeEmail = (email: string) => email.trim().toLowerCase();

export async function findUserByEmail(db: Db, email: string): Promise<UserRow | undefined> {
  return db<UserRow>('users').where({ email: normalizeEmail(email) }).first();
}

export async function findUserById(db: Db, id: number): Promise<User | undefined> {
  return db<UserRow>('users').select('id', 'email', 'name').where({ id }).first();
}

export async function createUser(db: Db, u: { email: string; name: string; passwordHash: string }): Promise<number> {
  const [id] = await db('users').insert({ email: normalizeEmail(u.email), name: u.name, password_hash: u.passwordHash });
  return Number(id);
}

export async function membershipsOf(db: Db, userId: number): Promise<Membership[]> {
  const rows = await db('memberships as m')
    .join('workspaces as w', 'w.id', 'm.workspace_id')
    .where('m.user_id', userId)
    .orderBy('w.name')
    .select('w.id', 'w.slug', 'w.name', 'm.role');
  return rows.map((r: { id: number; slug: string; name: string; role: Role }) => ({
    workspace: { id: r.id, slug: r.slug, name: r.name },
    role: r.role,
  }));
}

export async function roleIn(db: Db, userId: number, workspaceId: number): Promise<Role | undefined> {
  const row = await db('memberships').where({ user_id: userId, workspace_id: workspaceId }).first('role');
  return row?.role as Role | undefined;
}

export async function audit(
  db: Db,
  e: { workspaceId?: number | null; userId?: number | null; action: string; subject?: string; detail?: unknown },
): Promise<void> {
  await db('audit_events').insert({
    workspace_id: e.workspaceId ?? null,
    user_id: e.userId ?? null,
    action: e.action,
    subject: e.subject ?? '',
    detail: e.detail === undefined ? null : JSON.stringify(e.detail),
  });
}
