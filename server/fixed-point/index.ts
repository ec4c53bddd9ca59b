/**
 * Fixed-point (and float32) implementation of a discrete controller: sections, quantization,
 * analysis with warnings and word-length advice, and the test vectors of the bit-exact model.
 * Plain module: no HTTP, no database.
 *
 * Example:
 *   const a = analyzeImplementation({ zpk, tf }, { wordLength: 16, inputScale: 1, outputScale: 1,
 *     outputLimits: { min: -30000, max: 30000 }, prefix: 'lead' });
 *   a.coefficients  // [{ section: 1, name: 'b0', exact: 23.47…, integer: 24035, fractionalBits: 10, … }, …]
 *   a.warnings      // [{ code: 'dc-gain-drift', severity: 'problem', message: '…' }]
 */
import type { DiscreteTf, Zpk } from '../dsp/types';
import { effectiveStructure, DEFAULT_TOLERANCES } from '../../schemas/implementation';
import type { ImplementationSettings, Structure, Tolerances, WordLength } from '../../schemas/implementation';
import { toSections, sectionMagnitude, SCALING_GRID, type SectionSpec } from './sections';
import { quantize, type Implementation } from './quantize';
import { analyzeQuantized, headroom, referenceBound, RESPONSE_GRID, cascadeResponse, realSections } from './analysis';
import type { CoefficientRow, Metrics, NodeHeadroom, RootDrift, Warning } from './analysis';
import { runFixed, runFloat, runImplementation, filterIdeal } from './model';
import { buildInput, type Segment } from './vectors';

export type { Implementation, FixedImplementation, FloatImplementation, FixedSection, FloatSection, Term, TermGroup } from './quantize';
export type { CoefficientRow, Metrics, NodeHeadroom, RootDrift, Warning } from './analysis';
export { runFixed, runFloat, runImplementation, filterIdeal, roundShift } from './model';
export { referenceBound } from './analysis';
export { toSections } from './sections';

export interface DiscreteDesign { zpk: Zpk; tf: DiscreteTf }

/** Factor folded into the coefficients: input scale / output scale (fixed point), 1 (float32). */
export function gainFoldOf(settings: Pick<ImplementationSettings, 'wordLength' | 'inputScale' | 'outputScale'>): number {
  return settings.wordLength === 'float32' ? 1 : settings.inputScale / settings.outputScale;
}

/** Q-format name of a W-bit word with F fractional bits, e.g. (16, 15) → "Q0.15", (16, 13) → "Q2.13". */
export const qFormat = (wordLength: number, fractionalBits: number) => `Q${wordLength - 1 - fractionalBits}.${fractionalBits}`;

/**
 * Gain from the input to the inner nodes (the outputs of all sections but the last). Inputs
 * larger than U = min(input full scale, output limit / peak gain of the whole controller) drive
 * the output into its limits at some frequency, so the inner nodes are scaled to reach half the
 * word at U: node gain = (2^(W−1)/2) / U. This keeps the inner rounding small against the output
 * (a rule of our own built on L∞ scaling); larger inputs may saturate an inner node, which the
 * headroom check reports. Float32 needs no scaling (1).
 */
function innerNodeGain(specs: SectionSpec[], wordLength: WordLength, lim: number): number {
  if (wordLength === 'float32' || specs.length < 2) return 1;
  let peak = 0;
  for (const w of SCALING_GRID) {
    const m = specs.reduce((g, s) => g * sectionMagnitude(s.b, s.a, w), 1);
    if (Number.isFinite(m)) peak = Math.max(peak, m);
  }
  const fs = 2 ** (wordLength - 1);
  const useful = peak > 0 ? Math.min(fs, lim / peak) : fs;
  return useful > 0 ? fs / 2 / useful : 1;
}

export interface Built { specs: SectionSpec[]; impl: Implementation; gainFold: number }

