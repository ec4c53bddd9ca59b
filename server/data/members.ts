import type { Db } from '../db/knex';
import type { Role } from '../../schemas/auth';
import type { Member } from '../../schemas/workspace';

export async function listMembers(db: Db, workspaceId: number): Promise<Member[]> {
  const rows = await db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.workspace_id', workspaceId)
    .orderBy([{ column: 'm.role' }, { column: 'u.email' }])
    .select('u.id as userId', 'u.email', 'u.name', 'm.role');
  return rows.map((r: Member) => ({ userId: Number(r.userId), email: r.email, name: r.name, role: r.role }));
}

export async function getMember(db: Db, workspaceId: number, userId: number): Promise<Member | undefined> {
  return (await listMembers(db, workspaceId)).find((m) => m.userId === userId);
}

/** Owners of a workspace, rows locked when called inside a transaction (last-owner rule). */
export async function lockedOwnerIds(trx: Db, workspaceId: number): Promise<number[]> {
  const rows = await trx('memberships').where({ workspace_id: workspaceId, role: 'owner' }).forUpdate().select('user_id');
  return rows.map((r: { user_id: number }) => Number(r.user_id));
}

export async function addMembership(db: Db, workspaceId: number, userId: number, role: Role): Promise<void> {
  await db('memberships').insert({ workspace_id: workspaceId, user_id: userId, role });
}
