/**
 * Quantization of a cascade of sections into the integer (or float32) coefficients of the
 * generated C. The same data drives the bit-exact model (model.ts) and the templates.
 *
 * Fixed-point arithmetic of one section (word W = 16 or 32 bits, accumulator 2W bits):
 *   acc_g = Σ over the terms of group g of (± c · signal), saturating adds, c = round(exact · 2^F_g)
 *   acc   = acc_lo + roundShift(acc_hi, F_hi − F_lo)           (two groups only)
 *   v     = roundShift(acc, F_lo) + n1·y[n−1] + n2·y[n−2]      (n = 0, 0 in direct form I)
 *   y[n]  = saturate v to the W-bit word
 * and after the last section: output = clamp(roundShift(y, G), outputMin, outputMax), G the
 * output fraction bits.
 * roundShift(v, s) = floor(v / 2^s + 1/2): round to nearest, ties toward +∞, computed with
 * C99's truncating division and remainder, so it is defined for negative v on every target.
 *
 * Direct form I: y[n] = b0 x[n] + b1 x[n−1] + b2 x[n−2] − a1 y[n−1] − a2 y[n−2], with the
 *   numerator (b) and the feedback (a) coefficients each in the format of the largest of them
 *   (one group when the two formats coincide), so that a large section gain in b does not cost
 *   the poles their precision.
 * Offset form (for poles near z = 1; v = 1 − z⁻¹ basis, first-difference signals exact in integers):
 *   order 1: a1 = −1 + d1;          y[n] = y[n−1] + β0 x[n] + β1 Δx[n] − d1 y[n−1]
 *            β0 = b0 + b1 (the numerator at z = 1), β1 = −b1, Δx[n] = x[n] − x[n−1]
 *   order 2: a1 = −2 + d1, a2 = 1 + d2;
 *            y[n] = 2y[n−1] − y[n−2] + β0 x[n] + β1 Δx[n] + β2 Δ²x[n] − d1 y[n−1] − d2 y[n−2]
 *            β0 = b0 + b1 + b2, β1 = −(b1 + 2 b2), β2 = b2, Δ²x[n] = x[n] − 2x[n−1] + x[n−2]
 *   The small coefficients (β0…β_{n−1}, d) form the "fine" group with a format of their own; the
 *   highest β forms the "main" group. Example: a lag pole at 0.9995 has d1 = 0.0005, stored in
 *   16 bits as round(0.0005 · 2^25) = 16777 instead of a1 = −0.9995 as round(−0.9995 · 2^14).
 *   A coefficient multiplying Δx (Δ²x) is limited to W − 2 (W − 3) magnitude bits so that
 *   every product fits the accumulator.
 */
import type { Complex } from '../dsp/types';
import type { Structure } from '../../schemas/implementation';
import type { SectionSpec } from './sections';

export type SignalName = 'x0' | 'x1' | 'x2' | 'y1' | 'y2' | 'dx' | 'ddx';

export interface Term {
  /** Coefficient name as shown in the coefficient table, e.g. "b0", "a1", "beta0", "d1". */
  name: string;
  /** Exact coefficient value (real). */
  exact: number;
  /** Quantized integer; its real value is coef / 2^shift of its group. */
  coef: number;
  signal: SignalName;
  /** true: the product is subtracted (feedback terms a and d). */
  subtract: boolean;
}

export interface TermGroup {
  /** Fractional bits F of this group's coefficients (format Qm.F of a W-bit word). */
  shift: number;
  terms: Term[];
}

export interface FixedSection {
  order: 1 | 2;
  zeros: Complex[];
  poles: Complex[];
  /** Exact coefficients of the section: b = [b0, b1, b2], a = [a1, a2] (ascending z⁻¹). */
  b: number[];
  a: number[];
  /** Groups sorted by ascending shift: groups[0] is the output format (F_lo). */
  groups: TermGroup[];
  /** Nominal feedback integers n1, n2: [0, 0] direct form I; [1, 0] or [2, −1] offset form. */
  nominal: [number, number];
  /** Coefficients that did not fit the word even with 0 fractional bits (clamped). */
  clamped: string[];
}