export function buildImplementation(
  discrete: DiscreteDesign,
  settings: ImplementationSettings,
  override?: { wordLength: WordLength; structure: Structure },
): Built {
  const wordLength = override?.wordLength ?? settings.wordLength;
  const structure = override?.structure ?? effectiveStructure(settings);
  const gainFold = gainFoldOf({ ...settings, wordLength });
  // Limits: raw counts for fixed point; for a float32 candidate of a fixed-point design the raw
  // limits are turned into real units, and back for a fixed-point candidate of a float32 design.
  let { min, max } = settings.outputLimits;
  if (wordLength === 'float32' && settings.wordLength !== 'float32') { min *= settings.outputScale; max *= settings.outputScale; }
  if (wordLength !== 'float32' && settings.wordLength === 'float32') {
    const w = 2 ** (wordLength - 1);
    min = Math.max(-w, Math.round(min / settings.outputScale)); max = Math.min(w - 1, Math.round(max / settings.outputScale));
  }
  if (wordLength !== 'float32') {
    const w = 2 ** (wordLength - 1);
    min = Math.min(Math.max(min, -w), w - 2); max = Math.max(Math.min(max, w - 1), min + 1);
  }
  const lim = Math.max(Math.abs(min), Math.abs(max));
  // Output fraction bits G: the last section computes the output times 2^G so that its
  // recursion keeps G bits below one output count; the largest G with 2·limit·2^G inside the
  // word (half the word as headroom). The output is roundShift(y, G), then clamped.
  let outputShift = 0;
  if (wordLength !== 'float32') {
    while (outputShift < wordLength - 2 && 2 * lim * 2 ** (outputShift + 1) <= 2 ** (wordLength - 1) - 1) outputShift++;
  }
  const fold = gainFold * 2 ** outputShift;
  const specs = toSections(discrete.zpk, fold, 1);
  const nodeGain = innerNodeGain(specs, wordLength, lim * 2 ** outputShift);
  const scaled = nodeGain === 1 ? specs : toSections(discrete.zpk, fold, nodeGain);
  return { specs: scaled, impl: quantize(scaled, wordLength, structure, min, max, outputShift), gainFold };
}

export interface Candidate {
  wordLength: WordLength;
  structure: Structure;
  meetsTolerances: boolean;
  metrics: Metrics;
  /** Per section: the Q formats of its coefficient groups, e.g. ["Q2.13"] or ["Q-9.24", "Q1.14"]. */
  formats: string[][];
}

export interface ImplementationAnalysis {
  wordLength: WordLength;
  structure: Structure;
  /** Factor folded into the coefficients (input scale / output scale; 1 for float32). */
  gainFold: number;
  sections: { index: number; order: 1 | 2; formats: string[]; shifts: number[] }[];
  coefficients: CoefficientRow[];
  poles: RootDrift[];
  zeros: RootDrift[];
  metrics: Metrics;
  headroom: NodeHeadroom[];
  warnings: Warning[];
  tolerances: Tolerances;
  advice: {
    /** Smallest word length (then structure) meeting every tolerance; null when none does. */
    recommended: { wordLength: WordLength; structure: Structure } | null;
    candidates: Candidate[];
    /** Offset form against direct form I at this word length, when it helps. */
    offsetForm: { wordLength: 16 | 32; directForm: Metrics; offsetForm: Metrics } | null;
  };
}

const CANDIDATES: { wordLength: WordLength; structure: Structure }[] = [
  { wordLength: 16, structure: 'direct-form-1' },
  { wordLength: 16, structure: 'offset-form-1' },
  { wordLength: 32, structure: 'direct-form-1' },
  { wordLength: 32, structure: 'offset-form-1' },
  { wordLength: 'float32', structure: 'transposed-direct-form-2' },
];

function meets(m: Metrics, t: Tolerances, impl: Implementation): boolean {
  const clamped = impl.kind === 'fixed' && impl.sections.some((s) => s.clamped.length > 0);
  return !clamped && m.poleDriftPct <= t.poleDriftPct && (m.dcGainDriftPct === null || m.dcGainDriftPct <= t.dcGainDriftPct) &&
    m.responseErrorDb <= t.responseErrorDb && m.stableQuantized === m.stableIdeal;
}

function formatsOf(impl: Implementation): string[][] {
  return impl.kind === 'fixed'
    ? impl.sections.map((s) => s.groups.map((g) => qFormat(impl.wordLength, g.shift)))
    : impl.sections.map(() => ['float32']);
}

