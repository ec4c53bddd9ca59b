import type { RequestHandler } from 'express';
import type { Db } from '../db/knex';
import type { Role } from '../../schemas/auth';
import { roleIn } from '../data/users';
import { forbidden, notFound, unauthorized } from '../http/errors';
import { idParam } from '../http/params';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** set by requireRole: the workspace of the route and the caller's role in it */
      workspace?: { id: number; role: Role };
    }
  }
}

export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(unauthorized());
  next();
};

/**
 * The one role check: the caller must be a member of `:workspaceId` (else 404, so that
 * workspaces of others stay invisible) with one of `allowed` roles (else 403).
 */
export function requireRole(db: Db, ...allowed: Role[]): RequestHandler {
  return async (req, _res, next) => {
    if (!req.user) throw unauthorized();
    const id = idParam(req.params.workspaceId, 'workspace');
    const role = await roleIn(db, req.user.id, id);
    if (!role) throw notFound('No such workspace');
    if (allowed.length && !allowed.includes(role)) {
      throw forbidden(`This needs the role ${allowed.join(' or ')}; yours is ${role}`);
    }
    req.workspace = { id, role };
    next();
  };
}

export const ANY_MEMBER: Role[] = [];
export const WRITERS: Role[] = ['owner', 'engineer'];
