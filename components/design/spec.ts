import type { ApiIssue } from '../data/api';
import { defaultPrewarpRadPerSec, hasRootAtOrigin, METHOD_NAMES, type DiscretizeRequestBody } from '../../schemas/discretize';
import type { MethodName } from '../../schemas/discretize';
import { DEFAULT_TOLERANCES, designSpecSchema, type DesignSpec, type DesignSpecInput, type Tolerances } from '../../schemas/design';
import {
  buildCompensator,
  emptyFields,
  fieldForApiPath,
  fieldsFromCompensator,
  formatNumber,
  parseNumber,
  type EntryFields,
  type FieldErrors,
  type PlantFields,
} from './entry';

/**
 * The whole editor as text fields, and its conversion to the saved spec (schemas/design.ts)
 * and to the compute request (schemas/discretize.ts). Pure; the screen holds an EditorState.
 *
 * Error keys: "compensator.<field>" / "plant.<field>" (field keys of entry.ts), and the spec
 * paths "sampleRateHz", "prewarpHz", "bandHz", "delaySamples", "tolerances.<name>".
 */

export type ToleranceName = keyof Tolerances;
export const TOLERANCE_NAMES: ToleranceName[] = ['poleDriftPct', 'dcGainDriftPct', 'magErrorDb', 'phaseErrorDeg'];

export interface EditorState {
  entry: EntryFields;
  plantOn: boolean;
  plant: PlantFields;
  sampleRateHz: string;
  method: MethodName;
  /** '' = the compute API's default ω₀ */
  prewarpHz: string;
  /** '' = a quarter of Nyquist */
  bandHz: string;
  delaySamples: 0 | 1;
  tolerances: Record<ToleranceName, string>;
}

export function defaultTolerancesText(): Record<ToleranceName, string> {
  return {
    poleDriftPct: String(DEFAULT_TOLERANCES.poleDriftPct),
    dcGainDriftPct: String(DEFAULT_TOLERANCES.dcGainDriftPct),
    magErrorDb: String(DEFAULT_TOLERANCES.magErrorDb),
    phaseErrorDeg: String(DEFAULT_TOLERANCES.phaseErrorDeg),
  };
}

/** A new design starts empty in the lead form, Tustin chosen, no plant. */
export function newEditorState(): EditorState {
  return {
    entry: emptyFields('lead'),
    plantOn: false,
    plant: emptyFields('tf'),
    sampleRateHz: '',
    method: 'tustin',
    prewarpHz: '',
    bandHz: '',
    delaySamples: 0,
    tolerances: defaultTolerancesText(),
  };
}

/** A saved spec shown again in the editor (the entry form it was typed in, when known). */
export function editorStateFromSpec(spec: DesignSpec): EditorState {
  const plant = spec.plant ? fieldsFromCompensator(spec.plant) : emptyFields('tf');
  return {
    entry: fieldsFromCompensator(spec.compensator, spec.entry),
    plantOn: spec.plant !== undefined,
    plant: plant.form === 'zpk' || plant.form === 'tf' ? plant : emptyFields('tf'),
    sampleRateHz: formatNumber(spec.sampleRateHz),
    method: spec.method,
    prewarpHz: spec.prewarpHz === undefined ? '' : formatNumber(spec.prewarpHz),
    bandHz: spec.bandHz === undefined ? '' : formatNumber(spec.bandHz),
    delaySamples: spec.delaySamples ?? 0,
    tolerances: {
      poleDriftPct: formatNumber(spec.tolerances.poleDriftPct),
      dcGainDriftPct: formatNumber(spec.tolerances.dcGainDriftPct),
      magErrorDb: formatNumber(spec.tolerances.magErrorDb),
      phaseErrorDeg: formatNumber(spec.tolerances.phaseErrorDeg),
    },
  };
}

function optionalNumber(text: string, key: string, errors: FieldErrors): number | undefined {
  if (text.trim() === '') return undefined;
  const v = parseNumber(text);
  if (typeof v === 'string') {
    errors[key] = v;
    return undefined;
  }
  return v;
}

export interface SpecResult {
  spec?: DesignSpec;
  errors: FieldErrors;
}

/**
 * Editor → saved spec, checked by `designSpecSchema` (which also fills the tolerance
 * defaults). `keep` carries parts the editor does not show (the implementation choices).
 */