const pct = (v: number | null) => (v === null ? 'n/a' : !Number.isFinite(v) ? '∞' : `${v.toPrecision(3)} %`);
const label = (c: { wordLength: WordLength; structure: Structure }) =>
  c.wordLength === 'float32' ? 'float32' : `${c.wordLength}-bit ${c.structure === 'offset-form-1' ? 'offset form' : 'direct form I'}`;

export function analyzeImplementation(
  discrete: DiscreteDesign,
  settings: ImplementationSettings,
  tolerances: Partial<Tolerances> = {},
): ImplementationAnalysis {
  const tol: Tolerances = { ...DEFAULT_TOLERANCES, ...tolerances };
  const { impl, gainFold } = buildImplementation(discrete, settings);
  const q = analyzeQuantized(impl, gainFold);
  const structure = effectiveStructure(settings);
  const candidates: Candidate[] = CANDIDATES.map((c) => {
    const b = c.wordLength === settings.wordLength && c.structure === structure ? { impl, gainFold } : buildImplementation(discrete, settings, c);
    const m = b.impl === impl ? q.metrics : analyzeQuantized(b.impl, b.gainFold).metrics;
    return { ...c, meetsTolerances: meets(m, tol, b.impl), metrics: m, formats: formatsOf(b.impl) };
  });
  const rec = candidates.find((c) => c.meetsTolerances) ?? null;
  const warnings: Warning[] = [];
  const hr = impl.kind === 'fixed' ? headroom(impl) : [];
  const m = q.metrics;

  if (impl.kind === 'fixed') {
    impl.sections.forEach((s, k) => {
      if (s.clamped.length) warnings.push({ code: 'coefficient-clamped', severity: 'problem', message: `Section ${k + 1}: ${s.clamped.join(', ')} does not fit a ${impl.wordLength}-bit word even with no fractional bits and was clamped; lower the gain between input and output scale or use float32.` });
    });
    const lost = q.coefficients.filter((c) => c.exact !== 0 && c.significantBits < 4);
    if (lost.length) warnings.push({ code: 'coefficient-few-bits', severity: 'caution', message: `Coefficients stored in fewer than 4 significant bits: ${lost.map((c) => `section ${c.section} ${c.name} (${c.significantBits} bits)`).join(', ')}.` });
    hr.forEach((h) => {
      if (h.accumulatorWorstCase > h.accumulatorLimit) warnings.push({ code: 'accumulator-can-overflow', severity: 'caution', message: `Section ${h.section}: the worst-case accumulator value (${h.accumulatorWorstCase.toExponential(3)}) exceeds the ${2 * impl.wordLength}-bit accumulator (${h.accumulatorLimit.toExponential(3)}); the adds saturate, so such an input clips instead of wrapping.` });
      if (h.worstCase > 2 ** (impl.wordLength - 1) && h.section < impl.sections.length) warnings.push({ code: 'node-can-saturate', severity: 'info', message: `Section ${h.section}: its output can exceed the ${impl.wordLength}-bit word for a full-scale input (worst case ${Number.isFinite(h.worstCase) ? h.worstCase.toExponential(3) : 'unbounded, a pole on the unit circle'}, from the L1 norm); it saturates there.` });
    });
  }
  if (m.stableIdeal && !m.stableQuantized) warnings.push({ code: 'unstable-after-quantization', severity: 'problem', message: `A pole moved onto or outside the unit circle after quantization.${rec ? ` ${label(rec)} keeps it inside.` : ''}` });
  if (m.dcGainDriftPct !== null && m.dcGainDriftPct > tol.dcGainDriftPct) {
    const better = candidates.find((c) => c.metrics.dcGainDriftPct !== null && c.metrics.dcGainDriftPct <= tol.dcGainDriftPct);
    warnings.push({ code: 'dc-gain-drift', severity: 'problem', message: `The DC gain moves by ${pct(m.dcGainDriftPct)} with ${label({ wordLength: settings.wordLength, structure })} (tolerance ${tol.dcGainDriftPct} %): a pole or zero lies close to z = 1.${better ? ` ${label(better)} keeps it within (${pct(better.metrics.dcGainDriftPct)}).` : ' No offered word length keeps it within; lower the sample rate.'}` });
  }
  if (m.poleDriftPct > tol.poleDriftPct) {
    const better = candidates.find((c) => c.metrics.poleDriftPct <= tol.poleDriftPct);
    warnings.push({ code: 'pole-drift', severity: 'caution', message: `A pole moves by ${pct(m.poleDriftPct)} of its equivalent s-plane value (tolerance ${tol.poleDriftPct} %).${better ? ` ${label(better)} keeps it within (${pct(better.metrics.poleDriftPct)}).` : ''}` });
  }
  if (m.responseErrorDb > tol.responseErrorDb) {
    const better = candidates.find((c) => c.metrics.responseErrorDb <= tol.responseErrorDb);
    warnings.push({ code: 'response-error', severity: 'caution', message: `The frequency response differs from the ideal by up to ${m.responseErrorDb.toPrecision(3)} dB (tolerance ${tol.responseErrorDb} dB).${better ? ` ${label(better)} keeps it within (${better.metrics.responseErrorDb.toPrecision(3)} dB).` : ''}` });
  }
  const integrator = q.poles.some((p) => Math.abs(p.ideal.re - 1) < 1e-12 && Math.abs(p.ideal.im) < 1e-12);
  if (integrator) warnings.push({ code: 'integrator-windup', severity: 'caution', message: 'The controller integrates (a pole at z = 1). The output limits clamp the output only, not the state: add anti-windup in the calling code if the actuator can saturate.' });

  let offsetForm: ImplementationAnalysis['advice']['offsetForm'] = null;
  if (settings.wordLength !== 'float32') {
    const df = candidates.find((c) => c.wordLength === settings.wordLength && c.structure === 'direct-form-1')!;
    const of = candidates.find((c) => c.wordLength === settings.wordLength && c.structure === 'offset-form-1')!;
    const gain = (a: number | null, b: number | null) => (a !== null && b !== null && b > 0 ? a / b : a !== null && a > 0 && b === 0 ? Infinity : 1);
    const better = gain(df.metrics.dcGainDriftPct, of.metrics.dcGainDriftPct) >= 4 || gain(df.metrics.poleDriftPct, of.metrics.poleDriftPct) >= 4;
    if (better && (!df.meetsTolerances || of.meetsTolerances)) {
      offsetForm = { wordLength: settings.wordLength, directForm: df.metrics, offsetForm: of.metrics };
      if (structure === 'direct-form-1') {
        warnings.push({ code: 'offset-form-helps', severity: 'info', message: `The offset form keeps the poles near z = 1 more accurate at ${settings.wordLength} bits: DC-gain drift ${pct(df.metrics.dcGainDriftPct)} → ${pct(of.metrics.dcGainDriftPct)}, pole drift ${pct(df.metrics.poleDriftPct)} → ${pct(of.metrics.poleDriftPct)}, response error ${df.metrics.responseErrorDb.toPrecision(3)} dB → ${of.metrics.responseErrorDb.toPrecision(3)} dB.` });
      }
    }
  }
  const lc = limitCycle(impl, discrete);
  if (lc) warnings.push(lc);

  return {
    wordLength: settings.wordLength,
    structure,
    gainFold,
    sections: impl.kind === 'fixed'
      ? impl.sections.map((s, k) => ({ index: k + 1, order: s.order, formats: s.groups.map((g) => qFormat(impl.wordLength, g.shift)), shifts: s.groups.map((g) => g.shift) }))
      : impl.sections.map((s, k) => ({ index: k + 1, order: s.order, formats: ['float32'], shifts: [] })),
    coefficients: q.coefficients,
    poles: q.poles,
    zeros: q.zeros,
    metrics: m,
    headroom: hr,
    warnings,
    tolerances: tol,
    advice: { recommended: rec ? { wordLength: rec.wordLength, structure: rec.structure } : null, candidates, offsetForm },
  };
}

