import type { CompensatorInput } from '../../../schemas/compensator';
import { designSpecSchema, entrySchema } from '../../../schemas/design';
import { buildCompensator, fieldsFromCompensator, formatSi, opAmpToZpk, parseSi, switchForm, type OpAmpFields } from '../../../components/design/entry';
import { buildSpec, editorStateFromSpec, newEditorState } from '../../../components/design/spec';

type C = { re: number; im: number };
const asC = (r: number | C): C => (typeof r === 'number' ? { re: r, im: 0 } : r);
/** K·Π(s − zᵢ)/Π(s − pᵢ) at a complex s (test-local evaluator). */
function evalZpk(c: CompensatorInput, s: C): C {
  if (c.form !== 'zpk') throw new Error('zpk only');
  let v: C = { re: c.gain, im: 0 };
  const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
  const div = (a: C, b: C): C => {
    const d = b.re * b.re + b.im * b.im;
    return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
  };
  for (const z of c.zeros) v = mul(v, { re: s.re - asC(z).re, im: s.im - asC(z).im });
  for (const p of c.poles) v = div(v, { re: s.re - asC(p).re, im: s.im - asC(p).im });
  return v;
}
const close = (a: number, b: number, tol = 1e-12) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));

describe('SI-prefixed component values', () => {
  it.each([
    ['10k', 'ohm', 1e4],
    ['4.7u', 'farad', 4.7e-6],
    ['4.7µ', 'farad', 4.7e-6],
    ['100n', 'farad', 1e-7],
    ['100nF', 'farad', 1e-7],
    ['22p', 'farad', 22e-12],
    ['2.2M', 'ohm', 2.2e6],
    ['1m', 'farad', 1e-3],
    ['4k7', 'ohm', 4700],
    ['4R7', 'ohm', 4.7],
    ['470R', 'ohm', 470],
    ['10 kΩ', 'ohm', 1e4],
    ['33kohm', 'ohm', 33e3],
    ['1e4', 'ohm', 1e4],
    ['680', 'ohm', 680],
  ] as const)('%s (%s) is %p', (text, unit, value) => {
    // exact: the prefix is applied as a decimal exponent of the literal, not by a multiplication
    expect(parseSi(text, unit)).toBe(value);
  });

  it.each([
    ['', 'ohm', /Enter a value/],
    ['10K', 'ohm', /Unknown prefix "K"/],
    ['ten', 'ohm', /Not a resistance/],
    ['1e3k', 'ohm', /exponent or a prefix/],
    ['4R7', 'farad', /resistance only/],
    ['100x', 'farad', /Not a capacitance/],
  ] as const)('refuses %p (%s)', (text, unit, message) => {
    expect(parseSi(text, unit)).toMatch(message);
  });

  it('formatSi gives values back through parseSi to 12 digits', () => {
    for (const v of [4700, 1e-7, 4.7e-6, 22e-12, 2.2e6, 1, 0.5, 999.9999, 1e9, 3.3e10]) {
      const back = parseSi(formatSi(v), 'ohm');
      expect(typeof back).toBe('number');
      expect(close(back as number, v)).toBe(true);
    }
    expect(formatSi(4700)).toBe('4.7k');
    expect(formatSi(1e-7)).toBe('100n');
    expect(formatSi(4.7e-6)).toBe('4.7u');
  });
});

