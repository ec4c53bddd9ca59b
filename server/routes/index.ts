import { Router } from 'express';
import type { AppContext } from '../context';

/** Routes beyond sign-in and members: each feature adds its router here. */
export function apiRoutes(ctx: AppContext): Router {
  const r = Router();
  void ctx;
  return r;
}