/** Zero input after an impulse: a stable fixed-point controller should come back to exactly 0. */
function limitCycle(impl: Implementation, discrete: DiscreteDesign): Warning | null {
  if (impl.kind !== 'fixed') return null;
  const stable = discrete.zpk.poles.every((p) => Math.hypot(p.re, p.im) < 1);
  if (!stable) return null;
  const plan = vectorPlan(impl);
  const u = Array.from({ length: 2048 }, (_, n) => (n === 0 ? plan.amplitude : 0));
  const run = runFixed({ ...impl, outputMin: -(2 ** 40), outputMax: 2 ** 40 }, u);
  const tail = run.y.slice(-256);
  const amp = Math.max(...tail.map(Math.abs));
  if (amp === 0) return null;
  return { code: 'limit-cycle', severity: 'caution', message: `With zero input the output keeps moving by up to ${amp} counts (a limit cycle or a slow decay of rounding); a longer word or the offset form reduces it.` };
}

export interface VectorRow { n: number; uRaw: number; yRaw: number; u: number; y: number }

export interface Vectors {
  rows: VectorRow[];
  segments: Segment[];
  amplitude: number;
  limitAmplitude: number;
  /** Bound on |y_raw − ideal| while nothing saturates (see referenceBound). */
  bound: number;
  /** Whether the limit segment reached an output limit (not possible when even a full-scale
   *  input cannot move the output that far within the segment, e.g. a slow lag). */
  limitsReached: boolean;
}

