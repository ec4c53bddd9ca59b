import type { z } from 'zod';
import type { CompensatorInput, RootInput } from '../../schemas/compensator';
import { compensatorSchema, rootIm, rootRe } from '../../schemas/compensator';
import type { DesignEntry } from '../../schemas/design';

/**
 * Pure conversions between what the editor's text fields hold and the shared
 * `compensatorSchema` value (DESIGN.md conventions: roots in rad/s, time constants in s,
 * zpk value = K · Π(s − zᵢ) / Π(s − pᵢ), tf polynomials in descending powers of s).
 *
 * Field keys name the editor field an error belongs to, relative to the transfer function
 * being entered: "gain", "zero", "pole", "tauZero", "tauPole", "zeros.<row>", "poles.<row>",
 * "num", "den", "r1" … "r4", "c1", "c2". Schema paths ("zeros.2", "num.0") are mapped onto them with `fieldForPath`.
 */

// ------------------------------------------------------------------ form states

/** K(s + zero)/(s + pole): a lead when zero < pole, a lag when zero > pole. */
export interface LeadFields {
  form: 'lead';
  gain: string;
  zero: string;
  pole: string;
}

/** K(τz·s + 1)/(τp·s + 1): K is the DC gain. */
export interface TimeConstantFields {
  form: 'time-constant';
  gain: string;
  tauZero: string;
  tauPole: string;
}

/** One row of a zpk list: a real root (im empty or 0) or the conjugate pair re ± j·|im|. */
export interface RootRow {
  re: string;
  im: string;
}

export interface ZpkFields {
  form: 'zpk';
  gain: string;
  zeros: RootRow[];
  poles: RootRow[];
}

/** Coefficients as text, descending powers of s, separated by commas or spaces: "1, 5, 0" is s² + 5s. */
export interface TfFields {
  form: 'tf';
  num: string;
  den: string;
}

/**
 * The two-op-amp lead/lag network: first stage inverting with input R1‖C1 and feedback R2‖C2,
 * second stage inverting with input R3 and feedback R4. Values as typed, ohms and farads with
 * SI prefixes allowed: "10k", "4.7u", "100n", "4k7".
 */
export interface OpAmpFields {
  form: 'op-amp';
  r1: string;
  c1: string;
  r2: string;
  c2: string;
  r3: string;
  r4: string;
}
export const OP_AMP_PARTS = ['r1', 'c1', 'r2', 'c2', 'r3', 'r4'] as const;
export type OpAmpPart = (typeof OP_AMP_PARTS)[number];

export type EntryFields = LeadFields | TimeConstantFields | ZpkFields | TfFields | OpAmpFields;
export type EntryForm = EntryFields['form'];
/** The plant has no lead or time-constant form. */
export type PlantFields = ZpkFields | TfFields;

export type FieldErrors = Record<string, string>;

export interface BuildResult {
  /** present when every field parsed and the shared schema accepted the result */
  compensator?: CompensatorInput;
  /** how it was entered (DesignEntry of schemas/design.ts) */
  entry?: DesignEntry;
  errors: FieldErrors;
}

// ------------------------------------------------------------------ numbers

/** A finite number from a text field, or a message. "" is not 0. Accepts 1e3, -2.5, +4. */
export function parseNumber(text: string): number | string {
  const t = text.trim().replace(/−/g, '-');
  if (t === '') return 'Enter a number';
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t)) return 'Not a number';
  const v = Number(t);
  return Number.isFinite(v) ? v : 'Not a finite number';
}

/** Coefficients "1, 5, 0" or "1 5 0" (descending powers) → [1, 5, 0], or a message. */
export function parseCoefficients(text: string): number[] | string {
  const parts = text
    .trim()
    .split(/[\s,;]+/)
    .filter((p) => p !== '');
  if (parts.length === 0) return 'Enter at least one coefficient';
  const out: number[] = [];
  for (const [i, p] of parts.entries()) {
    const v = parseNumber(p);
    if (typeof v === 'string') return `Coefficient ${i + 1} ("${p}"): ${v.toLowerCase()}`;
    out.push(v);
  }
  return out;
}

