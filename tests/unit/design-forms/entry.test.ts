import type { CompensatorInput } from '../../../schemas/compensator';
import {
  buildCompensator,
  emptyFields,
  fieldForApiPath,
  fieldsFromCompensator,
  leadToZpk,
  parseCoefficients,
  parseNumber,
  rowsToRoots,
  switchForm,
  timeConstantToZpk,
  zpkToLead,
  zpkToTimeConstant,
} from '../../../components/design/entry';

// Hand-derived identities (from memory, elementary algebra):
//   K(τz·s + 1)/(τp·s + 1) = K·(τz/τp)·(s + 1/τz)/(s + 1/τp)
//   its DC gain (s = 0) is K; its gain as s → ∞ is K·τz/τp.
//   K(s + z)/(s + p) has DC gain K·z/p and high-frequency gain K.

type C = { re: number; im: number };
const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const asC = (r: number | C): C => (typeof r === 'number' ? { re: r, im: 0 } : r);
/** K·Π(s − zᵢ)/Π(s − pᵢ) at a complex s (test-local evaluator). */
function evalZpk(c: CompensatorInput, s: C): C {
  if (c.form !== 'zpk') throw new Error('zpk only');
  let v: C = { re: c.gain, im: 0 };
  for (const z of c.zeros.map(asC)) v = mul(v, { re: s.re - z.re, im: s.im - z.im });
  for (const p of c.poles.map(asC)) v = div(v, { re: s.re - p.re, im: s.im - p.im });
  return v;
}
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(a), Math.abs(b));

describe('time-constant form K(τz·s + 1)/(τp·s + 1)', () => {
  const cases: Array<[number, number, number]> = [
    [4, 0.2, 0.02],
    [0.75, 0.005, 0.05],
    [-3, 1.5, 0.1],
    [120, 1e-4, 2.5e-6],
  ];
  it.each(cases)('K=%p τz=%p τp=%p: zero −1/τz, pole −1/τp, root-locus gain K·τz/τp', (K, tz, tp) => {
    const c = timeConstantToZpk(K, tz, tp);
    expect(c).toEqual({ form: 'zpk', zeros: [-1 / tz], poles: [-1 / tp], gain: (K * tz) / tp });
  });
  it.each(cases)('K=%p τz=%p τp=%p: DC gain equals K', (K, tz, tp) => {
    const dc = evalZpk(timeConstantToZpk(K, tz, tp), { re: 0, im: 0 });
    expect(rel(dc.re, K)).toBeLessThan(1e-12);
    expect(dc.im).toBe(0);
  });
  it.each(cases)('K=%p τz=%p τp=%p: agrees with the time-constant form at s = jω', (K, tz, tp) => {
    const c = timeConstantToZpk(K, tz, tp);
    for (const w of [0.3, 7, 55, 1e3, 4e4]) {
      const direct = div({ re: K, im: K * tz * w }, { re: 1, im: tp * w });
      const got = evalZpk(c, { re: 0, im: w });
      expect(rel(got.re, direct.re)).toBeLessThan(1e-12);
      expect(rel(got.im, direct.im)).toBeLessThan(1e-12);
    }
  });
  it('round-trips through zpkToTimeConstant', () => {
    const back = zpkToTimeConstant(timeConstantToZpk(2.5, 0.04, 0.008));
    expect(back).not.toBeNull();
    expect(rel(back!.gain, 2.5)).toBeLessThan(1e-12);
    expect(rel(back!.tauZero, 0.04)).toBeLessThan(1e-12);
    expect(rel(back!.tauPole, 0.008)).toBeLessThan(1e-12);
  });
});

