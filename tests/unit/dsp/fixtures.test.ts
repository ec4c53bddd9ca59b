/**
 * Against outside references: tests/fixtures/scipy-cont2discrete.json, written by the
 * committed script tests/fixtures/generate_scipy_fixtures.py from
 * scipy.signal.cont2discrete ('bilinear', 'zoh', 'backward_diff') and from the same maps
 * done in mpmath at 50 digits; for prewarp, scipy.signal.bilinear at the warped rate and
 * mpmath substitution; for matched, DESIGN.md's rule written out in mpmath at 50 digits.
 * Acceptance bar (issue 3): 1e-9 of the largest coefficient.
 */
import data from '../../fixtures/scipy-cont2discrete.json';
import { discretizeZpk } from '../../../server/dsp/methods';
import { evalZpk, inputToZpk } from '../../../server/dsp/lti';
import { runDiscretize } from '../../../server/dsp/run';
import { defaultPrewarpRadPerSec, discretizeRequestSchema } from '../../../schemas/discretize';
import { compensatorSchema } from '../../../schemas/compensator';
import { relToLargest } from './helpers';

/** num/den of a reference model; mpmath entries also hold dcGain, H_d(1) = N(1)/D(1) at 50 digits (null: a pole at s = 0). */
type Ref = { num: number[]; den: number[]; dcGain?: number | null };
type Case = { name: string; kind: string; compensator: unknown; sampleRateHz: number; methods: Record<'tustin' | 'zoh' | 'backward-euler', { scipy: Ref; mpmath: Ref }> };
const cases = (data as unknown as { cases: Case[] }).cases;
const stress = (data as unknown as { stress: Case[] }).stress;
const METHODS = ['tustin', 'zoh', 'backward-euler'] as const;

describe('scipy.signal.cont2discrete fixtures', () => {
  it('cover every kind of design and both forms', () => {
    const kinds = new Set(cases.map((c) => c.kind));
    for (const k of ['lead', 'lag', 'lead-lag', 'double-lead', 'pi-lead', 'complex-pair']) expect(kinds.has(k)).toBe(true);
    expect(cases.some((c) => (c.compensator as { form: string }).form === 'tf')).toBe(true);
    expect(cases.length).toBeGreaterThanOrEqual(60);
  });

  describe.each(cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const comp = compensatorSchema.parse(c.compensator);
    const zpk = inputToZpk(comp);
    it.each(METHODS)('%s agrees with scipy to 1e-9 and with mpmath to 1e-12 of the largest coefficient', (m) => {
      const ours = discretizeZpk(zpk, m, c.sampleRateHz).tf;
      const ref = c.methods[m];
      expect(relToLargest(ours.num, ref.scipy.num)).toBeLessThan(1e-9);
      expect(relToLargest(ours.den, ref.scipy.den)).toBeLessThan(1e-9);
      expect(relToLargest(ours.num, ref.mpmath.num)).toBeLessThan(1e-12);
      expect(relToLargest(ours.den, ref.mpmath.den)).toBeLessThan(1e-12);
    });
  });

  it('the compute API answers the same coefficients', () => {
    for (const c of cases.slice(0, 20)) {
      const res = runDiscretize(discretizeRequestSchema.parse({ compensator: c.compensator, sampleRateHz: c.sampleRateHz, methods: ['tustin', 'zoh', 'backward-euler'] }));
      for (const m of METHODS) {
        expect(relToLargest(res.methods[m]!.num, c.methods[m].mpmath.num)).toBeLessThan(1e-12);
        expect(relToLargest(res.methods[m]!.den, c.methods[m].mpmath.den)).toBeLessThan(1e-12);
      }
    }
  });
});

describe('very high rates (T = 1 µs … 10 µs), mpmath reference', () => {
  it.each(stress.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const zpk = inputToZpk(compensatorSchema.parse(c.compensator));
    for (const m of METHODS) {
      const ours = discretizeZpk(zpk, m, c.sampleRateHz).tf;
      expect(relToLargest(ours.num, c.methods[m].mpmath.num)).toBeLessThan(1e-12);
      expect(relToLargest(ours.den, c.methods[m].mpmath.den)).toBeLessThan(1e-12);
    }
  });

  it('where scipy itself loses the numerator (the cancellation of DESIGN.md "Lessons")', () => {
    const sp = stress.find((c) => c.kind === 'strictly-proper')!;
    // documents why the stricter mpmath reference is used here: scipy's ZOH numerator
    // via ss2tf is off by more than its own size at T = 1 µs
    expect(relToLargest(sp.methods.zoh.scipy.num, sp.methods.zoh.mpmath.num)).toBeGreaterThan(1e-6);
  });
});

