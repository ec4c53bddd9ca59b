import reference from './fixtures/reference.json';
import { DESIGNS, VARIANTS, discreteOf, settingsFor } from './designs';
import { analyzeImplementation, buildImplementation, generateVectors, referenceBound, runFixed, runFloat, filterIdeal } from '../../../server/fixed-point';
import { cascadeResponse, evalTf, realSections } from '../../../server/fixed-point/analysis';
import { implementationSettingsSchema } from '../../../schemas/implementation';

type Ref = { fs: number; num: number[]; den: number[]; uCounts: number[]; yCounts: number[]; yReal: number[] };
const refs = (reference as unknown as { designs: Record<string, Ref>; inputScale: number; outputScale: number });

describe.each(DESIGNS)('$name', (design) => {
  const discrete = discreteOf(design);

  it('sections multiply back to the discrete transfer function (identity)', () => {
    const { impl, gainFold } = buildImplementation(discrete, settingsFor(VARIANTS[2], 'c'));
    const scale = gainFold * 2 ** (impl.kind === 'fixed' ? impl.outputShift : 0);
    const { ideal } = realSections(impl);
    for (const w of [0.001, 0.03, 0.4, 1.2, 2.9]) {
      const h = evalTf(discrete.tf.num, discrete.tf.den, w);
      const c = cascadeResponse(ideal, w);
      // 1e-7: the expanded fourth-order num/den itself loses digits near z = 1 (cancellation).
      expect(Math.hypot(c.re / scale - h.re, c.im / scale - h.im)).toBeLessThan(1e-7 * Math.max(1, Math.hypot(h.re, h.im)));
    }
  });

  it.each(VARIANTS)('bit-exact model stays within the derived bound of the ideal response ($label)', (variant) => {
    const settings = settingsFor(variant, 'c');
    const built = buildImplementation(discrete, settings);
    const v = generateVectors(discrete, settings, built);
    const fold = variant.wordLength === 'float32' ? 1 : settings.inputScale / settings.outputScale;
    const u = v.rows.map((r) => r.uRaw);
    const ideal = filterIdeal(discrete.tf.num.map((c) => c * fold), discrete.tf.den, u);
    const limitStart = v.segments.find((s) => s.name === 'limits')!.start;
    const { min, max } = settings.outputLimits;
    let checked = 0, worst = 0;
    for (let n = 0; n < limitStart; n++) {
      if (ideal[n] < min || ideal[n] > max) continue;
      worst = Math.max(worst, Math.abs(v.rows[n].yRaw - ideal[n]));
      checked++;
    }
    expect(checked).toBeGreaterThan(300);
    expect(worst).toBeLessThanOrEqual(v.bound);
    // The limit segment reaches a limit, unless even a full-scale input cannot get there in
    // the segment (the slow lag at 16 bits: a 64-sample step moves it by its high-frequency gain).
    const reached = v.rows.slice(limitStart).some((r) => r.yRaw === max || r.yRaw === min);
    expect(reached).toBe(v.limitsReached);
    if (!(design.name === 'lag' && variant.wordLength === 16)) expect(reached).toBe(true);
    if (variant.wordLength === 32) expect(v.bound).toBeLessThan(2); // 32-bit words keep the error to about one count
  });

  it('agrees with scipy (bilinear_zpk + lfilter) on the fixture input within the bound', () => {
    const ref = refs.designs[design.name];
    // The discretization itself: scipy's num/den against server/dsp's.
    ref.num.forEach((c, i) => expect(Math.abs(c - discrete.tf.num[i])).toBeLessThan(1e-9 * Math.max(1, Math.abs(c))));
    for (const variant of [VARIANTS[0], VARIANTS[3]]) {
      const settings = implementationSettingsSchema.parse({ ...settingsFor(variant, 'c'), inputScale: refs.inputScale, outputScale: refs.outputScale, outputLimits: { min: -30000, max: 30000 } });
      const { impl, gainFold } = buildImplementation(discrete, settings);
      if (impl.kind !== 'fixed') throw new Error('fixed expected');
      const y = runFixed(impl, ref.uCounts).y;
      const bound = referenceBound(impl, discrete.tf, gainFold, ref.uCounts.length, 400);
      ref.yCounts.forEach((yi, n) => { if (Math.abs(yi) < 30000) expect(Math.abs(y[n] - yi)).toBeLessThanOrEqual(bound); });
    }
    const fl = buildImplementation(discrete, settingsFor(VARIANTS[4], 'c')).impl;
    if (fl.kind !== 'float') throw new Error('float expected');
    const uReal = ref.uCounts.map((c) => Math.fround(c / 1000));
    const run = runFloat({ ...fl, outputMin: -1e9, outputMax: 1e9 }, uReal);
    const bound = referenceBound(fl, discrete.tf, 1, uReal.length, 0.4) + 1e-6 * Math.max(...ref.yReal.map(Math.abs));
    ref.yReal.forEach((yi, n) => expect(Math.abs(run.y[n] - yi)).toBeLessThanOrEqual(bound));
  });
});

describe('analysis and advice', () => {
  const lag = discreteOf(DESIGNS[1]);
  it('flags the DC-gain drift of a pole near z = 1 at 16 bits and names what fixes it', () => {
    const a = analyzeImplementation(lag, settingsFor(VARIANTS[0], 'lag'));
    const w = a.warnings.find((x) => x.code === 'dc-gain-drift');
    expect(w).toBeDefined();
    expect(w!.message).toMatch(/offset form|32-bit/);
    expect(a.advice.recommended).not.toBeNull();
  });
  it('offers the offset form with the improvement in numbers', () => {
    const a = analyzeImplementation(lag, settingsFor(VARIANTS[0], 'lag'));
    expect(a.advice.offsetForm).not.toBeNull();
    const { directForm, offsetForm } = a.advice.offsetForm!;
    expect(offsetForm.dcGainDriftPct!).toBeLessThan(directForm.dcGainDriftPct! / 10);
    expect(a.warnings.some((x) => x.code === 'offset-form-helps')).toBe(true);
  });
  it('gives a coefficient table with exact, quantized, error and bits', () => {
    const a = analyzeImplementation(discreteOf(DESIGNS[0]), settingsFor(VARIANTS[0], 'lead'));
    expect(a.coefficients.length).toBe(3);
    for (const row of a.coefficients) {
      expect(row.integer! / 2 ** row.fractionalBits!).toBe(row.quantized);
      expect(Math.abs(row.error)).toBeLessThanOrEqual(2 ** -(row.fractionalBits! + 1) + 1e-18);
    }
    expect(a.metrics.stableQuantized).toBe(true);
  });
  it('warns that an integrating design has no anti-windup', () => {
    const a = analyzeImplementation(discreteOf(DESIGNS[4]), settingsFor(VARIANTS[2], 'pi'));
    expect(a.warnings.map((w) => w.code)).toContain('integrator-windup');
  });
});
