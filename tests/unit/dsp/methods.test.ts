import { discretizeZpk } from '../../../server/dsp/methods';
import { evalZpk } from '../../../server/dsp/lti';
import { continuousDcGain, discreteDcGain } from '../../../server/dsp/analysis';
import { DspInputError } from '../../../server/dsp/errors';
import { runDiscretize } from '../../../server/dsp/run';
import { discretizeRequestSchema } from '../../../schemas/discretize';
import type { Zpk } from '../../../server/dsp/types';
import { c, expectComplexClose, relToLargest } from './helpers';

const lead: Zpk = { zeros: [c(-3)], poles: [c(-18)], gain: 25 };
const leadLagComplex: Zpk = { zeros: [c(-1, 2), c(-1, -2), c(-0.3)], poles: [c(-4, 6), c(-4, -6), c(-0.05), c(-30)], gain: 12 };
const piLead: Zpk = { zeros: [c(-0.5), c(-4)], poles: [c(0), c(-30)], gain: 12 };

describe('Tustin (bilinear) — identities of the method', () => {
  it('maps every pole by z = (1 + sT/2)/(1 − sT/2) (definition of the bilinear map)', () => {
    const T = 1 / 50;
    const d = discretizeZpk(leadLagComplex, 'tustin', 50);
    leadLagComplex.poles.forEach((s, i) => {
      const num = c(1 + (s.re * T) / 2, (s.im * T) / 2);
      const den = c(1 - (s.re * T) / 2, (-s.im * T) / 2);
      const q = den.re * den.re + den.im * den.im;
      const expected = c((num.re * den.re + num.im * den.im) / q, (num.im * den.re - num.re * den.im) / q);
      expectComplexClose(d.zpk.poles[i], expected, 1e-15);
    });
    // one zero at infinity (4 poles, 3 zeros) goes to z = −1
    expect(d.zpk.zeros).toHaveLength(4);
    expect(d.zpk.zeros[3]).toEqual(c(-1));
  });

  it('equals H(s) at s = (2/T)(z − 1)/(z + 1) for any z (the substitution itself)', () => {
    const fs = 40;
    const T = 1 / fs;
    const d = discretizeZpk(leadLagComplex, 'tustin', fs);
    for (const z of [c(0.3, 0.4), c(-0.7, 0.1), c(2, -1)]) {
      const zp1 = c(z.re + 1, z.im);
      const zm1 = c(z.re - 1, z.im);
      const q = zp1.re * zp1.re + zp1.im * zp1.im;
      const s = c(((2 / T) * (zm1.re * zp1.re + zm1.im * zp1.im)) / q, ((2 / T) * (zm1.im * zp1.re - zm1.re * zp1.im)) / q);
      expectComplexClose(evalZpk(d.zpk, z), evalZpk(leadLagComplex, s), 1e-12);
    }
  });

  it('keeps the DC gain (z = 1 ↔ s = 0)', () => {
    const d = discretizeZpk(leadLagComplex, 'tustin', 37);
    expect(discreteDcGain(d.zpk)!).toBeCloseTo(continuousDcGain(leadLagComplex)!, 12);
  });

  it('maps s = 0 to z = 1 exactly (PI-lead keeps its integrator)', () => {
    for (const m of ['tustin', 'prewarp', 'matched', 'backward-euler', 'zoh'] as const) {
      const d = discretizeZpk(piLead, m, 100, { prewarpRadPerSec: 3 });
      expect(d.zpk.poles.some((p) => p.re === 1 && p.im === 0)).toBe(true);
      expect(d.tf.den.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 13);
    }
  });
});

describe('prewarped Tustin', () => {
  it('is exact at ω₀: H_d(e^{jω₀T}) = H(jω₀) (the property prewarping exists for)', () => {
    const fs = 30;
    for (const w0 of [1, 7.35, 60]) {
      const d = discretizeZpk(leadLagComplex, 'prewarp', fs, { prewarpRadPerSec: w0 });
      const hz = evalZpk(d.zpk, c(Math.cos(w0 / fs), Math.sin(w0 / fs)));
      expectComplexClose(hz, evalZpk(leadLagComplex, c(0, w0)), 1e-12);
    }
  });

  it('differs from plain Tustin at ω₀ (so the check above can fail)', () => {
    const fs = 30;
    const w0 = 60;
    const d = discretizeZpk(leadLagComplex, 'tustin', fs);
    const hz = evalZpk(d.zpk, c(Math.cos(w0 / fs), Math.sin(w0 / fs)));
    const hs = evalZpk(leadLagComplex, c(0, w0));
    expect(Math.hypot(hz.re - hs.re, hz.im - hs.im)).toBeGreaterThan(1e-3);
  });

  it('refuses a missing ω₀', () => {
    expect(() => discretizeZpk(lead, 'prewarp', 100)).toThrow(DspInputError);
  });
});