/** SI prefixes accepted in component values; µ and μ both mean micro, and "u" is the ASCII spelling. */
const SI_EXPONENT: Record<string, number> = { p: -12, n: -9, u: -6, 'µ': -6, 'μ': -6, m: -3, k: 3, M: 6, G: 9 };

/**
 * A component value with an optional SI prefix and unit → ohms or farads, or a message.
 * "10k" → 1e4, "4.7u" → 4.7e-6, "100n" → 1e-7, "2.2M" → 2.2e6, "1m" → 1e-3 (case matters:
 * m is milli, M mega); the letter may stand for the decimal point ("4k7" → 4700, "4R7" → 4.7 Ω);
 * a trailing unit is allowed ("10 kΩ", "10kohm", "470R", "100nF"). The decimal is read as one
 * literal ("4.7e-6"), so "4.7u" is exactly the double nearest 4.7·10⁻⁶.
 */
export function parseSi(text: string, unit: 'ohm' | 'farad'): number | string {
  let t = text.trim().replace(/−/g, '-').replace(/\s+/g, '');
  if (t === '') return 'Enter a value';
  t = unit === 'ohm' ? t.replace(/(Ω|ohms?)$/i, '') : t.replace(/F$/i, '');
  const rkm = /^(\d+)([pnuµμmkMGR])(\d+)$/.exec(t);
  if (rkm) {
    const [, whole, letter, frac] = rkm;
    if (letter === 'R' && unit !== 'ohm') return 'R marks the decimal point of a resistance only';
    const e = letter === 'R' ? 0 : SI_EXPONENT[letter];
    return Number(`${whole}.${frac}e${e}`);
  }
  if (unit === 'ohm' && /R$/.test(t)) t = t.slice(0, -1);
  const m = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)([pnuµμmkMG])?$/i.exec(t);
  // the prefix match is case-insensitive above only to give a clear message for e.g. "10K"
  if (!m) return unit === 'ohm' ? 'Not a resistance (e.g. 10k, 4k7, 470)' : 'Not a capacitance (e.g. 100n, 4.7u)';
  const [, mantissa, prefix] = m;
  if (prefix === undefined) {
    const v = Number(mantissa);
    return Number.isFinite(v) ? v : 'Not a finite number';
  }
  if (!(prefix in SI_EXPONENT)) return `Unknown prefix "${prefix}" (use p, n, u, m, k, M or G; m is milli, M mega)`;
  if (/e/i.test(mantissa)) return 'Use an exponent or a prefix, not both';
  const v = Number(`${mantissa}e${SI_EXPONENT[prefix]}`);
  return Number.isFinite(v) ? v : 'Not a finite number';
}

/** Ohms or farads as short text with an SI prefix (ASCII u for micro): 4700 → "4.7k", 1e-7 → "100n". */
export function formatSi(v: number): string {
  if (v === 0 || !Number.isFinite(v)) return formatNumber(v);
  const e3 = Math.min(9, Math.max(-12, Math.floor(Math.log10(Math.abs(v)) / 3) * 3));
  let mantissa = Number((v / 10 ** e3).toPrecision(12));
  let e = e3;
  if (Math.abs(mantissa) >= 1000 && e < 9) {
    mantissa = Number((mantissa / 1000).toPrecision(12));
    e += 3;
  }
  const prefix = Object.entries(SI_EXPONENT).find(([p, x]) => x === e && p !== 'µ' && p !== 'μ')?.[0] ?? '';
  return `${formatNumber(mantissa)}${prefix}`;
}

/** Shortest text that gives the number back to 12 significant digits. */
export function formatNumber(v: number): string {
  if (v === 0) return '0';
  return String(Number(v.toPrecision(12)));
}

// ------------------------------------------------------------------ the exact conversions

/** K(s + z)/(s + p) → zpk: zero at −z, pole at −p, root-locus gain K (leading coefficients 1). */
export function leadToZpk(gain: number, zeroRadPerSec: number, poleRadPerSec: number): CompensatorInput {
  return { form: 'zpk', zeros: [-zeroRadPerSec], poles: [-poleRadPerSec], gain };
}