type MarginRef = { gainCrossoverRadPerSec: number[]; phaseMarginDeg: number[]; phaseCrossoverRadPerSec: number[]; gainMarginDb: number[] };
type Loop = { compensator: unknown; plant: unknown; sampleRateHz: number; delaySamples: 0 | 1; continuous: MarginRef; tustin: MarginRef };
const loops = (data as unknown as { loops: Loop[] }).loops;

/** The smallest margin (in absolute value) of the reference crossovers. */
function smallest(values: number[], at: number[]): { v: number; w: number } | null {
  let best: { v: number; w: number } | null = null;
  values.forEach((v, i) => {
    if (!best || Math.abs(v) < Math.abs(best.v)) best = { v, w: at[i] };
  });
  return best;
}

describe('loop margins against scipy freqresp/dfreqresp + brentq', () => {
  it.each(loops.map((l, i) => [i, l] as const))('loop %i', (_i, l) => {
    const res = runDiscretize(discretizeRequestSchema.parse({ compensator: l.compensator, plant: l.plant, sampleRateHz: l.sampleRateHz, delaySamples: l.delaySamples, methods: ['tustin'] }));
    const check = (ours: { gainMarginDb: number | null; phaseCrossoverHz: number | null; phaseMarginDeg: number | null; gainCrossoverHz: number | null }, ref: MarginRef) => {
      const pm = smallest(ref.phaseMarginDeg, ref.gainCrossoverRadPerSec);
      if (pm) {
        expect(ours.phaseMarginDeg!).toBeCloseTo(pm.v, 6);
        expect(ours.gainCrossoverHz! * 2 * Math.PI).toBeCloseTo(pm.w, 6);
      } else expect(ours.phaseMarginDeg).toBeNull();
      const gm = smallest(ref.gainMarginDb, ref.phaseCrossoverRadPerSec);
      if (gm && ours.gainMarginDb !== null && Math.abs(ours.gainMarginDb) <= Math.abs(gm.v) + 1e-6) {
        // ours may also find a crossover exactly at Nyquist, which a sign-change search misses
        if (Math.abs(ours.phaseCrossoverHz! - l.sampleRateHz / 2) > 1e-9 * l.sampleRateHz) {
          expect(ours.gainMarginDb).toBeCloseTo(gm.v, 6);
          expect(ours.phaseCrossoverHz! * 2 * Math.PI).toBeCloseTo(gm.w, 5);
        }
      } else if (gm) {
        throw new Error(`gain margin ${ours.gainMarginDb} dB, reference ${gm.v} dB`);
      }
    };
    check(res.continuousLoop!.margins, l.continuous);
    check(res.methods.tustin!.loop!.margins, l.tustin);
  });
});

// ---------------------------------------------------------------- prewarp and matched

type WarpedEntry = {
  name: string;
  group: 'random' | 'origin' | 'stress' | 'edge';
  kind: string;
  compensator: unknown;
  sampleRateHz: number;
  /** null: DESIGN.md's default ω₀ = √(|z₁|·|p₁|) (no prewarpHz sent) */
  prewarpHz: number | null;
  /** the ω₀ the references used, rad/s */
  omega0RadPerSec: number;
  rootAtOrigin: boolean;
  methods: { prewarp: { scipy: Ref; mpmath: Ref }; matched: { mpmath: Ref } };
};
const warped = (data as unknown as { warped: WarpedEntry[] }).warped;
const inGroup = (...g: WarpedEntry['group'][]) => warped.filter((e) => g.includes(e.group)).map((e) => [e.name, e] as const);