describe('zero-order hold', () => {
  it('ZOH of a/(s + a) is (1 − e^{−aT})z⁻¹/(1 − e^{−aT}z⁻¹) (step invariance, first order)', () => {
    for (const [a, fs] of [[2, 10], [50, 1000], [3, 1e6]]) {
      const T = 1 / fs;
      const d = discretizeZpk({ zeros: [], poles: [c(-a)], gain: a }, 'zoh', fs);
      const e = Math.exp(-a * T);
      expect(d.tf.den).toEqual([1, -e]);
      expect(d.tf.num[0]).toBe(0);
      expect(Math.abs(d.tf.num[1] - -Math.expm1(-a * T)) / -Math.expm1(-a * T)).toBeLessThan(1e-13);
    }
  });

  it('ZOH of 1/(s(s + 1)) at T = 1 s: (0.3679 z + 0.2642)/((z − 1)(z − 0.3679)) (textbook worked example, from memory: Ogata, Discrete-Time Control Systems)', () => {
    const d = discretizeZpk({ zeros: [], poles: [c(0), c(-1)], gain: 1 }, 'zoh', 1);
    const e = Math.exp(-1);
    // closed form: [(T − 1 + e^{−T}) z + (1 − e^{−T} − T e^{−T})] / ((z − 1)(z − e^{−T}))
    expect(relToLargest(d.tf.num, [0, e, 1 - 2 * e])).toBeLessThan(1e-15);
    expect(d.tf.num[1]).toBeCloseTo(0.3679, 4);
    expect(d.tf.num[2]).toBeCloseTo(0.2642, 4);
    expect(relToLargest(d.tf.den, [1, -(1 + e), e])).toBeLessThan(1e-15);
  });

  it('ZOH of 1/s² is T²(z + 1)/(2(z − 1)²) (double integrator, textbook result, from memory)', () => {
    const T = 0.01;
    const d = discretizeZpk({ zeros: [], poles: [c(0), c(0)], gain: 1 }, 'zoh', 1 / T);
    expect(relToLargest(d.tf.num, [0, (T * T) / 2, (T * T) / 2])).toBeLessThan(1e-13);
    expect(d.tf.den).toEqual([1, -2, 1]);
  });

  it('keeps a lead accurate at T = 1 µs (closed form K + K(z₀ − p)(1 − e^{−pT})/(p(z − e^{−pT})))', () => {
    const fs = 1e6;
    const T = 1 / fs;
    const [K, z0, p] = [25, 3, 18];
    const d = discretizeZpk(lead, 'zoh', fs);
    const e = Math.exp(-p * T);
    const b1 = -K * e + (K * (z0 - p) * -Math.expm1(-p * T)) / p;
    expect(relToLargest(d.tf.num, [K, b1])).toBeLessThan(1e-15);
    // the zero: z = 1 − z₀T + … ; the numerator root must sit at −b1/K
    expect(Math.abs(d.zpk.zeros[0].re - -b1 / K)).toBeLessThan(1e-15);
  });

  it('keeps the DC gain (step invariance: H_d(1) = H(0))', () => {
    for (const fs of [5, 50, 5000]) {
      const d = discretizeZpk(leadLagComplex, 'zoh', fs);
      // from the structure (product form); Σnum/Σden would cancel at high rates
      const dc = continuousDcGain(leadLagComplex)!;
      expect(Math.abs(discreteDcGain(d.zpk)! - dc) / dc).toBeLessThan(1e-8);
    }
  });

  it('has poles exactly e^{pT} and num[0] = 0 for a strictly proper H(s)', () => {
    const h: Zpk = { zeros: [c(-2)], poles: [c(-1, 3), c(-1, -3), c(-7)], gain: 4 };
    const d = discretizeZpk(h, 'zoh', 20);
    const T = 1 / 20;
    expect(d.zpk.poles[0]).toEqual({ re: Math.exp(-1 * T) * Math.cos(3 * T), im: Math.exp(-1 * T) * Math.sin(3 * T) });
    expect(d.tf.num[0]).toBe(0);
    expect(d.tf.num).toHaveLength(4);
  });
});

describe('backward Euler', () => {
  it('maps s to z = 1/(1 − sT), zeros at infinity to z = 0, and equals H((z − 1)/(Tz))', () => {
    const fs = 25;
    const T = 1 / fs;
    const d = discretizeZpk(leadLagComplex, 'backward-euler', fs);
    expectComplexClose(d.zpk.poles[3], c(1 / (1 + 30 * T)), 1e-15);
    expect(d.zpk.zeros[3]).toEqual(c(0));
    const z = c(0.2, 0.9);
    const zz = z.re * z.re + z.im * z.im;
    // (z − 1)/(T z) = (1 − 1/z)/T
    const s = c((1 - z.re / zz) / T, (z.im / zz) / T);
    expectComplexClose(evalZpk(d.zpk, z), evalZpk(leadLagComplex, s), 1e-12);
  });
});