/**
 * K(τz·s + 1)/(τp·s + 1) = K·(τz/τp) · (s + 1/τz)/(s + 1/τp): zero −1/τz, pole −1/τp,
 * root-locus gain K·τz/τp (factor τz out of the numerator and τp out of the denominator).
 */
export function timeConstantToZpk(gain: number, tauZeroSec: number, tauPoleSec: number): CompensatorInput {
  return { form: 'zpk', zeros: [-1 / tauZeroSec], poles: [-1 / tauPoleSec], gain: (gain * tauZeroSec) / tauPoleSec };
}

/**
 * The two-op-amp lead/lag network → zpk (standard circuit result, from memory):
 *   H(s) = (R4·C1)/(R3·C2) · (s + 1/(R1C1)) / (s + 1/(R2C2)).
 * Derivation from the impedances: Z1 = R1‖(1/(C1s)) = R1/(1 + R1C1s), Z2 = R2/(1 + R2C2s).
 * Inverting stage one gives −Z2/Z1 = −(R2/R1)·(1 + R1C1s)/(1 + R2C2s); inverting stage two
 * −R4/R3. The product (the two minus signs cancel) is
 *   (R2R4)/(R1R3) · (1 + R1C1s)/(1 + R2C2s)
 *   = (R2R4)/(R1R3) · (R1C1)/(R2C2) · (s + 1/(R1C1))/(s + 1/(R2C2))
 *   = (R4C1)/(R3C2) · (s + 1/(R1C1))/(s + 1/(R2C2)).
 * Zero at −1/(R1C1), pole at −1/(R2C2), root-locus gain R4C1/(R3C2), DC gain R2R4/(R1R3);
 * a lead when R1C1 > R2C2 (zero below the pole), a lag when R1C1 < R2C2.
 * Units: ohms and farads in, rad/s out.
 */
export function opAmpToZpk(v: Record<OpAmpPart, number>): CompensatorInput {
  return { form: 'zpk', zeros: [-1 / (v.r1 * v.c1)], poles: [-1 / (v.r2 * v.c2)], gain: (v.r4 * v.c1) / (v.r3 * v.c2) };
}

/** Inverse of timeConstantToZpk for one real zero and pole, both strictly negative; else null. */
export function zpkToTimeConstant(c: CompensatorInput): { gain: number; tauZero: number; tauPole: number } | null {
  const lead = zpkToLead(c);
  if (!lead) return null;
  // K_rl (s + z)/(s + p) = K_rl·z/p · (s/z + 1)/(s/p + 1): DC gain K_rl·z/p.
  return { gain: (lead.gain * lead.zero) / lead.pole, tauZero: 1 / lead.zero, tauPole: 1 / lead.pole };
}

/** One real zero −z and one real pole −p with z, p > 0 → {gain, zero: z, pole: p}; else null. */
export function zpkToLead(c: CompensatorInput): { gain: number; zero: number; pole: number } | null {
  if (c.form !== 'zpk' || c.zeros.length !== 1 || c.poles.length !== 1) return null;
  const [z0] = c.zeros;
  const [p0] = c.poles;
  if (rootIm(z0) !== 0 || rootIm(p0) !== 0 || !(rootRe(z0) < 0) || !(rootRe(p0) < 0)) return null;
  return { gain: c.gain, zero: -rootRe(z0), pole: -rootRe(p0) };
}

/**
 * Root rows → roots (blank rows skipped): a row with im ≠ 0 gives the conjugate pair re + j|im|, re − j|im|
 * (in that order). `rowOfRoot[i]` is the row root i came from, to place schema errors.
 */