export interface FixedImplementation {
  kind: 'fixed';
  wordLength: 16 | 32;
  structure: 'direct-form-1' | 'offset-form-1';
  sections: FixedSection[];
  /** Output fraction bits G: the cascade computes y·2^G; the output is roundShift(y, G), clamped. */
  outputShift: number;
  outputMin: number;
  outputMax: number;
}

export interface FloatSection {
  order: 1 | 2;
  zeros: Complex[];
  poles: Complex[];
  b: number[];
  a: number[];
  /** Math.fround of b and a: the float32 values the C holds. */
  bf: number[];
  af: number[];
}

export interface FloatImplementation {
  kind: 'float';
  wordLength: 'float32';
  structure: 'transposed-direct-form-2';
  sections: FloatSection[];
  outputMin: number;
  outputMax: number;
}

export type Implementation = FixedImplementation | FloatImplementation;

const signalBits: Record<SignalName, number> = { x0: 0, x1: 0, x2: 0, y1: 0, y2: 0, dx: 1, ddx: 2 };

/** Largest magnitude a coefficient on this signal may take: 2^(W−1−extra) − 1. */
export const coefLimit = (wordLength: number, signal: SignalName) => 2 ** (wordLength - 1 - signalBits[signal]) - 1;

/** Rounds to nearest, ties away from zero (the coefficient rounding of this generator). */
export const roundHalfAway = (v: number) => Math.sign(v) * Math.round(Math.abs(v));

/**
 * Largest F in [0, 2W − 2] with |round(c · 2^F)| ≤ limit for every coefficient of the group;
 * null when even F = 0 does not fit (the coefficients are then clamped).
 */
export function chooseShift(wordLength: number, items: { exact: number; signal: SignalName }[]): number | null {
  const maxShift = 2 * wordLength - 2;
  const fits = (f: number) => items.every((t) => Math.abs(roundHalfAway(t.exact * 2 ** f)) <= coefLimit(wordLength, t.signal));
  if (!fits(0)) return null;
  if (items.every((t) => t.exact === 0)) return maxShift;
  let f = 0;
  while (f < maxShift && fits(f + 1)) f++;
  return f;
}

function makeGroup(wordLength: number, items: Omit<Term, 'coef'>[], clamped: string[], fallbackShift?: number): TermGroup {
  let shift = chooseShift(wordLength, items);
  if (shift === null) { shift = 0; }
  if (items.every((t) => t.exact === 0) && fallbackShift !== undefined) shift = fallbackShift;
  const terms = items.map((t) => {
    const lim = coefLimit(wordLength, t.signal);
    let coef = roundHalfAway(t.exact * 2 ** shift!);
    if (Math.abs(coef) > lim) { coef = Math.sign(coef) * lim; clamped.push(t.name); }
    return { ...t, coef };
  });
  return { shift, terms };
}