describe('matched pole–zero', () => {
  it('maps finite roots by e^{sT}, zeros at infinity to −1, and matches the DC gain', () => {
    const fs = 60;
    const d = discretizeZpk(leadLagComplex, 'matched', fs);
    expect(d.zpk.poles[3]).toEqual(c(Math.exp(-30 / fs)));
    expect(d.zpk.zeros[3]).toEqual(c(-1));
    expect(discreteDcGain(d.zpk)!).toBeCloseTo(continuousDcGain(leadLagComplex)!, 12);
  });

  it('keeps the DC gain at 1 MHz (expm1 instead of 1 − e^{sT})', () => {
    const d = discretizeZpk(lead, 'matched', 1e6);
    const direct = (25 * 3) / 18;
    // K_d (1 − e^{−3T})/(1 − e^{−18T}) must equal 25·3/18
    const kd = d.zpk.gain;
    expect(Math.abs((kd * -Math.expm1(-3e-6)) / -Math.expm1(-18e-6) - direct) / direct).toBeLessThan(1e-14);
  });

  it('matches |H| at ω₀ with the sign of K when the DC gain is infinite (PI-lead)', () => {
    const fs = 100;
    const w0 = 2;
    for (const K of [12, -12]) {
      const h = { ...piLead, gain: K };
      const d = discretizeZpk(h, 'matched', fs, { prewarpRadPerSec: w0 });
      const hz = evalZpk(d.zpk, c(Math.cos(w0 / fs), Math.sin(w0 / fs)));
      const hs = evalZpk(h, c(0, w0));
      expect(Math.hypot(hz.re, hz.im)).toBeCloseTo(Math.hypot(hs.re, hs.im), 12);
      expect(Math.sign(d.zpk.gain)).toBe(Math.sign(K));
    }
    expect(() => discretizeZpk(piLead, 'matched', 100)).toThrow(DspInputError);
  });

  it('matches |H| at ω₀ without cancellation when ω₀T is tiny: PI (s + a)/s at 10 MHz, prewarpHz 0.001', () => {
    // H_d = K_d (z − e^{−aT})/(z − 1); with θ = ω₀T and b = e^{−aT}, by the law of cosines
    // |e^{jθ} − b|² = (1 − b)² + 4b·sin²(θ/2) and |e^{jθ} − 1| = 2 sin(θ/2), so the rule
    // |H_d(e^{jθ})| = |H(jω₀)| = √(ω₀² + a²)/ω₀ gives K_d in closed form, every term cancellation-free
    const a = 0.01;
    const fs = 1e7;
    const T = 1 / fs;
    const w0 = 2 * Math.PI * 0.001;
    const d = discretizeZpk({ zeros: [c(-a)], poles: [c(0)], gain: 1 }, 'matched', fs, { prewarpRadPerSec: w0 });
    const b = Math.exp(-a * T);
    const s2 = Math.sin((w0 * T) / 2);
    const kd = ((Math.hypot(w0, a) / w0) * 2 * s2) / Math.sqrt(Math.expm1(-a * T) ** 2 + 4 * b * s2 * s2);
    expect(Math.abs(d.tf.num[0] - kd)).toBeLessThanOrEqual(1e-15 * kd); // 1.0000000005 (subtraction gave 1.0000000202769237)
    expect(d.tf.num[0]).toBe(d.zpk.gain);
  });

  it('reports H_d(1) = H(0) (the gain rule) for slow roots at high rates, to 1e-14', () => {
    // the compute API's dcGain of the matched model; 1 − e^{rT} by subtraction kept ~|rT|/ε of its digits
    const designs: { h: Zpk; fs: number }[] = [
      { h: { zeros: [c(-0.001)], poles: [c(-0.1)], gain: 1e5 }, fs: 1e7 },
      { h: lead, fs: 1e7 },
      { h: { zeros: [c(-2), c(-0.1)], poles: [c(-30), c(-0.02)], gain: 40 }, fs: 1e6 },
      { h: { zeros: [c(-2, 5), c(-2, -5)], poles: [c(-3, 8), c(-3, -8), c(-20)], gain: 7 }, fs: 2e5 },
      { h: leadLagComplex, fs: 60 },
    ];
    const json = (r: { re: number; im: number }) => ({ re: r.re, im: r.im });
    for (const { h, fs } of designs) {
      const res = runDiscretize(discretizeRequestSchema.parse({ compensator: { form: 'zpk', zeros: h.zeros.map(json), poles: h.poles.map(json), gain: h.gain }, sampleRateHz: fs, methods: ['matched'] }));
      const dc = continuousDcGain(h)!;
      expect(Math.abs(res.methods.matched!.dcGain! - dc)).toBeLessThanOrEqual(1e-14 * Math.abs(dc));
    }
    // a pole at s = 0 (z = 1): infinite; a zero there: 0
    const api = (zeros: number[], poles: number[]) =>
      runDiscretize(discretizeRequestSchema.parse({ compensator: { form: 'zpk', zeros, poles, gain: 2 }, sampleRateHz: 1e6, methods: ['matched'], prewarpHz: 1 })).methods.matched!.dcGain;
    expect(api([-0.5], [0])).toBeNull();
    expect(api([0], [-0.5])).toBe(0);
  });
});

