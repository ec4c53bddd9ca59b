import { Router } from 'express';
import { performance } from 'node:perf_hooks';
import { discretizeRequestSchema, discretizeResponseSchema } from '../../schemas/discretize';
import type { AppContext } from '../context';
import { requireUser } from '../auth/roles';
import { parseOr400 } from '../http/errors';
import { packedAnswerBody } from '../http/packed-series';
import { runDiscretize } from '../dsp';

/** The stateless compute API of DESIGN.md: a continuous compensator in, discrete implementations out. */
export function discretizeRoutes(ctx: AppContext): Router {
  const r = Router();
  ctx.registry.add({
    method: 'post', path: '/api/v1/discretize', tag: 'compute', auth: 'session-or-token',
    body: discretizeRequestSchema, response: discretizeResponseSchema, responseIo: 'input',
    summary: 'Discretize a continuous compensator by up to five methods and analyse the drift (and the loop, with a plant)',
  });
  r.post('/discretize', requireUser, (req, res) => {
    const body = parseOr400(discretizeRequestSchema, req.body);
    const t0 = performance.now();
    const out = runDiscretize(body);
    // the compute time alone, for clients and for `npm run bench`
    res.setHeader('Server-Timing', `compute;dur=${(performance.now() - t0).toFixed(3)}`);
    if (body.seriesFormat === 'packed') res.type('application/json').send(packedAnswerBody(out));
    else res.json(out);
  });
  return r;
}