export function quantizeFixedSection(s: SectionSpec, wordLength: 16 | 32, structure: 'direct-form-1' | 'offset-form-1'): FixedSection {
  const clamped: string[] = [];
  const [b0, b1, b2] = s.b;
  const [a1, a2] = s.a;
  const base = { order: s.order, zeros: s.zeros, poles: s.poles, b: [...s.b], a: [...s.a], clamped };
  if (structure === 'direct-form-1') {
    const items: Omit<Term, 'coef'>[] = s.order === 1
      ? [
          { name: 'b0', exact: b0, signal: 'x0', subtract: false },
          { name: 'b1', exact: b1, signal: 'x1', subtract: false },
          { name: 'a1', exact: a1, signal: 'y1', subtract: true },
        ]
      : [
          { name: 'b0', exact: b0, signal: 'x0', subtract: false },
          { name: 'b1', exact: b1, signal: 'x1', subtract: false },
          { name: 'b2', exact: b2, signal: 'x2', subtract: false },
          { name: 'a1', exact: a1, signal: 'y1', subtract: true },
          { name: 'a2', exact: a2, signal: 'y2', subtract: true },
        ];
    // Numerator and feedback coefficients each get the format of their largest one; when both
    // formats coincide the section has a single group (a single rounding).
    const num = items.filter((t) => !t.subtract), fb = items.filter((t) => t.subtract);
    const gNum = makeGroup(wordLength, num, clamped);
    const gFb = makeGroup(wordLength, fb, clamped, gNum.shift);
    const groups = gNum.shift === gFb.shift
      ? [{ shift: gNum.shift, terms: [...gNum.terms, ...gFb.terms] }]
      : [gNum, gFb].sort((g, h) => g.shift - h.shift);
    return { ...base, groups, nominal: [0, 0] };
  }
  let fine: Omit<Term, 'coef'>[];
  let main: Omit<Term, 'coef'>[];
  let nominal: [number, number];
  if (s.order === 1) {
    fine = [
      { name: 'beta0', exact: b0 + b1, signal: 'x0', subtract: false },
      { name: 'd1', exact: a1 + 1, signal: 'y1', subtract: true },
    ];
    main = [{ name: 'beta1', exact: -b1, signal: 'dx', subtract: false }];
    nominal = [1, 0];
  } else {
    fine = [
      { name: 'beta0', exact: b0 + b1 + b2, signal: 'x0', subtract: false },
      { name: 'beta1', exact: -(b1 + 2 * b2), signal: 'dx', subtract: false },
      { name: 'd1', exact: a1 + 2, signal: 'y1', subtract: true },
      { name: 'd2', exact: a2 - 1, signal: 'y2', subtract: true },
    ];
    main = [{ name: 'beta2', exact: b2, signal: 'ddx', subtract: false }];
    nominal = [2, -1];
  }
  const gMain = makeGroup(wordLength, main, clamped);
  const gFine = makeGroup(wordLength, fine, clamped, gMain.shift);
  const mainFallback = main.every((t) => t.exact === 0) ? { ...gMain, shift: gFine.shift } : gMain;
  const groups = [gFine, mainFallback].sort((g, h) => g.shift - h.shift);
  return { ...base, groups, nominal };
}

/** Real values of the quantized section: b = [b0, b1, b2], a = [a1, a2]. */
export function quantizedCoefficients(sec: FixedSection): { b: number[]; a: number[] } {
  const val: Record<string, number> = {};
  for (const g of sec.groups) for (const t of g.terms) val[t.name] = t.coef / 2 ** g.shift;
  if (sec.nominal[0] === 0) {
    return { b: [val.b0 ?? 0, val.b1 ?? 0, val.b2 ?? 0], a: [val.a1 ?? 0, val.a2 ?? 0] };
  }
  if (sec.order === 1) {
    const b1 = -val.beta1;
    return { b: [val.beta0 - b1, b1, 0], a: [-1 + val.d1, 0] };
  }
  const b2 = val.beta2;
  const b1 = -val.beta1 - 2 * b2;
  return { b: [val.beta0 - b1 - b2, b1, b2], a: [-2 + val.d1, 1 + val.d2] };
}

export function quantizeFloatSection(s: SectionSpec): FloatSection {
  return { order: s.order, zeros: s.zeros, poles: s.poles, b: [...s.b], a: [...s.a], bf: s.b.map(Math.fround), af: s.a.map(Math.fround) };
}

export function quantize(
  specs: SectionSpec[],
  wordLength: 16 | 32 | 'float32',
  structure: Structure,
  outputMin: number,
  outputMax: number,
  outputShift = 0,
): Implementation {
  if (wordLength === 'float32') {
    return { kind: 'float', wordLength, structure: 'transposed-direct-form-2', sections: specs.map(quantizeFloatSection), outputMin, outputMax };
  }
  const st = structure === 'offset-form-1' ? 'offset-form-1' : 'direct-form-1';
  return { kind: 'fixed', wordLength, structure: st, sections: specs.map((s) => quantizeFixedSection(s, wordLength, st)), outputShift, outputMin, outputMax };
}

/** Significant bits of a quantized integer: 0 for 0, else floor(log2|c|) + 1. */
export const significantBits = (c: number) => (c === 0 ? 0 : Math.floor(Math.log2(Math.abs(c))) + 1);
