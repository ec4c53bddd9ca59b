/**
 * The implementation form as text fields ↔ the shared ImplementationSettings, and the preview
 * request built from a saved design spec. Pure: no React, no network.
 *
 * Units: input and output scale in real units per LSB (an ADC's volts per count, 3.3/4096);
 * output limits in raw counts for fixed point, in real output units for float32.
 */
import type { DesignSpec } from '../../schemas/design';
import {
  effectiveStructure,
  implementationSettingsSchema,
  wordRange,
  type ImplementationSettings,
  type Structure,
  type WordLength,
} from '../../schemas/implementation';
import type { ImplementRequestBody } from '../../schemas/implementation-api';

export type WordLengthChoice = '16' | '32' | 'float32';

/** The form's state: what the user typed, as typed. */
export interface SettingsForm {
  wordLength: WordLengthChoice;
  inputScale: string;
  outputScale: string;
  limitMin: string;
  limitMax: string;
  prefix: string;
  structure: Structure;
}

/** Field keys of the form, as the error map uses them. */
export type SettingsField = 'wordLength' | 'inputScale' | 'outputScale' | 'limitMin' | 'limitMax' | 'prefix' | 'structure';
export type SettingsErrors = Partial<Record<SettingsField, string>>;

/** Dotted schema paths (inside the settings object) → form fields. */
const FIELD_OF_PATH: Record<string, SettingsField> = {
  wordLength: 'wordLength',
  inputScale: 'inputScale',
  outputScale: 'outputScale',
  'outputLimits.min': 'limitMin',
  'outputLimits.max': 'limitMax',
  outputLimits: 'limitMax',
  prefix: 'prefix',
  structure: 'structure',
};

export const toWordLength = (c: WordLengthChoice): WordLength => (c === 'float32' ? 'float32' : c === '16' ? 16 : 32);
export const fromWordLength = (w: WordLength): WordLengthChoice => (w === 'float32' ? 'float32' : w === 16 ? '16' : '32');

/** Structures a word length may use: fixed point has two, float32 one. */
export function structuresFor(choice: WordLengthChoice): Structure[] {
  return choice === 'float32' ? ['transposed-direct-form-2'] : ['direct-form-1', 'offset-form-1'];
}

/**
 * A real number as typed: a decimal ("0.001", "1e-3", "−2") or a ratio of two ("3.3/4096").
 * NaN when it is neither, so the shared schema says what is wrong.
 */
export function parseRealNumber(text: string): number {
  const t = text.trim().replace(/\u2212/g, '-').replace(/\s+/g, '');
  if (t === '') return NaN;
  const num = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
  const parts = t.split('/');
  if (parts.length === 1) return num.test(t) ? Number(t) : NaN;
  if (parts.length === 2 && num.test(parts[0]) && num.test(parts[1])) {
    const d = Number(parts[1]);
    return d === 0 ? NaN : Number(parts[0]) / d;
  }
  return NaN;
}

/** A C prefix from a design name: "Camera mount — tilt axis lead" → "camera_mount_tilt_axis_lead" (≤ 31 characters). */
export function prefixFromName(name: string): string {
  let p = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '');
  if (p === '') p = 'controller';
  if (/^[0-9]/.test(p)) p = `c_${p}`;
  p = p.slice(0, 31).replace(/_+$/, '');
  return implementationSettingsSchema.shape.prefix.safeParse(p).success ? p : `${p.slice(0, 26)}_ctrl`;
}

/** Number as the form shows it: exact round trip, no exponent for ordinary values. */
export function numberText(v: number): string {
  return String(v);
}

export function formFromSettings(s: ImplementationSettings): SettingsForm {
  return {
    wordLength: fromWordLength(s.wordLength),
    inputScale: numberText(s.inputScale),
    outputScale: numberText(s.outputScale),
    limitMin: numberText(s.outputLimits.min),
    limitMax: numberText(s.outputLimits.max),
    prefix: s.prefix,
    structure: effectiveStructure(s),
  };
}

/** A starting point when a design has no settings yet: 16 bits, unit scales, the whole word as limits. */
export function defaultForm(designName: string): SettingsForm {
  const w = wordRange(16);
  return { wordLength: '16', inputScale: '1', outputScale: '1', limitMin: String(w.min), limitMax: String(w.max), prefix: prefixFromName(designName), structure: 'direct-form-1' };
}