export function rowsToRoots(rows: RootRow[]): { roots: RootInput[]; rowOfRoot: number[]; errors: Record<number, string> } {
  const roots: RootInput[] = [];
  const rowOfRoot: number[] = [];
  const errors: Record<number, string> = {};
  rows.forEach((row, r) => {
    if (row.re.trim() === '' && row.im.trim() === '') return; // a blank row is no root
    const re = parseNumber(row.re);
    const im = row.im.trim() === '' ? 0 : parseNumber(row.im);
    if (typeof re === 'string') {
      errors[r] = `Real part: ${re.toLowerCase()}`;
      return;
    }
    if (typeof im === 'string') {
      errors[r] = `Imaginary part: ${im.toLowerCase()}`;
      return;
    }
    if (im === 0) {
      roots.push(re);
      rowOfRoot.push(r);
    } else {
      const a = Math.abs(im);
      roots.push({ re, im: a }, { re, im: -a });
      rowOfRoot.push(r, r);
    }
  });
  return { roots, rowOfRoot, errors };
}

/** Roots → rows: one row per real root and per conjugate pair (the member with im > 0). */
export function rootsToRows(roots: readonly (RootInput | { re: number; im: number })[]): RootRow[] {
  const rows: RootRow[] = [];
  for (const r of roots) {
    const re = typeof r === 'number' ? r : r.re;
    const im = typeof r === 'number' ? 0 : r.im;
    if (im < 0) continue; // the conjugate of a row already written
    rows.push({ re: formatNumber(re), im: im === 0 ? '' : formatNumber(im) });
  }
  return rows;
}

// ------------------------------------------------------------------ fields → compensator

function numberField(text: string, key: string, errors: FieldErrors): number | undefined {
  const v = parseNumber(text);
  if (typeof v === 'string') {
    errors[key] = v;
    return undefined;
  }
  return v;
}

/** Schema issue path (relative to the compensator, e.g. ["zeros", 2]) → field key of this form. */
export function fieldForPath(fields: EntryFields, path: ReadonlyArray<PropertyKey>, rowOfRoot?: { zeros: number[]; poles: number[] }): string {
  const [head, index] = path;
  switch (fields.form) {
    case 'lead':
      if (head === 'zeros') return 'zero';
      if (head === 'poles') return 'pole';
      return 'gain';
    case 'time-constant':
      if (head === 'zeros') return 'tauZero';
      if (head === 'poles') return 'tauPole';
      return 'gain';
    case 'zpk':
      if (head === 'zeros' || head === 'poles') {
        if (typeof index === 'number') return `${head}.${rowOfRoot?.[head][index] ?? index}`;
        return head;
      }
      return 'gain';
    case 'tf':
      return head === 'den' ? 'den' : 'num';
    case 'op-amp':
      // the zero is set by R1C1, the pole by R2C2, the gain by R4/R3 (and C1/C2)
      if (head === 'zeros') return 'r1';
      if (head === 'poles') return 'r2';
      return 'r4';
  }
}

function firstErrors(issues: z.core.$ZodIssue[], place: (path: PropertyKey[]) => string, errors: FieldErrors): void {
  for (const issue of issues) {
    const key = place(issue.path);
    if (!(key in errors)) errors[key] = issue.message;
  }
}

/**
 * The editor's fields → the shared compensator value, checked by `compensatorSchema`.
 * Number errors come first (per field), then the schema's (mapped to fields).
 */
