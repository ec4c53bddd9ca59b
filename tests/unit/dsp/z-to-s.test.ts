/**
 * Equivalent s-plane values s = ln(z)/T of z-plane roots, from z = 0 to beyond the unit
 * circle, and sampled loops with a closed-loop pole at or near z = 0 (common with a
 * one-sample computation delay).
 */
import { zToS, rootInfo } from '../../../server/dsp/analysis';
import { runDiscretize } from '../../../server/dsp/run';
import { discretizeRequestSchema, discretizeResponseSchema, type DiscretizeRequestBody } from '../../../schemas/discretize';

const run = (body: DiscretizeRequestBody) => runDiscretize(discretizeRequestSchema.parse(body));
const EPS = Number.EPSILON;

/** ln(1 + w) by its Taylor series Σ (−1)^(k+1) wᵏ/k, complex, for |w| ≤ 1e-3 (12 terms: truncation below 1e-36·|w|). */
function log1pSeries(wr: number, wi: number): { re: number; im: number } {
  let pr = wr;
  let pi = wi;
  let sr = 0;
  let si = 0;
  for (let k = 1; k <= 12; k++) {
    const sign = k % 2 ? 1 : -1;
    sr += (sign * pr) / k;
    si += (sign * pi) / k;
    const t = pr * wr - pi * wi;
    pi = pr * wi + pi * wr;
    pr = t;
  }
  return { re: sr, im: si };
}

