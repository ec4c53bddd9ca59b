import { Router } from 'express';
import type { AppContext } from '../context';
import { designRoutes } from './designs';
import { discretizeRoutes } from './discretize';
import { implementationRoutes } from './implementation';
import { leadPlacementRoutes } from './lead-placement';

/** Routes beyond sign-in and members: each feature adds its router here. */
export function apiRoutes(ctx: AppContext): Router {
  const r = Router();
  r.use(discretizeRoutes(ctx));
  r.use(implementationRoutes(ctx));
  r.use(leadPlacementRoutes(ctx));
  r.use('/workspaces/:workspaceId/designs', designRoutes(ctx));
  return r;
}