describe('gain–zero–pole form K(s + z)/(s + p)', () => {
  it('stores the zero at −z and the pole at −p with root-locus gain K', () => {
    expect(leadToZpk(14, 2.2, 31)).toEqual({ form: 'zpk', zeros: [-2.2], poles: [-31], gain: 14 });
  });
  it('has DC gain K·z/p and tends to K at high frequency', () => {
    const c = leadToZpk(14, 2.2, 31);
    expect(rel(evalZpk(c, { re: 0, im: 0 }).re, (14 * 2.2) / 31)).toBeLessThan(1e-12);
    const hf = evalZpk(c, { re: 0, im: 1e9 });
    expect(rel(hf.re, 14)).toBeLessThan(1e-6);
  });
  it('zpkToLead inverts it and refuses what is not one real LHP zero and pole', () => {
    expect(zpkToLead(leadToZpk(14, 2.2, 31))).toEqual({ gain: 14, zero: 2.2, pole: 31 });
    expect(zpkToLead({ form: 'zpk', zeros: [], poles: [-3], gain: 1 })).toBeNull();
    expect(zpkToLead({ form: 'zpk', zeros: [0], poles: [-3], gain: 1 })).toBeNull();
    expect(zpkToLead({ form: 'zpk', zeros: [{ re: -1, im: 2 }, { re: -1, im: -2 }], poles: [-3, -4], gain: 1 })).toBeNull();
    expect(zpkToLead({ form: 'tf', num: [1, 2], den: [1, 3] })).toBeNull();
  });
});

describe('numbers from text fields', () => {
  it('reads plain, signed, exponent and true-minus numbers', () => {
    expect(parseNumber(' 12.5 ')).toBe(12.5);
    expect(parseNumber('-3')).toBe(-3);
    expect(parseNumber('−3')).toBe(-3);
    expect(parseNumber('2e3')).toBe(2000);
    expect(parseNumber('.5')).toBe(0.5);
  });
  it('never turns an empty field or text into 0', () => {
    expect(typeof parseNumber('')).toBe('string');
    expect(typeof parseNumber('   ')).toBe('string');
    expect(typeof parseNumber('abc')).toBe('string');
    expect(typeof parseNumber('1,5')).toBe('string');
    expect(typeof parseNumber('Infinity')).toBe('string');
    expect(typeof parseNumber('1e400')).toBe('string');
  });
  it('reads coefficient lists in descending powers, commas or spaces', () => {
    expect(parseCoefficients('1, 5, 0')).toEqual([1, 5, 0]);
    expect(parseCoefficients('1 5 0')).toEqual([1, 5, 0]);
    expect(parseCoefficients('')).toEqual(expect.any(String));
    expect(parseCoefficients('1, x')).toEqual(expect.stringContaining('Coefficient 2'));
  });
});

describe('zpk rows', () => {
  it('expands re ± j·im into a conjugate pair, skips blank rows, remembers the row of each root', () => {
    const out = rowsToRoots([
      { re: '-4', im: '' },
      { re: '', im: '' },
      { re: '-1', im: '-2' },
    ]);
    expect(out.roots).toEqual([-4, { re: -1, im: 2 }, { re: -1, im: -2 }]);
    expect(out.rowOfRoot).toEqual([0, 2, 2]);
    expect(out.errors).toEqual({});
  });
  it('places number errors on the row', () => {
    expect(rowsToRoots([{ re: 'x', im: '' }]).errors[0]).toMatch(/Real part/);
    expect(rowsToRoots([{ re: '1', im: 'q' }]).errors[0]).toMatch(/Imaginary part/);
  });
});

describe('buildCompensator: field errors from the shared schema', () => {
  it('builds a lead and remembers how it was entered', () => {
    const r = buildCompensator({ form: 'lead', gain: '25', zero: '3', pole: '18' });
    expect(r.errors).toEqual({});
    expect(r.compensator).toEqual({ form: 'zpk', zeros: [-3], poles: [-18], gain: 25 });
    expect(r.entry).toEqual({ form: 'lead', gain: 25, zero: 3, pole: 18 });
  });
  it('puts each empty or non-positive lead field in its own error', () => {
    const r = buildCompensator({ form: 'lead', gain: '', zero: '-3', pole: '0' });
    expect(r.compensator).toBeUndefined();
    expect(Object.keys(r.errors).sort()).toEqual(['gain', 'pole', 'zero']);
  });
  it('maps the schema gain check (gain 0) onto the gain field', () => {
    const r = buildCompensator({ form: 'lead', gain: '0', zero: '3', pole: '18' });
    expect(r.errors.gain).toMatch(/gain/);
  });
  it('maps an improper zpk onto the zeros', () => {
    const r = buildCompensator({ form: 'zpk', gain: '1', zeros: [{ re: '-1', im: '' }, { re: '-2', im: '' }], poles: [{ re: '-3', im: '' }] });
    expect(r.compensator).toBeUndefined();
    expect(r.errors.zeros).toMatch(/improper/);
  });
  it('accepts a complex pole pair entered on one row', () => {
    const r = buildCompensator({ form: 'zpk', gain: '40', zeros: [{ re: '-2', im: '' }], poles: [{ re: '-6', im: '8' }, { re: '-50', im: '' }] });
    expect(r.errors).toEqual({});
    expect(r.compensator).toEqual({ form: 'zpk', gain: 40, zeros: [-2], poles: [{ re: -6, im: 8 }, { re: -6, im: -8 }, -50] });
  });
  it('maps tf checks onto num and den', () => {
    expect(buildCompensator({ form: 'tf', num: '1, 2, 3', den: '1, 4' }).errors.num).toMatch(/improper/);
    expect(buildCompensator({ form: 'tf', num: '1', den: '0, 1, 4' }).errors.den).toMatch(/leading/);
    expect(buildCompensator({ form: 'tf', num: '2, 6', den: '1, 5, 0' }).compensator).toEqual({ form: 'tf', num: [2, 6], den: [1, 5, 0] });
  });
});

