import { Router } from 'express';
import {
  addMemberRequestSchema, addMemberResponseSchema, changeRoleRequestSchema, memberAnswerSchema, memberListSchema,
} from '../../schemas/workspace';
import type { AppContext } from '../context';
import { requireRole, ANY_MEMBER } from '../auth/roles';
import { addMembership, getMember, listMembers, lockedOwnerIds } from '../data/members';
import { audit, createUser, findUserByEmail } from '../data/users';
import { conflict, notFound, parseOr400 } from '../http/errors';
import { idParam } from '../http/params';
import { generatePassword, hashPassword } from '../auth/passwords';

const BASE = '/api/v1/workspaces/:workspaceId/members';

const userIdParam = (raw: unknown) => idParam(raw, 'member');

export function memberRoutes(ctx: AppContext): Router {
  const { db, registry } = ctx;
  const r = Router({ mergeParams: true });
  const owner = requireRole(db, 'owner');

  registry.add({ method: 'get', path: BASE, tag: 'members', summary: 'List the members of a workspace with their roles',
    response: memberListSchema });
  r.get('/', requireRole(db, ...ANY_MEMBER), async (req, res) => {
    res.json({ members: await listMembers(db, req.workspace!.id) });
  });

  registry.add({ method: 'post', path: BASE, tag: 'members', status: 201, body: addMemberRequestSchema,
    response: addMemberResponseSchema,
    summary: 'Add a member by e-mail (owner); a new account gets a password shown once in this answer' });
  r.post('/', owner, async (req, res) => {
    const body = parseOr400(addMemberRequestSchema, req.body);
    const wsId = req.workspace!.id;
    let initialPassword: string | undefined;
    const userId = await db.transaction(async (trx) => {
      const user = await findUserByEmail(trx, body.email);
      let id = user?.id;
      if (!id) {
        initialPassword = generatePassword();
        const name = body.name?.trim() || body.email.split('@')[0]!;
        id = await createUser(trx, { email: body.email, name, passwordHash: await hashPassword(initialPassword) });
      } else if (await trx('memberships').where({ workspace_id: wsId, user_id: id }).first()) {
        throw conflict(`${body.email} is already a member of this workspace`);
      }
      await addMembership(trx, wsId, id, body.role);
      await audit(trx, { workspaceId: wsId, userId: req.user!.id, action: 'member.add', subject: body.email, detail: { role: body.role } });
      return id;
    });
    const member = await getMember(db, wsId, userId);
    res.status(201).json(initialPassword ? { member, initialPassword } : { member });
  });

  registry.add({ method: 'patch', path: `${BASE}/:userId`, tag: 'members', body: changeRoleRequestSchema,
    response: memberAnswerSchema,
    summary: 'Change a member\'s role (owner); the last owner cannot be demoted' });
  r.patch('/:userId', owner, async (req, res) => {
    const body = parseOr400(changeRoleRequestSchema, req.body);
    const wsId = req.workspace!.id;
    const userId = userIdParam(req.params.userId);
    await db.transaction(async (trx) => {
      const owners = await lockedOwnerIds(trx, wsId);
      const current = await trx('memberships').where({ workspace_id: wsId, user_id: userId }).forUpdate().first();
      if (!current) throw notFound('No such member');
      if (current.role === 'owner' && body.role !== 'owner' && owners.length <= 1) {
        throw conflict('A workspace needs at least one owner: make someone else owner first');
      }
      await trx('memberships').where({ workspace_id: wsId, user_id: userId }).update({ role: body.role });
      await audit(trx, { workspaceId: wsId, userId: req.user!.id, action: 'member.role', subject: String(userId), detail: { role: body.role } });
    });
    res.json({ member: await getMember(db, wsId, userId) });
  });

  registry.add({ method: 'delete', path: `${BASE}/:userId`, tag: 'members', status: 204,
    summary: 'Remove a member (owner); the last owner cannot be removed' });
  r.delete('/:userId', owner, async (req, res) => {
    const wsId = req.workspace!.id;
    const userId = userIdParam(req.params.userId);
    await db.transaction(async (trx) => {
      const owners = await lockedOwnerIds(trx, wsId);
      const current = await trx('memberships').where({ workspace_id: wsId, user_id: userId }).forUpdate().first();
      if (!current) throw notFound('No such member');
      if (current.role === 'owner' && owners.length <= 1) {
        throw conflict('The last owner cannot be removed');
      }
      await trx('memberships').where({ workspace_id: wsId, user_id: userId }).delete();
      await audit(trx, { workspaceId: wsId, userId: req.user!.id, action: 'member.remove', subject: String(userId) });
    });
    res.status(204).end();
  });

  return r;
}