function vectorPlan(impl: Implementation) {
  const { ideal } = realSections(impl);
  let peak = 0;
  const fixed = impl.kind === 'fixed';
  const outScale = impl.kind === 'fixed' ? 2 ** -impl.outputShift : 1;
  for (const w of RESPONSE_GRID) { const v = Math.hypot(cascadeResponse(ideal, w).re, cascadeResponse(ideal, w).im) * outScale; if (Number.isFinite(v)) peak = Math.max(peak, v); }
  const inputMax = fixed ? 2 ** (impl.wordLength - 1) - 1 : 1e30;
  const span = (impl.outputMax - impl.outputMin) / 2;
  const lim = Math.max(Math.abs(impl.outputMax), Math.abs(impl.outputMin));
  const raw = (0.4 * span) / (peak || 1);
  const amplitude = fixed ? Math.max(1, Math.min(Math.floor(raw), Math.floor(inputMax / 4))) : Math.fround(raw);
  const wSeg = Math.PI / 64;
  const r = cascadeResponse(ideal, wSeg);
  const gSeg = Math.hypot(r.re, r.im) * outScale || 1;
  const rawSat = Math.max(amplitude, (2 * lim) / gSeg);
  const limitAmplitude = fixed ? Math.min(Math.round(rawSat), Math.floor(0.9 * inputMax)) : Math.fround(rawSat);
  return { amplitude, limitAmplitude, inputMax, integer: fixed };
}

/** Test vectors of the bit-exact model: raw and real values per sample. */
export function generateVectors(discrete: DiscreteDesign, settings: ImplementationSettings, built?: Built): Vectors {
  const { impl, gainFold } = built ?? buildImplementation(discrete, settings);
  const plan = vectorPlan(impl);
  const { u, segments } = buildInput(plan);
  let y: number[];
  let nodeMax: { x: number[]; y: number[] } | undefined;
  if (impl.kind === 'fixed') y = runFixed(impl, u).y;
  else {
    const run = runFloat(impl, u);
    y = run.y;
    const ym = run.nodes.map((nd) => Math.max(...nd.map(Math.abs)));
    nodeMax = { x: [Math.max(...u.map(Math.abs)), ...ym.slice(0, -1)], y: ym };
  }
  const fixed = impl.kind === 'fixed';
  const rows = u.map((uRaw, n) => ({
    n, uRaw, yRaw: y[n],
    u: fixed ? uRaw * settings.inputScale : uRaw,
    y: fixed ? y[n] * settings.outputScale : y[n],
  }));
  const bound = referenceBound(impl, discrete.tf, gainFold, u.length, Math.max(...u.map(Math.abs)), nodeMax);
  const seg = segments.find((g) => g.name === 'limits')!;
  const limitsReached = rows.slice(seg.start).some((r) => r.yRaw === impl.outputMax || r.yRaw === impl.outputMin);
  return { rows, segments, amplitude: plan.amplitude, limitAmplitude: plan.limitAmplitude, bound, limitsReached };
}
