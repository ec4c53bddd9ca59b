/**
 * How the implementation screen names and prints things. Pure: no React.
 */
import type { Structure, WordLength } from '../../schemas/implementation';
import type { ImplementationAnalysisWire, ImplementationMetrics } from '../../schemas/implementation-api';
import { fmt } from '../design/format';

export const STRUCTURE_LABELS: Record<Structure, string> = {
  'direct-form-1': 'Direct form I',
  'offset-form-1': 'Offset form (poles near z = 1)',
  'transposed-direct-form-2': 'Transposed direct form II',
};

export const STRUCTURE_SHORT: Record<Structure, string> = {
  'direct-form-1': 'direct form I',
  'offset-form-1': 'offset form',
  'transposed-direct-form-2': 'transposed direct form II',
};

export function wordLengthLabel(w: WordLength): string {
  return w === 'float32' ? 'float32' : `${w}-bit`;
}

/** "16-bit direct form I", "float32 transposed direct form II". */
export function choiceLabel(c: { wordLength: WordLength; structure: Structure }): string {
  // float32 has one structure only: the word length says it all
  return c.wordLength === 'float32' ? 'float32' : `${wordLengthLabel(c.wordLength)} ${STRUCTURE_SHORT[c.structure]}`;
}

/** Marginal: a pole on the unit circle (e.g. an integrator at z = 1), none outside. */
const ON_CIRCLE = 1e-9;

/**
 * Stability of the ideal and the quantized poles in words. A pole at z = 1 (an integrator)
 * is "on the unit circle", not "unstable": that is how such a controller is designed.
 */
export function stabilityText(poles: { ideal: { re: number; im: number }; quantized: { re: number | null; im: number | null } }[]): string {
  const mag = (r: { re: number | null; im: number | null }) => (r.re === null || r.im === null ? NaN : Math.hypot(r.re, r.im));
  const state = (ms: number[]) =>
    ms.some((m) => !(m <= 1 + ON_CIRCLE)) ? 'outside' : ms.some((m) => m > 1 - ON_CIRCLE) ? 'on' : 'inside';
  const ideal = state(poles.map((p) => mag(p.ideal)));
  const quant = state(poles.map((p) => mag(p.quantized)));
  if (quant === 'inside') return ideal === 'inside' ? 'stable after quantization' : 'every quantized pole inside the unit circle';
  if (quant === 'on') return ideal === 'on' ? 'a pole stays on the unit circle (an integrator), as designed' : 'a pole moved onto the unit circle after quantization';
  return ideal === 'outside' ? 'a pole lies outside the unit circle, as in the ideal design' : 'UNSTABLE after quantization: a pole moved outside the unit circle';
}

/**
 * The Q format a coefficient is stored in, as the analysis names it: the group of its section
 * whose shift equals the coefficient's fractional bits ("Q2.13"); "float32" for float builds.
 */
export function formatOfCoefficient(
  sections: ImplementationAnalysisWire['sections'],
  row: { section: number; fractionalBits: number | null },
): string {
  const sec = sections.find((s) => s.index === row.section);
  if (!sec) return '—';
  if (row.fractionalBits === null) return sec.formats[0] ?? 'float32';
  const i = sec.shifts.indexOf(row.fractionalBits);
  return i >= 0 ? sec.formats[i] ?? '—' : '—';
}

/** Coefficient names as printed: "beta0" → "β0"; the others as they are ("b0", "a1", "d1"). */
export function coefficientLabel(name: string): string {
  return name.replace(/^beta/, 'β');
}

/** A percentage figure; null is shown as the reason it is null. */
export function pctText(v: number | null, whenNull = '∞'): string {
  if (v === null) return whenNull;
  if (v === 0) return '0 %';
  return `${fmt(v, 3)} %`;
}

export function dbText(v: number | null): string {
  if (v === null) return '∞';
  if (v === 0) return '0 dB';
  return `${fmt(v, 3)} dB`;
}

/** The three figures the tolerances apply to, in one line. */
export function metricsLine(m: ImplementationMetrics): string {
  return `pole drift ${pctText(m.poleDriftPct)} · DC-gain drift ${pctText(m.dcGainDriftPct, 'n/a')} · response error ${dbText(m.responseErrorDb)}`;
}

/**
 * How many times smaller `after` is than `before` ("40×"), for the offset-form improvement;
 * null when it is not smaller or either is unknown.
 */
export function improvementFactor(before: number | null, after: number | null): string | null {
  if (before === null || after === null || !(before > after)) return null;
  if (after === 0) return 'exact';
  const f = before / after;
  return f >= 100 ? `${Math.round(f).toLocaleString('en-US')}×` : `${fmt(f, 2)}×`;
}

/** A complex z-plane point: "0.930233", "0.98 ± 0.12j" style, one root at a time. */
export function zText(re: number | null, im: number | null, digits = 7): string {
  if (re === null || im === null) return 'lost (at ∞)';
  if (im === 0) return fmt(re, digits);
  return `${fmt(re, digits)} ${im < 0 ? '−' : '+'} ${fmt(Math.abs(im), digits)}j`;
}

/** The first `maxLines` lines of a text, and how many there are in all. */
export function clipLines(text: string, maxLines: number): { lines: string[]; total: number; clipped: boolean } {
  const all = text.replace(/\r\n/g, '\n').split('\n');
  if (all.length > 1 && all[all.length - 1] === '') all.pop();
  return { lines: all.slice(0, maxLines), total: all.length, clipped: all.length > maxLines };
}

/** "12.3 kB" for a byte count. */
export function sizeText(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1e6) return `${fmt(bytes / 1000, 3)} kB`;
  return `${fmt(bytes / 1e6, 3)} MB`;
}

/** The last part of a bundle path, for a file tab: "include/tilt.h" → "tilt.h". */
export function fileTabLabel(path: string): string {
  const parts = path.split('/');
  return parts[parts.length - 1] || path;
}