/** Our answer for an entry: discretizeZpk with ω₀ in rad/s, and the compute API with the same prewarpHz. */
function ours(e: WarpedEntry) {
  const comp = compensatorSchema.parse(e.compensator);
  const w0 = e.prewarpHz === null ? defaultPrewarpRadPerSec(comp) : 2 * Math.PI * e.prewarpHz;
  const zpk = inputToZpk(comp);
  const direct = (m: 'prewarp' | 'matched') => discretizeZpk(zpk, m, e.sampleRateHz, w0 === null ? {} : { prewarpRadPerSec: w0 }).tf;
  const api = runDiscretize(discretizeRequestSchema.parse({
    compensator: e.compensator,
    sampleRateHz: e.sampleRateHz,
    methods: ['prewarp', 'matched'],
    ...(e.prewarpHz === null ? {} : { prewarpHz: e.prewarpHz }),
  }));
  return { w0, prewarp: direct('prewarp'), matched: direct('matched'), api };
}

const err = (a: { num: number[]; den: number[] }, ref: Ref) => Math.max(relToLargest(a.num, ref.num), relToLargest(a.den, ref.den));

describe('prewarp and matched fixtures (scipy.signal.bilinear at the warped rate; DESIGN.md rule in mpmath)', () => {
  it('cover default and explicit ω₀, both forms, every random design, roots at s = 0 (pole and zero) with either sign of K', () => {
    const form = (e: WarpedEntry) => (e.compensator as { form: string }).form;
    const random = warped.filter((e) => e.group === 'random');
    // every design of the cont2discrete set appears with an explicit prewarpHz, the zpk ones
    // with a defined default also at the default
    expect(new Set(random.filter((e) => e.prewarpHz !== null).map((e) => e.name.split(' ')[0]))).toEqual(new Set(cases.map((c) => c.name)));
    expect(random.some((e) => e.prewarpHz === null && form(e) === 'zpk')).toBe(true);
    expect(warped.some((e) => form(e) === 'tf' && e.rootAtOrigin)).toBe(true);
    expect(warped.every((e) => form(e) === 'zpk' || e.prewarpHz !== null)).toBe(true);
    // matched at ω₀: the default ω₀ and explicit ones, a pole and a zero at s = 0, K of both signs
    const origin = warped.filter((e) => e.rootAtOrigin && e.group !== 'edge');
    expect(origin.some((e) => e.prewarpHz === null)).toBe(true);
    expect(origin.some((e) => e.prewarpHz !== null)).toBe(true);
    for (const kind of ['pi-lead', 'lead-pi', 'washout', 'lead-washout', 'washout-tf']) expect(origin.some((e) => e.kind === kind)).toBe(true);
    const signs = new Set(origin.map((e) => Math.sign(e.methods.matched.mpmath.num.find((v) => v !== 0)!)));
    expect(signs).toEqual(new Set([1, -1]));
  });

  describe.each(inGroup('random', 'origin'))('%s', (_name, e) => {
    let o: ReturnType<typeof ours>;
    beforeAll(() => {
      o = ours(e);
    });

    if (e.prewarpHz === null) {
      it('default ω₀ = √(|z₁|·|p₁|) as DESIGN.md defines it (recomputed in mpmath)', () => {
        expect(Math.abs(o.w0! - e.omega0RadPerSec)).toBeLessThanOrEqual(4e-16 * e.omega0RadPerSec);
        expect(Math.abs(o.api.prewarpHz! * 2 * Math.PI - e.omega0RadPerSec)).toBeLessThanOrEqual(4e-16 * e.omega0RadPerSec);
      });
    }

    it('prewarp: scipy.signal.bilinear at fs_w = ω₀/(2 tan(ω₀T/2)) to 1e-9, mpmath substitution to 1e-12', () => {
      const ref = e.methods.prewarp;
      expect(err(o.prewarp, ref.scipy)).toBeLessThan(1e-9); // scipy.signal.bilinear at the warped rate
      expect(err(o.prewarp, ref.mpmath)).toBeLessThan(1e-12); // s = (ω₀/tan(ω₀T/2))(z − 1)/(z + 1) substituted in mpmath
      expect(err(o.api.methods.prewarp!, ref.scipy)).toBeLessThan(1e-9); // scipy.signal.bilinear at the warped rate
      expect(err(o.api.methods.prewarp!, ref.mpmath)).toBeLessThan(1e-12); // mpmath substitution
    });

    it('matched: the DESIGN.md rule (e^{sT}, zeros at ∞ → −1, gain at DC or at ω₀ with the sign of K) in mpmath to 1e-12', () => {
      const ref = e.methods.matched.mpmath;
      expect(err(o.matched, ref)).toBeLessThan(1e-12); // DESIGN.md matched rule, mpmath at 50 digits
      expect(err(o.api.methods.matched!, ref)).toBeLessThan(1e-12); // the same, through the compute API
    });
  });

  it.each(inGroup('stress'))('%s: mpmath at T = 1 µs … 10 µs to 1e-12', (_name, e) => {
    const o = ours(e);
    for (const d of [o.prewarp, o.api.methods.prewarp!]) expect(err(d, e.methods.prewarp.mpmath)).toBeLessThan(1e-12); // mpmath substitution
    for (const d of [o.matched, o.api.methods.matched!]) expect(err(d, e.methods.matched.mpmath)).toBeLessThan(1e-12); // DESIGN.md matched rule in mpmath
  });

  it('where scipy.signal.bilinear itself loses the numerator (its normalize drops leading coefficients below 1e-8)', () => {
    // documents why the stress designs use mpmath only
    const sp = warped.find((e) => e.group === 'stress' && e.kind === 'strictly-proper')!;
    expect(relToLargest(sp.methods.prewarp.scipy.num, sp.methods.prewarp.mpmath.num)).toBeGreaterThan(0.5);
  });

  it('the checks can fail: a wrong ω₀ or a wrong gain rule misses the references', () => {
    // The same entries and engine with deliberately wrong inputs; each must miss the bars.
    // ω₀ moves both maps only at second order in ω₀T (c = (2/T)(1 − (ω₀T)²/12 …); the matched
    // gain ratio |H(jω)|/|H_d(e^{jωT})| is flat to the same order), so a wrong ω₀ shows where
    // ω₀T is not tiny: those entries are used, and there must be enough of them.
    const visible = warped.filter((e) => e.group === 'random' || e.group === 'origin').filter((e) => e.omega0RadPerSec / e.sampleRateHz >= 0.05);
    const zpkOf = (e: WarpedEntry) => inputToZpk(compensatorSchema.parse(e.compensator));
    const at = (e: WarpedEntry, m: 'prewarp' | 'matched', w0: number) => discretizeZpk(zpkOf(e), m, e.sampleRateHz, { prewarpRadPerSec: w0 }).tf;
    expect(visible.filter((e) => e.prewarpHz === null).length).toBeGreaterThanOrEqual(20);
    expect(visible.filter((e) => e.rootAtOrigin).length).toBeGreaterThanOrEqual(15);
    expect(visible.filter((e) => e.rootAtOrigin && e.prewarpHz === null).length).toBeGreaterThanOrEqual(5);
    for (const e of visible) {
      // ω₀ 10 % off, ω₀ in Hz where rad/s is meant, and plain Tustin (no prewarping)
      for (const w of [e.omega0RadPerSec * 1.1, e.omega0RadPerSec / (2 * Math.PI)]) {
        expect(err(at(e, 'prewarp', w), e.methods.prewarp.scipy)).toBeGreaterThan(1e-9);
        if (e.rootAtOrigin) expect(err(at(e, 'matched', w), e.methods.matched.mpmath)).toBeGreaterThan(1e-9);
      }
      expect(err(discretizeZpk(zpkOf(e), 'tustin', e.sampleRateHz).tf, e.methods.prewarp.scipy)).toBeGreaterThan(1e-9);
    }
    // matched at a root at s = 0 with |K| in place of K: the other sign
    for (const e of warped.filter((x) => x.rootAtOrigin && x.group === 'origin')) {
      const right = at(e, 'matched', e.omega0RadPerSec);
      expect(err({ num: right.num.map((v) => -v), den: right.den }, e.methods.matched.mpmath)).toBeGreaterThan(1);
    }
    // matched without a root at s = 0, gain matched in magnitude at ω₀ instead of at DC
    let missed = 0;
    const dcMatched = visible.filter((e) => !e.rootAtOrigin);
    for (const e of dcMatched) {
      const zpk = zpkOf(e);
      const d = discretizeZpk(zpk, 'matched', e.sampleRateHz);
      const w = e.omega0RadPerSec;
      const hc = evalZpk(zpk, { re: 0, im: w });
      const hd = evalZpk({ ...d.zpk, gain: 1 }, { re: Math.cos(w / e.sampleRateHz), im: Math.sin(w / e.sampleRateHz) });
      const gainAtW0 = (Math.sign(zpk.gain) * Math.hypot(hc.re, hc.im)) / Math.hypot(hd.re, hd.im);
      const wrong = { num: d.tf.num.map((v) => (v / d.zpk.gain) * gainAtW0), den: d.tf.den };
      if (err(wrong, e.methods.matched.mpmath) > 1e-9) missed++;
    }
    expect(dcMatched.length).toBeGreaterThanOrEqual(20);
    expect(missed).toBe(dcMatched.length);
  });

  // The edge designs of the generator: a slow root and a low ω₀ at a very high rate, where
  // e^{jω₀T} and e^{rT} share their first 8 to 10 digits (PI (s + 0.01)/s at 10 MHz,
  // prewarpHz 0.001). Forming e^{jω₀T} − e^{rT} by subtraction lost up to ~2e-8 of the
  // matched gain at ω₀; e^{rT}·expm1((jω₀ − r)T) keeps it. The mpmath value is the exact rule.
  describe.each(inGroup('edge'))('%s', (_name, e) => {
    it('prewarp: mpmath substitution to 1e-12', () => {
      const o = ours(e);
      expect(err(o.prewarp, e.methods.prewarp.mpmath)).toBeLessThan(1e-12); // mpmath substitution
      expect(err(o.api.methods.prewarp!, e.methods.prewarp.mpmath)).toBeLessThan(1e-12);
    });
    it('matched: the DESIGN.md rule in mpmath to 1e-12 (ω₀ ≪ 1/T)', () => {
      const o = ours(e);
      expect(err(o.matched, e.methods.matched.mpmath)).toBeLessThan(1e-12); // DESIGN.md matched rule in mpmath
      expect(err(o.api.methods.matched!, e.methods.matched.mpmath)).toBeLessThan(1e-12);
    });
  });
});