describe('reported DC gain of every method at high oversampling', () => {
  // Identity of every method: s = 0 ↦ z = 1 (bilinear (c + 0)/(c − 0), backward Euler 1/(1 − 0),
  // matched e^0; ZOH by step invariance), so H_d(1) = H(0) = K·Π(−zᵢ)/Π(−pᵢ) exactly. The zpk
  // product 1 − z_d subtracts a rounded z_d ≈ 1 and keeps ~|r|/(c·ε) of its digits (2e-6
  // relative for a root at −0.001 rad/s at 10 MHz).
  const json = (r: { re: number; im: number }) => ({ re: r.re, im: r.im });
  const api = (h: Zpk, fs: number, prewarpHz = 1) =>
    runDiscretize(discretizeRequestSchema.parse({ compensator: { form: 'zpk', zeros: h.zeros.map(json), poles: h.poles.map(json), gain: h.gain }, sampleRateHz: fs, prewarpHz }));

  it('is H(0) to 1e-14 for roots at −0.001 rad/s at 10 MHz (tustin, prewarp, backward Euler; ZOH and matched alike), null or 0 with a root at s = 0', () => {
    const designs: { h: Zpk; fs: number; prewarpHz?: number }[] = [
      { h: { zeros: [c(-0.001)], poles: [c(-0.1)], gain: 1e5 }, fs: 1e7 },
      { h: { zeros: [c(-0.001)], poles: [c(-100)], gain: 1e5 }, fs: 1e7, prewarpHz: 1e6 },
      { h: { zeros: [c(-0.002)], poles: [c(-0.001), c(-0.003)], gain: -3 }, fs: 1e7, prewarpHz: 0.001 },
      { h: { zeros: [c(-0.001, 0.002), c(-0.001, -0.002)], poles: [c(-0.001), c(-0.004, 0.003), c(-0.004, -0.003)], gain: 2 }, fs: 1e7 },
      { h: { zeros: [], poles: [c(-0.001), c(-0.002)], gain: 7 }, fs: 1e7 },
      { h: leadLagComplex, fs: 1e6 },
    ];
    const missed: string[] = [];
    designs.forEach(({ h, fs, prewarpHz }, i) => {
      const res = api(h, fs, prewarpHz);
      const dc = continuousDcGain(h)!;
      for (const m of ['tustin', 'prewarp', 'backward-euler', 'zoh', 'matched'] as const) {
        const rel = Math.abs(res.methods[m]!.dcGain! - dc) / Math.abs(dc);
        if (!(rel <= 1e-14)) missed.push(`design ${i} ${m}: ${rel.toExponential(2)}`); // H_d(1) = H(0)
      }
    });
    expect(missed).toEqual([]);
    // s = 0 ↦ z = 1 stays exact: null with a pole there, 0 with a zero there (null with both)
    const cases: { h: Zpk; dc: null | 0 }[] = [
      { h: piLead, dc: null },
      { h: { zeros: [c(0)], poles: [c(-0.001)], gain: 2 }, dc: 0 },
      { h: { zeros: [c(0), c(-0.5)], poles: [c(0), c(-0.001)], gain: 2 }, dc: null },
    ];
    for (const { h, dc } of cases) {
      const res = api(h, 1e7, 0.01);
      for (const m of ['tustin', 'prewarp', 'backward-euler', 'zoh', 'matched'] as const) expect({ m, dc: res.methods[m]!.dcGain }).toEqual({ m, dc });
    }
  });
});

describe('worked example: the lead 25(s + 3)/(s + 18) at 250 Hz (Tustin by hand)', () => {
  it('gives b0 = 25(500 + 3)/(500 + 18), zero (500 − 3)/(500 + 3), pole (500 − 18)/(500 + 18)', () => {
    // hand computation with 2/T = 500 rad/s
    const d = discretizeZpk(lead, 'tustin', 250);
    expect(d.tf.num[0]).toBeCloseTo((25 * 503) / 518, 14);
    expect(d.zpk.zeros[0].re).toBeCloseTo(497 / 503, 15);
    expect(d.tf.den).toEqual([1, -482 / 518]);
  });
});
