/** Bundle generation time (render + vectors + zip), in process, on a demo-like lead–lag. */
import { performance } from 'node:perf_hooks';
import { buildBundle } from '../server/codegen';
import { discreteOf } from '../server/codegen/from-spec';
import { summary } from './stats';

export async function benchBundle(runs = 200): Promise<{ median: number; p95: number; n: number }> {
  const src = { compensator: { form: 'zpk' as const, zeros: [-0.6, -5], poles: [-0.15, -40], gain: 22 }, method: 'tustin' as const, sampleRateHz: 400 };
  const discrete = discreteOf(src);
  const settings = { wordLength: 16 as const, inputScale: 3.3 / 4096, outputScale: 1 / 1000, outputLimits: { min: -1000, max: 1000 }, prefix: 'pan_lead_lag' };
  const times: number[] = [];
  for (let i = 0; i < runs + 20; i++) {
    const t0 = performance.now();
    await buildBundle({ designName: 'bench', versionNumber: 1, method: src.method, sampleRateHz: src.sampleRateHz, compensatorAsEntered: src.compensator, discrete, settings });
    if (i >= 20) times.push(performance.now() - t0);
  }
  return summary(times);
}