describe('reported dcGain against H_d(1) = N(1)/D(1) of every mpmath model above (50 digits)', () => {
  // The API's dcGain is H_d(1) "from the structure". The zpk product Π(1 − zᵢ)/Π(1 − pᵢ) lost
  // ~ε·fs/|r| relative to 1 − z_d for a root r (1e-11 for random designs, 2e-9 for the stress
  // designs at 1 MHz); the mpmath value is the model's own, summed at 50 digits.
  const rel = (ours: number | null, ref: number | null) =>
    ours === null || ref === null ? (ours === ref ? 0 : Infinity) : ref === 0 ? Math.abs(ours) : Math.abs(ours - ref) / Math.abs(ref);

  it('tustin, backward Euler and ZOH of every cont2discrete and stress design to 4e-15', () => {
    const missed: string[] = [];
    for (const c of [...cases, ...stress]) {
      const res = runDiscretize(discretizeRequestSchema.parse({ compensator: c.compensator, sampleRateHz: c.sampleRateHz, methods: [...METHODS] }));
      for (const m of METHODS) {
        const e = rel(res.methods[m]!.dcGain, c.methods[m].mpmath.dcGain!);
        if (!(e <= 4e-15)) missed.push(`${c.name} ${m}: ${e.toExponential(2)}`); // mpmath N(1)/D(1)
      }
    }
    expect(missed).toEqual([]);
  });

  it('prewarp and matched of every warped entry to 4e-15', () => {
    const missed: string[] = [];
    for (const e of warped) {
      const res = ours(e).api;
      for (const m of ['prewarp', 'matched'] as const) {
        const d = rel(res.methods[m]!.dcGain, e.methods[m].mpmath.dcGain!);
        if (!(d <= 4e-15)) missed.push(`${e.name} ${m}: ${d.toExponential(2)}`); // mpmath N(1)/D(1)
      }
    }
    expect(missed).toEqual([]);
    // a pole at s = 0 is listed as null, a zero there as 0
    expect(warped.some((e) => e.methods.prewarp.mpmath.dcGain === null)).toBe(true);
    expect(warped.some((e) => e.methods.prewarp.mpmath.dcGain === 0)).toBe(true);
  });
});