/** The saved settings of a spec, when they are valid; null when absent or not readable. */
export function savedSettings(spec: Pick<DesignSpec, 'implementation'> | undefined): ImplementationSettings | null {
  if (!spec || spec.implementation === undefined || spec.implementation === null) return null;
  const parsed = implementationSettingsSchema.safeParse(spec.implementation);
  return parsed.success ? parsed.data : null;
}

/**
 * A new word length keeps what carries over: a structure that word length cannot use becomes
 * its default, and whole-word limits follow the new word.
 */
export function withWordLength(form: SettingsForm, choice: WordLengthChoice): SettingsForm {
  const allowed = structuresFor(choice);
  const structure = allowed.includes(form.structure) ? form.structure : allowed[0];
  let { limitMin, limitMax } = form;
  if (form.wordLength !== 'float32' && choice !== 'float32') {
    const before = wordRange(toWordLength(form.wordLength) as 16 | 32);
    const after = wordRange(toWordLength(choice) as 16 | 32);
    if (parseRealNumber(limitMin) === before.min) limitMin = String(after.min);
    if (parseRealNumber(limitMax) === before.max) limitMax = String(after.max);
  }
  return { ...form, wordLength: choice, structure, limitMin, limitMax };
}

/** Settings object (not yet validated) from the form; unreadable numbers become NaN. */
function candidate(form: SettingsForm) {
  return {
    wordLength: toWordLength(form.wordLength),
    inputScale: parseRealNumber(form.inputScale),
    outputScale: parseRealNumber(form.outputScale),
    outputLimits: { min: parseRealNumber(form.limitMin), max: parseRealNumber(form.limitMax) },
    prefix: form.prefix.trim(),
    structure: form.structure,
  };
}

/** Validates the form with the shared schema: the settings, or the message per field. */
export function buildSettings(form: SettingsForm): { settings: ImplementationSettings | null; errors: SettingsErrors } {
  const parsed = implementationSettingsSchema.safeParse(candidate(form));
  if (parsed.success) return { settings: parsed.data, errors: {} };
  return { settings: null, errors: errorsFromPaths(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))) };
}

/**
 * Field errors from issue paths, either of the settings schema ("prefix") or of an API answer
 * ("settings.prefix" from /implement, "spec.implementation.prefix" from saving a spec). The
 * first message per field wins; paths that match no field go to `general`.
 */
export function errorsFromPaths(issues: { path: string; message: string }[]): SettingsErrors & { general?: string[] } {
  const out: SettingsErrors & { general?: string[] } = {};
  for (const { path, message } of issues) {
    const inner = path.replace(/^(spec\.implementation|settings)\.?/, '');
    const field = FIELD_OF_PATH[inner];
    if (field) {
      if (!out[field]) out[field] = message;
    } else {
      (out.general ??= []).push(path && inner === path ? `${path}: ${message}` : message);
    }
  }
  return out;
}

/** Same settings? Compared after the defaults apply (a missing structure is its default). */
export function sameSettings(a: ImplementationSettings | null, b: ImplementationSettings | null): boolean {
  if (!a || !b) return a === b;
  return (
    a.wordLength === b.wordLength &&
    a.inputScale === b.inputScale &&
    a.outputScale === b.outputScale &&
    a.outputLimits.min === b.outputLimits.min &&
    a.outputLimits.max === b.outputLimits.max &&
    a.prefix === b.prefix &&
    effectiveStructure(a) === effectiveStructure(b)
  );
}

/** The preview request for these settings on this saved design. */
export function implementRequestFor(spec: DesignSpec, settings: ImplementationSettings): ImplementRequestBody {
  return {
    compensator: spec.compensator,
    sampleRateHz: spec.sampleRateHz,
    method: spec.method,
    ...(spec.prewarpHz === undefined ? {} : { prewarpHz: spec.prewarpHz }),
    settings: { ...settings, structure: effectiveStructure(settings) },
  };
}

/** The spec to save: the saved one with these settings (a new version when they changed). */
export function specWithSettings(spec: DesignSpec, settings: ImplementationSettings): DesignSpec {
  return { ...spec, implementation: { ...settings, structure: effectiveStructure(settings) } };
}