export function buildCompensator(fields: EntryFields): BuildResult {
  const errors: FieldErrors = {};
  let candidate: CompensatorInput | undefined;
  let entry: DesignEntry | undefined;
  let rowOfRoot: { zeros: number[]; poles: number[] } | undefined;

  switch (fields.form) {
    case 'lead': {
      const gain = numberField(fields.gain, 'gain', errors);
      const zero = numberField(fields.zero, 'zero', errors);
      const pole = numberField(fields.pole, 'pole', errors);
      if (zero !== undefined && !(zero > 0)) errors.zero = 'The zero must be greater than 0 (it lies at s = −zero)';
      if (pole !== undefined && !(pole > 0)) errors.pole = 'The pole must be greater than 0 (it lies at s = −pole)';
      if (gain !== undefined && zero !== undefined && pole !== undefined && !errors.zero && !errors.pole) {
        candidate = leadToZpk(gain, zero, pole);
        entry = { form: 'lead', gain, zero, pole };
      }
      break;
    }
    case 'time-constant': {
      const gain = numberField(fields.gain, 'gain', errors);
      const tauZero = numberField(fields.tauZero, 'tauZero', errors);
      const tauPole = numberField(fields.tauPole, 'tauPole', errors);
      if (tauZero !== undefined && !(tauZero > 0)) errors.tauZero = 'The time constant must be greater than 0';
      if (tauPole !== undefined && !(tauPole > 0)) errors.tauPole = 'The time constant must be greater than 0';
      if (gain !== undefined && tauZero !== undefined && tauPole !== undefined && !errors.tauZero && !errors.tauPole) {
        candidate = timeConstantToZpk(gain, tauZero, tauPole);
        entry = { form: 'time-constant', gain, tauZero, tauPole };
      }
      break;
    }
    case 'zpk': {
      const gain = numberField(fields.gain, 'gain', errors);
      const zeros = rowsToRoots(fields.zeros);
      const poles = rowsToRoots(fields.poles);
      for (const [r, m] of Object.entries(zeros.errors)) errors[`zeros.${r}`] = m;
      for (const [r, m] of Object.entries(poles.errors)) errors[`poles.${r}`] = m;
      rowOfRoot = { zeros: zeros.rowOfRoot, poles: poles.rowOfRoot };
      if (gain !== undefined && Object.keys(errors).length === 0) {
        candidate = { form: 'zpk', zeros: zeros.roots, poles: poles.roots, gain };
        entry = { form: 'zpk' };
      }
      break;
    }
    case 'op-amp': {
      const values: Partial<Record<OpAmpPart, number>> = {};
      for (const part of OP_AMP_PARTS) {
        const v = parseSi(fields[part], part.startsWith('r') ? 'ohm' : 'farad');
        if (typeof v === 'string') errors[part] = v;
        else if (!(v > 0)) errors[part] = `${part.toUpperCase()} must be greater than 0`;
        else values[part] = v;
      }
      if (Object.keys(errors).length === 0) {
        const v = values as Record<OpAmpPart, number>;
        candidate = opAmpToZpk(v);
        entry = { form: 'op-amp', ...v };
      }
      break;
    }
    case 'tf': {
      const num = parseCoefficients(fields.num);
      const den = parseCoefficients(fields.den);
      if (typeof num === 'string') errors.num = num;
      if (typeof den === 'string') errors.den = den;
      if (typeof num !== 'string' && typeof den !== 'string') {
        candidate = { form: 'tf', num, den };
        entry = { form: 'tf' };
      }
      break;
    }
  }

  if (!candidate) return { errors };
  const parsed = compensatorSchema.safeParse(candidate);
  if (!parsed.success) {
    firstErrors(parsed.error.issues, (path) => fieldForPath(fields, path, rowOfRoot), errors);
    return { errors };
  }
  return { compensator: parsed.data, entry, errors };
}

/**
 * For a dotted API issue path relative to this transfer function ("poles.1", "gain"), the
 * field key of the current form. zpk rows are found again from the fields themselves.
 */
export function fieldForApiPath(fields: EntryFields, relativePath: string): string {
  const parts = relativePath.split('.').filter((p) => p !== '').map((p) => (/^\d+$/.test(p) ? Number(p) : p));
  let rowOfRoot: { zeros: number[]; poles: number[] } | undefined;
  if (fields.form === 'zpk') rowOfRoot = { zeros: rowsToRoots(fields.zeros).rowOfRoot, poles: rowsToRoots(fields.poles).rowOfRoot };
  return fieldForPath(fields, parts, rowOfRoot);
}

// ------------------------------------------------------------------ compensator → fields (reopen, switch form)

