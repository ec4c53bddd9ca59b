/**
 * Crossover refinement on degenerate loops. Regression: a loop whose phase lies on −180°
 * over a stretch (values of the refinement at rounding level, the bracket's sign change
 * lost) was refined to ω = ∞ (a secant through two equal values). The rule checked here is
 * a property of any bracketing method (regula falsi, bisection): the answer lies in the
 * bracket, on the grid's range.
 */
import { discretizeZpk, zohDiscretize } from '../../../server/dsp/methods';
import { inputToZpk } from '../../../server/dsp/lti';
import { crossingGrid, evaluator, findCrossings } from '../../../server/dsp/analysis';
import { compensatorSchema } from '../../../schemas/compensator';
import { METHOD_NAMES } from '../../../schemas/discretize';

// a random hostile design: roots at rounding-level distances from s = 0 and from the jω axis
const compensator = {
  form: 'zpk', zeros: [0, 1.3893760251250984e-71, 0],
  poles: [{ re: 6.384423059619179e-301, im: 0.3681902424977144 }, { re: 6.384423059619179e-301, im: -0.3681902424977144 }, -5.8044611560775084e-98],
  gain: 1.007460330481812,
};
const plant = { form: 'zpk', zeros: [0, -6.938697169880953e-279], poles: [3.5204910380644077e-14, 8.208657647347225e-241], gain: -49.99999999999994 };
const fs = 17.97724267094427;
const T = 1 / fs;

it.each(METHOD_NAMES)('%s: every crossover of the sampled loop is finite and on the grid', (method) => {
  const c = inputToZpk(compensatorSchema.parse(compensator));
  const p = zohDiscretize(inputToZpk(compensatorSchema.parse(plant)), T);
  const d = discretizeZpk(c, method, fs, { prewarpRadPerSec: 2 * Math.PI * 0.017977242670944287 });
  const loop = { zeros: [...d.zpk.zeros, ...p.zpk.zeros], poles: [...d.zpk.poles, ...p.zpk.poles], gain: d.zpk.gain * p.zpk.gain };
  const lo = Math.PI / T / 1e4;
  const hi = Math.PI / T;
  const found = findCrossings(evaluator(loop), crossingGrid(lo, hi, 200, T));
  const omegas = [...found.phase.map((x) => x.omega), ...found.gain.map((x) => x.omega)];
  expect(omegas.length).toBeGreaterThan(0);
  for (const w of omegas) {
    expect(Number.isFinite(w)).toBe(true);
    expect(w).toBeGreaterThanOrEqual(lo * (1 - 1e-12));
    expect(w).toBeLessThanOrEqual(hi * (1 + 1e-12));
  }
});