describe('server issue paths → fields', () => {
  it('finds the row of an expanded zpk root', () => {
    const f = { form: 'zpk' as const, gain: '1', zeros: [], poles: [{ re: '-5', im: '' }, { re: '-1', im: '3' }, { re: '-900', im: '' }] };
    expect(fieldForApiPath(f, 'poles.0')).toBe('poles.0');
    expect(fieldForApiPath(f, 'poles.2')).toBe('poles.1');
    expect(fieldForApiPath(f, 'poles.3')).toBe('poles.2');
    expect(fieldForApiPath(f, 'gain')).toBe('gain');
  });
  it('sends lead and time-constant roots to their fields', () => {
    expect(fieldForApiPath(emptyFields('lead'), 'poles.0')).toBe('pole');
    expect(fieldForApiPath(emptyFields('time-constant'), 'zeros.0')).toBe('tauZero');
    expect(fieldForApiPath(emptyFields('tf'), 'den.0')).toBe('den');
  });
});

describe('reopening and switching forms', () => {
  it('reopens in the form the design was entered in', () => {
    const c = timeConstantToZpk(2, 0.1, 0.01);
    expect(fieldsFromCompensator(c, { form: 'time-constant', gain: 2, tauZero: 0.1, tauPole: 0.01 })).toEqual({
      form: 'time-constant',
      gain: '2',
      tauZero: '0.1',
      tauPole: '0.01',
    });
    expect(fieldsFromCompensator({ form: 'zpk', gain: 3, zeros: [], poles: [{ re: -1, im: -2 }, { re: -1, im: 2 }] })).toEqual({
      form: 'zpk',
      gain: '3',
      zeros: [],
      poles: [{ re: '-1', im: '2' }],
    });
  });
  it('switches lead → time-constant keeping H(s) (DC gain K·z/p becomes K)', () => {
    const tc = switchForm('time-constant', { form: 'lead', gain: '25', zero: '3', pole: '18' });
    // 25·3/18 = 4.1666…, 1/3, 1/18, shown to 12 significant digits
    expect(tc).toEqual({ form: 'time-constant', gain: '4.16666666667', tauZero: '0.333333333333', tauPole: '0.0555555555556' });
    const back = buildCompensator(tc).compensator!;
    expect(back.form).toBe('zpk');
    if (back.form === 'zpk') {
      expect(rel(back.gain, 25)).toBeLessThan(1e-10);
      expect(rel(back.zeros[0] as number, -3)).toBeLessThan(1e-10);
    }
  });
  it('switches to tf from the server-parsed polynomials, and leaves the lead form empty for a complex pair', () => {
    const zpk = { form: 'zpk' as const, gain: '2', zeros: [], poles: [{ re: '-1', im: '2' }] };
    const parsed = { zeros: [], poles: [{ re: -1, im: 2 }, { re: -1, im: -2 }], gain: 2, numDescending: [2], denDescending: [1, 2, 5] };
    expect(switchForm('tf', zpk, parsed)).toEqual({ form: 'tf', num: '2', den: '1, 2, 5' });
    expect(switchForm('lead', zpk, parsed)).toEqual(emptyFields('lead'));
  });
});
