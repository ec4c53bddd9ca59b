/**
 * Compute-only timing of runDiscretize (no HTTP): `node --import tsx server/dsp/bench.ts`.
 * The request of `npm run bench`: five methods, a plant, 400 response points.
 * Prints wall-clock median/p95 per call and CPU time per call (the best of several
 * batches, which is what the engine costs when the machine is shared).
 */
import { performance } from 'node:perf_hooks';
import { discretizeRequestSchema } from '../../schemas/discretize';
import { runDiscretize } from './run';

// same request as bench/run.ts (lead–lag, type-1 plant, 400 Hz)
const body = { compensator: { form: 'zpk', zeros: [-0.6, -5], poles: [-0.15, -40], gain: 22 }, sampleRateHz: 400, prewarpHz: 2.2, responsePoints: 400 };
const plant = { form: 'tf', num: [30], den: [1, 4.5, 0] };
const req = discretizeRequestSchema.parse({ ...body, plant });
for (let i = 0; i < 500; i++) runDiscretize(req);
const wall: number[] = [];
for (let i = 0; i < 2000; i++) {
  const t0 = performance.now();
  runDiscretize(req);
  wall.push(performance.now() - t0);
}
wall.sort((a, b) => a - b);
let bestCpu = Infinity;
for (let b = 0; b < 8; b++) {
  const c0 = process.cpuUsage();
  for (let i = 0; i < 200; i++) runDiscretize(req);
  const c = process.cpuUsage(c0);
  bestCpu = Math.min(bestCpu, (c.user + c.system) / 200 / 1000);
}
console.log(`runDiscretize, 5 methods + plant + 400 points: wall median ${wall[1000].toFixed(3)} ms, p95 ${wall[1900].toFixed(3)} ms; CPU ${bestCpu.toFixed(3)} ms per call (best batch)`);
