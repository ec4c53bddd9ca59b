import type { DiscretizeResponse, MethodName, MethodResult, RootInfo } from '../../schemas/discretize';
import { METHOD_NAMES } from '../../schemas/discretize';
import type { Tolerances } from '../../schemas/design';
import { fmt } from './format';

/**
 * The drift table: one row per figure, one column per method, the best value of each row
 * marked. Every row has a `score` per method (lower is better: a distance from the
 * continuous design) next to the text shown. Pure.
 */

export interface DriftCell {
  text: string;
  /** lower is better; null when the figure does not exist for this method */
  score: number | null;
  /** beyond the design's tolerance */
  beyond?: boolean;
}

export interface DriftRow {
  key: string;
  label: string;
  /** what the continuous design has, when it has such a figure */
  continuous?: string;
  cells: Partial<Record<MethodName, DriftCell>>;
  /** methods holding the best score (ties all included); empty when every score is equal */
  best: MethodName[];
}

export interface DriftTable {
  methods: MethodName[];
  rows: DriftRow[];
  /** per method: every toleranced figure within tolerance */
  withinTolerance: Partial<Record<MethodName, boolean>>;
  /** per method: in how many rows it is best */
  wins: Partial<Record<MethodName, number>>;
}

const abs = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);

/**
 * 100·|s − s_c|/|s_c| for a root with its continuous origin (s = ln z / T); 0 when both are 0
 * and Infinity when only the continuous one is; null when the root has no continuous origin.
 */
export function rootDriftPercent(info: RootInfo): number | null {
  if (!info.continuous) return null;
  if (!info.s) return Infinity;
  const d = abs({ re: info.s.re - info.continuous.re, im: info.s.im - info.continuous.im });
  const ref = abs(info.continuous);
  if (ref === 0) return d === 0 ? 0 : Infinity;
  return (100 * d) / ref;
}

function maxOf(values: Array<number | null>): number | null {
  const xs = values.filter((v): v is number => v !== null && !Number.isNaN(v));
  return xs.length === 0 ? null : Math.max(...xs.map(Math.abs));
}

/** Percent for the table; below 1e-9 % it is rounding noise of an exact map (matched, s = 0 → z = 1). */
const pct = (v: number) => (!Number.isFinite(v) ? '∞' : Math.abs(v) < 1e-9 ? '≈ 0 %' : `${fmt(v, 3)} %`);

/** Relative difference of two values that may be null (null = infinite, e.g. a DC gain with an integrator). */
export function relativeChangePercent(value: number | null, reference: number | null): number | null {
  if (reference === null) return value === null ? 0 : Infinity;
  if (value === null) return Infinity;
  if (reference === 0) return value === 0 ? 0 : Infinity;
  return (100 * Math.abs(value - reference)) / Math.abs(reference);
}

/** Methods with the lowest score (ties included); empty when there is nothing to choose. */
export function bestOf(cells: Partial<Record<MethodName, DriftCell>>): MethodName[] {
  const scored = (Object.entries(cells) as Array<[MethodName, DriftCell]>).filter(([, c]) => c.score !== null && !Number.isNaN(c.score));
  if (scored.length < 2) return [];
  const min = Math.min(...scored.map(([, c]) => c.score as number));
  // ties: within 1e-9 relative, or 1e-6 absolute (1e-6 %, dB or degrees is rounding noise)
  const tol = Math.max(1e-9 * Math.abs(min), 1e-6);
  const best = scored.filter(([, c]) => (c.score as number) - min <= tol || (c.score === Infinity && min === Infinity)).map(([m]) => m);
  return best.length === scored.length ? [] : best;
}

function row(key: string, label: string, methods: MethodName[], cell: (r: MethodResult, m: MethodName) => DriftCell, results: DiscretizeResponse['methods'], continuous?: string): DriftRow {
  const cells: Partial<Record<MethodName, DriftCell>> = {};
  for (const m of methods) {
    const r = results[m];
    if (r) cells[m] = cell(r, m);
  }
  return { key, label, continuous, cells, best: bestOf(cells) };
}