describe('zToS: s = ln(z)/T', () => {
  const T = 1e-3;

  it('is the principal logarithm (ln|z| + j·atan2(Im z, Re z))/T for |z| from 1e-300 to 10, and ln(1 + w)/T near z = 1', () => {
    let checked = 0;
    // |z| = 10^e, e from −300 to 1, at angles all round the circle (both sides of the negative real axis)
    for (let e = -300; e <= 1; e += 0.37) {
      const m = Math.pow(10, e);
      for (const deg of [0, 1e-7, 3, 45, 89, 90, 91, 135, 179, 180, -179, -135, -90, -45, -3]) {
        const th = (deg * Math.PI) / 180;
        const z = { re: m * Math.cos(th), im: m * Math.sin(th) };
        const s = zToS(z, T)!;
        // the definition of the principal complex logarithm, with the builtins
        const lnAbs = Math.log(Math.hypot(z.re, z.im));
        const arg = Math.atan2(z.im, z.re);
        const size = Math.hypot(lnAbs, arg);
        // both forms round |z| (or |z|² − 1) once: a few ulp of 1 absolute, a few ulp of ln z relative
        expect(Number.isFinite(s.re) && Number.isFinite(s.im)).toBe(true);
        expect(Math.abs(s.re * T - lnAbs)).toBeLessThanOrEqual(4 * EPS * (1 + Math.abs(lnAbs)));
        expect(Math.abs(s.im * T - arg)).toBeLessThanOrEqual(4 * EPS * size);
        checked++;
      }
    }
    // ln(1e-300) = −300·ln 10 (the smallest magnitudes: the log1p form gave −∞ below |z| ≈ 1e-8)
    expect(Math.abs(zToS({ re: 1e-300, im: 0 }, T)!.re * T - -300 * Math.LN10)).toBeLessThanOrEqual(4 * EPS * 300 * Math.LN10);
    // near z = 1: z = 1 + w with |w| from 1e-15 to 1e-3, against ln(1 + w) by its series (w taken exactly as z − 1)
    for (let e = -15; e <= -3; e += 0.5) {
      for (const deg of [0, 30, 90, 150, 180, 210, 270, 330]) {
        const th = (deg * Math.PI) / 180;
        const re = 1 + Math.pow(10, e) * Math.cos(th);
        const im = Math.pow(10, e) * Math.sin(th);
        const ref = log1pSeries(re - 1, im); // re − 1 is exact here (Sterbenz)
        const s = zToS({ re, im }, T)!;
        const size = Math.hypot(ref.re, ref.im);
        expect(Math.hypot(s.re * T - ref.re, s.im * T - ref.im)).toBeLessThanOrEqual(4 * EPS * size);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(10000);
  });

  it('is finite down to the smallest double and null only at z = 0; root info takes the very negative real parts', () => {
    for (const z of [{ re: 5e-324, im: 0 }, { re: -5e-324, im: 0 }, { re: 0, im: 1e-320 }, { re: 1e-200, im: -1e-200 }]) {
      const s = zToS(z, 1e-7)!; // the highest sample rate, 1e7 Hz: |Re s| up to 745/T ≈ 7.5e9 rad/s
      expect(Number.isFinite(s.re) && Number.isFinite(s.im)).toBe(true);
      const info = rootInfo(z, s, { re: -2e9, im: 0 });
      for (const v of [info.dampingRatio, info.naturalFreqRadPerSec, info.naturalFreqDriftPercent, info.dampingRatioDrift]) expect(Number.isFinite(v)).toBe(true);
    }
    // ln(5e-324) = ln(2⁻¹⁰⁷⁴) = −1074·ln 2
    expect(Math.abs(zToS({ re: 5e-324, im: 0 }, 1)!.re - -1074 * Math.LN2)).toBeLessThanOrEqual(4 * EPS * 1074 * Math.LN2);
    expect(zToS({ re: 0, im: 0 }, 1e-3)).toBeNull();
  });
});

describe('sampled loops with a closed-loop pole near z = 0', () => {
  it('are answered: integrator plant 1/s, gain K, one-sample delay, so z² − z + KT = 0 has a root at ≈ KT = 1e-12', () => {
    const K = 1e-10;
    const fs = 100;
    const T = 1 / fs;
    const res = run({
      compensator: { form: 'zpk', zeros: [], poles: [], gain: K },
      plant: { form: 'zpk', zeros: [], poles: [0], gain: 1 },
      sampleRateHz: fs,
      delaySamples: 1,
      prewarpHz: 1,
    });
    expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
    // ZOH of 1/s is T/(z − 1); with the delay the characteristic polynomial is z(z − 1) + K·T.
    // Its small root by the cancellation-free quadratic formula 2c/(−b + √(b² − 4ac)):
    const small = (2 * K * T) / (1 + Math.sqrt(1 - 4 * K * T));
    for (const m of Object.values(res.methods)) {
      const near0 = m!.loop!.closedLoopPoles.find((p) => Math.hypot(p.z!.re, p.z!.im) < 1e-10)!;
      expect(Math.abs(near0.z!.re - small)).toBeLessThanOrEqual(4 * EPS * small);
      // s = ln(z)/T of a positive real z: ln z/T, damping ratio 1, ωn = |s|
      expect(Math.abs(near0.s!.re - Math.log(small) / T)).toBeLessThanOrEqual(1e-12 * Math.abs(Math.log(small) / T));
      expect(near0.s!.im).toBe(0);
      expect(near0.dampingRatio).toBe(1);
    }
  });

  it('are answered for the order-10 design with a one-sample delay (a closed-loop pole within 1e-18 of z = 0)', () => {
    const poles = Array.from({ length: 10 }, (_, i) => -(i + 1));
    const res = run({ compensator: { form: 'zpk', zeros: [-0.5, -1.5], poles, gain: 5 }, sampleRateHz: 50, plant: { form: 'tf', num: [1], den: [1, 1, 0] }, delaySamples: 1, prewarpHz: 1 });
    expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
    expect(JSON.stringify(res)).not.toMatch(/NaN|Infinity/);
    const tiny = res.methods.tustin!.loop!.closedLoopPoles.filter((p) => p.z !== null && Math.hypot(p.z.re, p.z.im) < 1e-10);
    expect(tiny.length).toBeGreaterThan(0);
    // a positive or negative real z ≠ 0: Re s = ln|z|/T (principal logarithm), finite
    for (const p of tiny) {
      expect(p.s).not.toBeNull(); // z ≠ 0: zToS is null only at z = 0
      expect(p.s!.re).toBeCloseTo(Math.log(Math.hypot(p.z!.re, p.z!.im)) * 50, 6);
    }
  });
});
