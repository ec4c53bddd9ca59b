import { Router } from 'express';
import { leadPlacementRequestSchema, leadPlacementResponseSchema } from '../../schemas/lead-placement';
import type { AppContext } from '../context';
import { requireUser } from '../auth/roles';
import { parseOr400 } from '../http/errors';
import { placeLead } from '../design/lead-placement';

/** Stateless design aid: the lead that puts closed-loop poles at a target ζ, ωn (server/design/lead-placement.ts). */
export function leadPlacementRoutes(ctx: AppContext): Router {
  const r = Router();
  ctx.registry.add({
    method: 'post', path: '/api/v1/lead-placement', tag: 'compute', auth: 'session-or-token',
    body: leadPlacementRequestSchema, response: leadPlacementResponseSchema,
    summary: 'Lead zero, pole and gain that place a closed-loop pole pair at a target damping ratio and natural frequency (root-locus angle and magnitude conditions)',
  });
  r.post('/lead-placement', requireUser, (req, res) => {
    const body = parseOr400(leadPlacementRequestSchema, req.body);
    res.json(placeLead(body));
  });
  return r;
}