export function buildDriftTable(answer: DiscretizeResponse, tolerances: Tolerances): DriftTable {
  const methods = METHOD_NAMES.filter((m) => answer.methods[m] !== undefined);
  const R = answer.methods;
  const c = answer.continuous;
  const rows: DriftRow[] = [];

  rows.push(
    row('stability', 'Stability', methods, (r) => ({
      text: r.stable ? 'stable' : r.marginal ? 'on the unit circle' : 'unstable',
      score: r.stable ? 0 : r.marginal ? 1 : 2,
    }), R),
  );
  rows.push(
    row('pole-drift', 'Largest pole drift', methods, (r) => {
      const v = maxOf(r.poleInfo.map(rootDriftPercent));
      return v === null ? { text: '—', score: null } : { text: pct(v), score: v, beyond: v > tolerances.poleDriftPct };
    }, R),
  );
  rows.push(
    row('wn-drift', 'Natural frequency drift', methods, (r) => {
      const v = maxOf(r.poleInfo.map((p) => p.naturalFreqDriftPercent));
      return v === null ? { text: '—', score: null } : { text: pct(v), score: v };
    }, R),
  );
  rows.push(
    row('zeta-drift', 'Damping ratio drift', methods, (r) => {
      const v = maxOf(r.poleInfo.map((p) => p.dampingRatioDrift));
      return v === null ? { text: '—', score: null } : { text: fmt(v, 3), score: v };
    }, R),
  );
  rows.push(
    row('zero-drift', 'Largest zero drift', methods, (r) => {
      const v = maxOf(r.zeroInfo.map(rootDriftPercent));
      return v === null ? { text: '—', score: null } : { text: pct(v), score: v };
    }, R),
  );
  rows.push(
    row('dc-gain', 'DC gain', methods, (r) => {
      const change = relativeChangePercent(r.dcGain, c.dcGain);
      const text = r.dcGain === null ? '∞' : fmt(r.dcGain, 5);
      return { text: change !== null && change > 1e-6 && Number.isFinite(change) ? `${text} (${pct(change)})` : text, score: change, beyond: change !== null && change > tolerances.dcGainDriftPct };
    }, R, c.dcGain === null ? '∞' : fmt(c.dcGain, 5)),
  );
  rows.push(
    row('mag-error', `Largest magnitude error to ${fmt(answer.bandHz, 3)} Hz`, methods, (r) => ({
      text: `${fmt(r.maxMagnitudeErrorDb, 3)} dB`,
      score: Math.abs(r.maxMagnitudeErrorDb),
      beyond: Math.abs(r.maxMagnitudeErrorDb) > tolerances.magErrorDb,
    }), R),
  );
  rows.push(
    row('phase-error', `Largest phase error to ${fmt(answer.bandHz, 3)} Hz`, methods, (r) => ({
      text: `${fmt(r.maxPhaseErrorDeg, 3)}°`,
      score: Math.abs(r.maxPhaseErrorDeg),
      beyond: Math.abs(r.maxPhaseErrorDeg) > tolerances.phaseErrorDeg,
    }), R),
  );

  const cl = answer.continuousLoop;
  if (cl) {
    rows.push(
      row('loop-stable', 'Closed loop', methods, (r) => (r.loop ? { text: r.loop.stable ? 'stable' : 'unstable', score: r.loop.stable ? 0 : 1 } : { text: '—', score: null }), R, cl.stable ? 'stable' : 'unstable'),
    );
    rows.push(
      row('loop-pole-drift', 'Largest closed-loop pole drift', methods, (r) => {
        const v = r.loop ? maxOf(r.loop.closedLoopPoles.map(rootDriftPercent)) : null;
        return v === null ? { text: '—', score: null } : { text: pct(v), score: v };
      }, R),
    );
    const marginRow = (key: string, label: string, pick: (m: NonNullable<MethodResult['loop']>['margins']) => number | null, unit: string) =>
      row(key, label, methods, (r) => {
        if (!r.loop) return { text: '—', score: null };
        const v = pick(r.loop.margins);
        const ref = pick(cl.margins);
        const score = v === null && ref === null ? 0 : v === null || ref === null ? Infinity : Math.abs(v - ref);
        return { text: v === null ? 'none' : `${fmt(v, 4)}${unit}`, score };
      }, R, pick(cl.margins) === null ? 'none' : `${fmt(pick(cl.margins) as number, 4)}${unit}`);
    rows.push(marginRow('gain-margin', 'Gain margin', (m) => m.gainMarginDb, ' dB'));
    rows.push(marginRow('phase-margin', 'Phase margin', (m) => m.phaseMarginDeg, '°'));
    const stepRow = (key: string, label: string, pick: (s: NonNullable<MethodResult['loop']>['step']) => number | null, show: (v: number) => string) =>
      row(key, label, methods, (r) => {
        if (!r.loop) return { text: '—', score: null };
        const v = pick(r.loop.step);
        const ref = pick(cl.step);
        return { text: v === null ? '—' : show(v), score: ref === null ? null : v === null ? Infinity : Math.abs(v - ref) };
      }, R, pick(cl.step) === null ? '—' : show(pick(cl.step) as number));
    rows.push(stepRow('overshoot', 'Step overshoot', (s) => s.overshootPercent, (v) => `${fmt(v, 3)} %`));
    rows.push(stepRow('settling', 'Settling time (2 %)', (s) => s.settlingTimeSec, (v) => `${fmt(v, 3)} s`));
  }

  const withinTolerance: Partial<Record<MethodName, boolean>> = {};
  const wins: Partial<Record<MethodName, number>> = {};
  for (const m of methods) {
    withinTolerance[m] = rows.every((r) => !r.cells[m]?.beyond) && (R[m]!.stable || R[m]!.marginal);
    wins[m] = rows.filter((r) => r.best.includes(m)).length;
  }
  return { methods, rows, withinTolerance, wins };
}

/** The method to recommend: within tolerance first, then most rows best, then the order of METHOD_NAMES. */
export function recommendedMethod(table: DriftTable): MethodName | null {
  let best: MethodName | null = null;
  for (const m of table.methods) {
    if (best === null) {
      best = m;
      continue;
    }
    const a = [table.withinTolerance[m] ? 1 : 0, table.wins[m] ?? 0];
    const b = [table.withinTolerance[best] ? 1 : 0, table.wins[best] ?? 0];
    if (a[0] > b[0] || (a[0] === b[0] && a[1] > b[1])) best = m;
  }
  return best;
}
