/**
 * ZOH zeros clustered near z = 1 (slow continuous zeros, fast poles) against
 * tests/fixtures/zoh-zeros.json: roots of the exactly built numerator at 80 digits
 * (tests/fixtures/generate_zoh_zeros.py), stored as w = z − 1.
 *
 * Bar: |w − w_ref| ≤ 1e-6·|w_ref| + 2⁻⁵² — relative accuracy in the distance to z = 1 (the
 * quantity the fixed-point sections and the DC gain depend on), plus the spacing of doubles
 * at z = 1, below which no stored z can go. The polynomial-root fallback this replaces was
 * off by 13–22 % on these clusters; the eigenvalue form reaches ~2e-7 on the three-zero
 * cluster (eigenvalues ~1e-5…1e-7 of a matrix of norm ~0.1 carry ε‖Φ − I‖·κ).
 */
import data from '../../fixtures/zoh-zeros.json';
import { discretizeZpk } from '../../../server/dsp/methods';
import { continuousDcGain, discreteDcGain } from '../../../server/dsp/analysis';
import { inputToZpk } from '../../../server/dsp/lti';
import { compensatorSchema } from '../../../schemas/compensator';

type Case = { name: string; compensator: unknown; sampleRateHz: number; zerosMinusOne: { re: number; im: number }[] };
const cases = (data as unknown as { cases: Case[] }).cases;
const ULP1 = 2 ** -52;

describe.each(cases.map((c) => [c.name, c] as const))('ZOH zeros near z = 1: %s', (_n, c) => {
  const h = inputToZpk(compensatorSchema.parse(c.compensator));
  const d = discretizeZpk(h, 'zoh', c.sampleRateHz);
  const ours = d.zpk.zeros.map((z) => ({ re: z.re - 1, im: z.im }));

  it('has every zero of the reference, each to 1e-6 of its distance to z = 1', () => {
    expect(ours.length).toBe(c.zerosMinusOne.length);
    const left = [...ours];
    for (const w of c.zerosMinusOne) {
      let best = 0;
      left.forEach((v, i) => {
        if (Math.hypot(v.re - w.re, v.im - w.im) < Math.hypot(left[best].re - w.re, left[best].im - w.im)) best = i;
      });
      const v = left.splice(best, 1)[0];
      expect(Math.hypot(v.re - w.re, v.im - w.im)).toBeLessThanOrEqual(1e-6 * Math.hypot(w.re, w.im) + ULP1);
    }
  });

  it('puts each zero inside or outside the unit circle as the reference does', () => {
    const inside = (w: { re: number; im: number }) => Math.hypot(1 + w.re, w.im) < 1;
    const refIn = c.zerosMinusOne.filter(inside).length;
    expect(ours.filter(inside).length).toBe(refIn);
  });

  it('gives H(0) from the discrete zeros and poles (step invariance)', () => {
    const dc = continuousDcGain(h)!;
    // 1e-6, plus what storing each z as a double can move Π(1 − zᵢ) by
    const repr = c.zerosMinusOne.reduce((a, w) => a + ULP1 / Math.hypot(w.re, w.im), 0);
    expect(Math.abs(discreteDcGain(d.zpk)! - dc)).toBeLessThanOrEqual((1e-6 + repr) * Math.abs(dc));
  });
});