export function buildSpec(state: EditorState, keep?: Pick<DesignSpecInput, 'implementation'>): SpecResult {
  const errors: FieldErrors = {};
  const comp = buildCompensator(state.entry);
  for (const [k, m] of Object.entries(comp.errors)) errors[`compensator.${k}`] = m;
  let plant: DesignSpecInput['plant'];
  if (state.plantOn) {
    const p = buildCompensator(state.plant);
    for (const [k, m] of Object.entries(p.errors)) errors[`plant.${k}`] = m;
    plant = p.compensator;
  }
  const sampleRate = parseNumber(state.sampleRateHz);
  if (typeof sampleRate === 'string') errors.sampleRateHz = sampleRate;
  const prewarpHz = optionalNumber(state.prewarpHz, 'prewarpHz', errors);
  const bandHz = optionalNumber(state.bandHz, 'bandHz', errors);
  const tolerances: Partial<Record<ToleranceName, number>> = {};
  for (const name of TOLERANCE_NAMES) {
    const v = parseNumber(state.tolerances[name]);
    if (typeof v === 'string') errors[`tolerances.${name}`] = v;
    else tolerances[name] = v;
  }
  if (!comp.compensator || (state.plantOn && !plant) || Object.keys(errors).length > 0) return { errors };

  const candidate: DesignSpecInput = {
    compensator: comp.compensator,
    entry: comp.entry,
    ...(plant ? { plant } : {}),
    sampleRateHz: sampleRate as number,
    method: state.method,
    ...(prewarpHz !== undefined ? { prewarpHz } : {}),
    ...(bandHz !== undefined ? { bandHz } : {}),
    delaySamples: state.delaySamples,
    tolerances,
    ...(keep?.implementation !== undefined ? { implementation: keep.implementation } : {}),
  };
  const parsed = designSpecSchema.safeParse(candidate);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = fieldKeyForPath(state, issue.path.map(String).join('.'));
      if (!(key in errors)) errors[key] = issue.message;
    }
    return { errors };
  }
  return { spec: parsed.data, errors };
}

/**
 * A dotted API path ("compensator.poles.2", "spec.sampleRateHz", "plant.den") → the editor's
 * error key. Paths under `spec.` (save requests) are read the same as the compute API's.
 */
export function fieldKeyForPath(state: EditorState, path: string): string {
  const p = path.startsWith('spec.') ? path.slice(5) : path;
  if (p === 'compensator' || p.startsWith('compensator.')) return `compensator.${fieldForApiPath(state.entry, p.slice('compensator.'.length))}`;
  if (p === 'plant' || p.startsWith('plant.')) return `plant.${fieldForApiPath(state.plant, p.slice('plant.'.length))}`;
  if (p.startsWith('entry')) return `compensator.${fieldForApiPath(state.entry, '')}`;
  return p;
}

/** Server issues → editor error keys (first message per field wins); unplaced ones are returned apart. */
export function errorsFromIssues(state: EditorState, issues: readonly ApiIssue[]): { errors: FieldErrors; general: string[] } {
  const errors: FieldErrors = {};
  const general: string[] = [];
  for (const issue of issues) {
    if (issue.path === '' || issue.path === 'spec') {
      general.push(issue.message);
      continue;
    }
    const key = fieldKeyForPath(state, issue.path);
    if (!(key in errors)) errors[key] = issue.message;
  }
  return { errors, general };
}

export interface SkippedMethod {
  method: MethodName;
  reason: string;
}

/**
 * The compute request for a spec: all five methods, except those the API would refuse for
 * want of a prewarp frequency (DESIGN.md: no default ω₀ for the tf form, without a zero or
 * pole, or with the first one at s = 0) — those are listed with the reason instead.
 */
export function discretizeRequestFor(spec: DesignSpec, responsePoints = 240): { body: DiscretizeRequestBody; skipped: SkippedMethod[] } {
  const skipped: SkippedMethod[] = [];
  let methods: MethodName[] = [...METHOD_NAMES];
  if (spec.prewarpHz === undefined && defaultPrewarpRadPerSec(spec.compensator) === null) {
    skipped.push({ method: 'prewarp', reason: 'needs a prewarp frequency: no default ω₀ = √(|z₁|·|p₁|) for this compensator' });
    if (hasRootAtOrigin(spec.compensator)) {
      skipped.push({ method: 'matched', reason: 'needs a prewarp frequency: the DC gain is 0 or infinite, so the gain is matched at ω₀' });
    }
    methods = methods.filter((m) => !skipped.some((s) => s.method === m));
  }
  const body: DiscretizeRequestBody = {
    compensator: spec.compensator,
    sampleRateHz: spec.sampleRateHz,
    methods,
    ...(spec.prewarpHz !== undefined ? { prewarpHz: spec.prewarpHz } : {}),
    ...(spec.plant ? { plant: spec.plant } : {}),
    ...(spec.plant ? { delaySamples: spec.delaySamples ?? 0 } : {}),
    ...(spec.bandHz !== undefined ? { bandHz: spec.bandHz } : {}),
    responsePoints,
  };
  return { body, skipped };
}