/** Fields that show a saved compensator again, in the form it was entered when that is known. */
export function fieldsFromCompensator(c: CompensatorInput, entry?: DesignEntry): EntryFields {
  if (entry?.form === 'lead') {
    return { form: 'lead', gain: formatNumber(entry.gain), zero: formatNumber(entry.zero), pole: formatNumber(entry.pole) };
  }
  if (entry?.form === 'time-constant') {
    return { form: 'time-constant', gain: formatNumber(entry.gain), tauZero: formatNumber(entry.tauZero), tauPole: formatNumber(entry.tauPole) };
  }
  if (entry?.form === 'op-amp') {
    return { form: 'op-amp', r1: formatSi(entry.r1), c1: formatSi(entry.c1), r2: formatSi(entry.r2), c2: formatSi(entry.c2), r3: formatSi(entry.r3), r4: formatSi(entry.r4) };
  }
  if (c.form === 'tf') return { form: 'tf', num: c.num.map(formatNumber).join(', '), den: c.den.map(formatNumber).join(', ') };
  return { form: 'zpk', gain: formatNumber(c.gain), zeros: rootsToRows(c.zeros), poles: rootsToRows(c.poles) };
}

/**
 * The polynomials of H(s) as the server parsed them (its `continuous` answer), for switching
 * to the tf form without expanding roots here.
 */
export interface ParsedContinuous {
  zeros: { re: number; im: number }[];
  poles: { re: number; im: number }[];
  gain: number;
  numDescending: number[];
  denDescending: number[];
}

/**
 * Fields of another form holding the same H(s). Lead, time-constant and zpk convert exactly
 * here; tf ↔ zpk take the server's parsed answer (`parsed`), when there is one. Where the value
 * cannot be written in the target form (e.g. a complex pair in the lead form), the target
 * form starts empty.
 */
export function switchForm(target: EntryForm, current: EntryFields, parsed?: ParsedContinuous): EntryFields {
  if (target === current.form) return current;
  const built = buildCompensator(current).compensator;
  let zpk: CompensatorInput | undefined = built?.form === 'zpk' ? built : undefined;
  if (!zpk && parsed && built) zpk = { form: 'zpk', zeros: parsed.zeros.map((r) => (r.im === 0 ? r.re : r)), poles: parsed.poles.map((r) => (r.im === 0 ? r.re : r)), gain: parsed.gain };
  switch (target) {
    case 'lead': {
      const l = zpk ? zpkToLead(zpk) : null;
      return l ? { form: 'lead', gain: formatNumber(l.gain), zero: formatNumber(l.zero), pole: formatNumber(l.pole) } : emptyFields('lead');
    }
    case 'time-constant': {
      const tc = zpk ? zpkToTimeConstant(zpk) : null;
      return tc ? { form: 'time-constant', gain: formatNumber(tc.gain), tauZero: formatNumber(tc.tauZero), tauPole: formatNumber(tc.tauPole) } : emptyFields('time-constant');
    }
    case 'zpk':
      return zpk && zpk.form === 'zpk' ? fieldsFromCompensator(zpk) : emptyFields('zpk');
    case 'tf':
      if (built?.form === 'tf') return current;
      if (parsed && built) return { form: 'tf', num: parsed.numDescending.map(formatNumber).join(', '), den: parsed.denDescending.map(formatNumber).join(', ') };
      return emptyFields('tf');
    case 'op-amp':
      // component values do not follow from H(s) alone (one degree of freedom per stage)
      return emptyFields('op-amp');
  }
}

export function emptyFields(form: 'lead'): LeadFields;
export function emptyFields(form: 'time-constant'): TimeConstantFields;
export function emptyFields(form: 'zpk'): ZpkFields;
export function emptyFields(form: 'tf'): TfFields;
export function emptyFields(form: 'op-amp'): OpAmpFields;
export function emptyFields(form: EntryForm): EntryFields;
export function emptyFields(form: EntryForm): EntryFields {
  switch (form) {
    case 'lead':
      return { form, gain: '', zero: '', pole: '' };
    case 'time-constant':
      return { form, gain: '', tauZero: '', tauPole: '' };
    case 'zpk':
      return { form, gain: '', zeros: [], poles: [{ re: '', im: '' }] };
    case 'tf':
      return { form, num: '', den: '' };
    case 'op-amp':
      return { form, r1: '', c1: '', r2: '', c2: '', r3: '', r4: '' };
  }
}