describe('two-op-amp network H(s) = (R4C1)/(R3C2)·(s + 1/(R1C1))/(s + 1/(R2C2))', () => {
  // our own values: R1 = 47k, C1 = 1u (R1C1 = 47 ms), R2 = 4.7k, C2 = 1u (4.7 ms), R3 = 10k, R4 = 22k
  const v = { r1: 47e3, c1: 1e-6, r2: 4.7e3, c2: 1e-6, r3: 10e3, r4: 22e3 };

  it('zero −1/(R1C1), pole −1/(R2C2), gain R4C1/(R3C2)', () => {
    const c = opAmpToZpk(v);
    expect(c).toEqual({ form: 'zpk', zeros: [-1 / (47e3 * 1e-6)], poles: [-1 / (4.7e3 * 1e-6)], gain: (22e3 * 1e-6) / (10e3 * 1e-6) });
  });

  // identity: H(0) = R2R4/(R1R3) (the resistive gains of both inverting stages, capacitors open)
  it.each([
    [v],
    [{ r1: 1e3, c1: 220e-9, r2: 68e3, c2: 10e-9, r3: 3.3e3, r4: 3.3e3 }],
    [{ r1: 150e3, c1: 2.2e-6, r2: 12e3, c2: 47e-9, r3: 1e3, r4: 100e3 }],
  ])('DC gain is R2·R4/(R1·R3) for %p', (vals) => {
    const h0 = evalZpk(opAmpToZpk(vals), { re: 0, im: 0 });
    expect(close(h0.re, (vals.r2 * vals.r4) / (vals.r1 * vals.r3))).toBe(true);
    expect(h0.im).toBe(0);
  });

  // against the circuit itself at s = jω: (−Z2/Z1)·(−R4/R3) from the impedances (derivation in entry.ts)
  it.each([0.3, 21, 212.8, 5e3])('equals (−Z2/Z1)(−R4/R3) at ω = %p rad/s', (w) => {
    const s = { re: 0, im: w };
    const z1 = { re: 1, im: v.r1 * v.c1 * w }; // (1 + R1C1s)/R1 = 1/Z1, times R1
    const z2 = { re: 1, im: v.r2 * v.c2 * w };
    // (R2R4/(R1R3)) · (1 + R1C1 jω)/(1 + R2C2 jω)
    const k = (v.r2 * v.r4) / (v.r1 * v.r3);
    const d = z2.re * z2.re + z2.im * z2.im;
    const circuit = { re: (k * (z1.re * z2.re + z1.im * z2.im)) / d, im: (k * (z1.im * z2.re - z1.re * z2.im)) / d };
    const h = evalZpk(opAmpToZpk(v), s);
    expect(close(h.re, circuit.re, 1e-12)).toBe(true);
    expect(close(h.im, circuit.im, 1e-12)).toBe(true);
  });

  it('a lead when R1C1 > R2C2 (zero below the pole), a lag when R1C1 < R2C2', () => {
    const lead = opAmpToZpk(v);
    const lag = opAmpToZpk({ ...v, r1: v.r2, r2: v.r1 });
    if (lead.form !== 'zpk' || lag.form !== 'zpk') throw new Error('zpk');
    expect(-(lead.zeros[0] as number)).toBeLessThan(-(lead.poles[0] as number));
    expect(-(lag.zeros[0] as number)).toBeGreaterThan(-(lag.poles[0] as number));
    // a lead's phase at the geometric mean of zero and pole is positive, a lag's negative
    const w = Math.sqrt((lead.zeros[0] as number) * (lead.poles[0] as number));
    expect(evalZpk(lead, { re: 0, im: w }).im).toBeGreaterThan(0);
    expect(evalZpk(lag, { re: 0, im: w }).im).toBeLessThan(0);
  });
});

describe('op-amp form in the editor', () => {
  const fields: OpAmpFields = { form: 'op-amp', r1: '47k', c1: '1u', r2: '4k7', c2: '1u', r3: '10k', r4: '22k' };

  it('builds the compensator and the entry in ohms and farads', () => {
    const r = buildCompensator(fields);
    expect(r.errors).toEqual({});
    expect(r.entry).toEqual({ form: 'op-amp', r1: 47e3, c1: 1e-6, r2: 4700, c2: 1e-6, r3: 1e4, r4: 22e3 });
    expect(entrySchema.safeParse(r.entry).success).toBe(true);
    if (r.compensator?.form !== 'zpk') throw new Error('zpk');
    expect(r.compensator.gain).toBeCloseTo(2.2, 12);
  });

  it('marks each bad value at its own field', () => {
    const r = buildCompensator({ ...fields, r2: '0', c1: 'big', r4: '-5k' });
    expect(r.compensator).toBeUndefined();
    expect(Object.keys(r.errors).sort()).toEqual(['c1', 'r2', 'r4']);
  });

  it('reopens a saved op-amp design in the same form', () => {
    const state = { ...newEditorState(), entry: fields, sampleRateHz: '1000' };
    const { spec, errors } = buildSpec(state);
    expect(errors).toEqual({});
    const reparsed = designSpecSchema.parse(JSON.parse(JSON.stringify(spec)));
    expect(editorStateFromSpec(reparsed).entry).toEqual({ form: 'op-amp', r1: '47k', c1: '1u', r2: '4.7k', c2: '1u', r3: '10k', r4: '22k' });
    expect(fieldsFromCompensator(reparsed.compensator).form).toBe('zpk');
  });

  it('the schema refuses non-positive values, naming the part', () => {
    const r = entrySchema.safeParse({ form: 'op-amp', r1: 1e3, c1: 0, r2: 1e3, c2: 1e-9, r3: 1e3, r4: 1e3 });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(['c1']);
  });

  it('switching to the lead form keeps H(s); switching to op-amp starts empty', () => {
    const lead = switchForm('lead', fields);
    expect(lead.form).toBe('lead');
    if (lead.form !== 'lead') throw new Error('lead');
    expect(Number(lead.zero)).toBeCloseTo(1 / 0.047, 9);
    expect(Number(lead.pole)).toBeCloseTo(1 / 0.0047, 9);
    expect(switchForm('op-amp', lead)).toEqual({ form: 'op-amp', r1: '', c1: '', r2: '', c2: '', r3: '', r4: '' });
  });
});
