/**
 * Analysis of a quantized controller beside the ideal discrete one: coefficient table,
 * quantized poles and zeros and their drift, DC-gain drift, frequency-response error,
 * stability, accumulator and node headroom, and the error bound of the test vectors.
 *
 * Frequencies here are normalized, ω in rad/sample (ω = 2π f / fs); Nyquist is ω = π.
 * Pole drift is measured on the equivalent s-plane root s = ln(z)·fs, in percent of |s|, so it
 * does not depend on fs: 100·|ln z_q − ln z| / |ln z|.
 */
import type { Complex, DiscreteTf } from '../dsp/types';
import { abs as cabs, cx, div as cdiv, log as clog, mul as cmul } from '../dsp/complex';
import type { FixedImplementation, FixedSection, Implementation } from './quantize';
import { quantizedCoefficients, significantBits } from './quantize';
import { filterIdeal } from './model';

export type Severity = 'info' | 'caution' | 'problem';
export interface Warning { code: string; severity: Severity; message: string }

export interface CoefficientRow {
  section: number;
  name: string;
  exact: number;
  /** Real value the implementation holds (integer / 2^F, or the float32 value). */
  quantized: number;
  /** Integer stored in the C (fixed point only). */
  integer: number | null;
  /** Fractional bits F of its format (fixed point only). */
  fractionalBits: number | null;
  error: number;
  /** Bits of the stored integer magnitude (fixed point), 24 for float32; 0 for a coefficient lost to 0. */
  significantBits: number;
}

export interface RootDrift {
  section: number;
  ideal: Complex;
  quantized: Complex;
  /** |z_q − z| in the z-plane. */
  driftZ: number;
  /** 100·|ln z_q − ln z| / |ln z|; null for roots at z = 0. */
  driftPct: number | null;
}

export interface Metrics {
  /** Largest pole drift in percent of the equivalent |s| (0 when every pole is kept exactly). */
  poleDriftPct: number;
  /** DC gain (real output units per real input unit), ideal and quantized; null when infinite. */
  dcGainIdeal: number | null;
  dcGainQuantized: number | null;
  dcGainDriftPct: number | null;
  /** Largest |20·log10|H_q/H|| over the grid up to 0.95·Nyquist. */
  responseErrorDb: number;
  stableIdeal: boolean;
  stableQuantized: boolean;
}



/** Roots of c0 x² + c1 x + c2 (c0 may be 0; leading zeros drop roots at infinity). */
export function quadRoots(c0: number, c1: number, c2: number): Complex[] {
  if (c0 === 0) return c1 === 0 ? [] : [cx(-c2 / c1)];
  const p = c1 / c0, q = c2 / c0;
  const disc = p * p / 4 - q;
  if (disc >= 0) {
    const s = Math.sqrt(disc);
    // Stable form: the larger root first, the other from the product q.
    const r1 = -p / 2 + (p > 0 ? -s : s);
    const r2 = r1 !== 0 ? q / r1 : -p / 2 - (p > 0 ? -s : s);
    return [cx(r1), cx(r2)];
  }
  const s = Math.sqrt(-disc);
  return [cx(-p / 2, s), cx(-p / 2, -s)];
}

/** Poles and zeros of one section from b = [b0, b1, b2], a = [a1, a2] (ascending z⁻¹). */
export function sectionRoots(order: 1 | 2, b: number[], a: number[]): { zeros: Complex[]; poles: Complex[] } {
  if (order === 1) {
    return { poles: [cx(-a[0])], zeros: b[0] !== 0 ? [cx(-b[1] / b[0])] : [] };
  }
  return { poles: quadRoots(1, a[0], a[1]), zeros: quadRoots(b[0], b[1], b[2]) };
}

/** H(e^{jω}) of b/a in ascending z⁻¹ (any lengths, a[0] included). */
export function evalTf(num: readonly number[], den: readonly number[], w: number): Complex {
  let n = cx(0), d = cx(0);
  num.forEach((c, k) => { n = cx(n.re + c * Math.cos(k * w), n.im - c * Math.sin(k * w)); });
  den.forEach((c, k) => { d = cx(d.re + c * Math.cos(k * w), d.im - c * Math.sin(k * w)); });
  return cdiv(n, d);
}

export interface RealSection { order: 1 | 2; b: number[]; a: number[] }

export function realSections(impl: Implementation): { ideal: RealSection[]; quantized: RealSection[] } {
  if (impl.kind === 'float') {
    return {
      ideal: impl.sections.map((s) => ({ order: s.order, b: s.b, a: s.a })),
      quantized: impl.sections.map((s) => ({ order: s.order, b: s.bf, a: s.af })),
    };
  }
  return {
    ideal: impl.sections.map((s) => ({ order: s.order, b: s.b, a: s.a })),
    quantized: impl.sections.map((s) => ({ order: s.order, ...quantizedCoefficients(s) })),
  };
}

export function cascadeResponse(secs: RealSection[], w: number): Complex {
  return secs.reduce((h, s) => cmul(h, evalTf(s.b, [1, ...s.a], w)), cx(1));
}

/**
 * Impulse response of a cascade (double precision), `length` samples. With `injectAt` = k:
 * the response to an impulse added at section k's output node, which passes only that
 * section's feedback 1/A_k and then the later sections.
 */
export function cascadeImpulse(secs: RealSection[], length: number, injectAt?: number): number[] {
  let sig: number[] = Array.from({ length }, (_, n) => (n === 0 ? 1 : 0));
  secs.forEach((s, k) => {
    if (injectAt !== undefined && k < injectAt) return;
    sig = k === injectAt ? filterDen(s.a, sig) : filterSection(s, sig);
  });
  return sig;
}
function filterSection(s: RealSection, x: number[]): number[] {
  const y: number[] = [];
  for (let n = 0; n < x.length; n++) {
    const v = s.b[0] * x[n] + s.b[1] * (x[n - 1] ?? 0) + s.b[2] * (x[n - 2] ?? 0) - s.a[0] * (y[n - 1] ?? 0) - s.a[1] * (y[n - 2] ?? 0);
    y.push(v);
  }
  return y;
}
function filterDen(a: number[], x: number[]): number[] {
  const y: number[] = [];
  for (let n = 0; n < x.length; n++) y.push(x[n] - a[0] * (y[n - 1] ?? 0) - a[1] * (y[n - 2] ?? 0));
  return y;
}
const l1 = (h: number[]) => h.reduce((s, v) => s + Math.abs(v), 0);

/** Log-spaced grid 1e-4·π … 0.95·π rad/sample (160 points). */
export const RESPONSE_GRID: number[] = Array.from({ length: 160 }, (_, i) => Math.PI * 1e-4 * Math.pow(0.95 / 1e-4, i / 159));

function dcOf(secs: RealSection[]): number | null {
  let g = 1;
  for (const s of secs) {
    const d = 1 + s.a[0] + s.a[1];
    if (d === 0) return null;
    g *= (s.b[0] + s.b[1] + s.b[2]) / d;
  }
  return g;
}

function matchRoots(section: number, ideal: Complex[], quant: Complex[]): RootDrift[] {
  const left = [...quant];
  return ideal.map((z) => {
    let bi = 0;
    left.forEach((q, i) => { if (Math.hypot(q.re - z.re, q.im - z.im) < Math.hypot(left[bi].re - z.re, left[bi].im - z.im)) bi = i; });
    const q = left.length ? left.splice(bi, 1)[0] : cx(NaN, NaN);
    const driftZ = Math.hypot(q.re - z.re, q.im - z.im);
    let driftPct: number | null = null;
    if (cabs(z) > 0 && cabs(q) > 0) {
      const ls = clog(z), lq = clog(q);
      const ds = Math.hypot(lq.re - ls.re, lq.im - ls.im), m = cabs(ls);
      driftPct = m === 0 ? (ds === 0 ? 0 : Infinity) : (100 * ds) / m;
    }
    return { section, ideal: z, quantized: q, driftZ, driftPct };
  });
}

export interface QuantizedAnalysis {
  coefficients: CoefficientRow[];
  poles: RootDrift[];
  zeros: RootDrift[];
  metrics: Metrics;
}

/**
 * Quantized vs ideal. `gainFold` is the factor folded into the coefficients (input scale /
 * output scale for fixed point, 1 for float32); DC gains are reported in real units.
 */
export function analyzeQuantized(impl: Implementation, gainFoldIn: number): QuantizedAnalysis {
  const gainFold = gainFoldIn * (impl.kind === 'fixed' ? 2 ** impl.outputShift : 1);
  const { ideal, quantized } = realSections(impl);
  const coefficients: CoefficientRow[] = [];
  if (impl.kind === 'fixed') {
    impl.sections.forEach((s: FixedSection, k) => {
      for (const g of s.groups) for (const t of g.terms) {
        const q = t.coef / 2 ** g.shift;
        coefficients.push({ section: k + 1, name: t.name, exact: t.exact, quantized: q, integer: t.coef, fractionalBits: g.shift, error: q - t.exact, significantBits: significantBits(t.coef) });
      }
    });
  } else {
    impl.sections.forEach((s, k) => {
      const names = s.order === 1 ? ['b0', 'b1', 'a1'] : ['b0', 'b1', 'b2', 'a1', 'a2'];
      const ex = s.order === 1 ? [s.b[0], s.b[1], s.a[0]] : [...s.b, ...s.a];
      const qv = s.order === 1 ? [s.bf[0], s.bf[1], s.af[0]] : [...s.bf, ...s.af];
      names.forEach((name, i) => coefficients.push({ section: k + 1, name, exact: ex[i], quantized: qv[i], integer: null, fractionalBits: null, error: qv[i] - ex[i], significantBits: ex[i] === 0 ? 0 : 24 }));
    });
  }
  const poles: RootDrift[] = [], zeros: RootDrift[] = [];
  ideal.forEach((s, k) => {
    const ri = sectionRoots(s.order, s.b, s.a), rq = sectionRoots(quantized[k].order, quantized[k].b, quantized[k].a);
    poles.push(...matchRoots(k + 1, ri.poles, rq.poles));
    zeros.push(...matchRoots(k + 1, ri.zeros, rq.zeros));
  });
  const dcI = dcOf(ideal), dcQ = dcOf(quantized);
  let respDb = 0;
  for (const w of RESPONSE_GRID) {
    const hi = cabs(cascadeResponse(ideal, w)), hq = cabs(cascadeResponse(quantized, w));
    if (hi > 0 && Number.isFinite(hi) && Number.isFinite(hq)) respDb = Math.max(respDb, Math.abs(20 * Math.log10(hq / hi)));
    else if (hi === 0 && hq !== 0) respDb = Infinity;
  }
  const inside = (r: Complex[]) => r.every((p) => cabs(p) < 1);
  const metrics: Metrics = {
    poleDriftPct: poles.reduce((m, p) => Math.max(m, p.driftPct ?? 0), 0),
    dcGainIdeal: dcI === null ? null : dcI / gainFold,
    dcGainQuantized: dcQ === null ? null : dcQ / gainFold,
    dcGainDriftPct: dcI === null || dcQ === null ? null : dcI === 0 ? (dcQ === 0 ? 0 : Infinity) : (100 * Math.abs(dcQ - dcI)) / Math.abs(dcI),
    responseErrorDb: respDb,
    stableIdeal: inside(poles.map((p) => p.ideal)),
    stableQuantized: inside(poles.map((p) => p.quantized)),
  };
  return { coefficients, poles, zeros, metrics };
}

export interface NodeHeadroom {
  section: number;
  /** L1 norm of the impulse response from the input to this section's output (raw units). */
  l1FromInput: number;
  /** Worst-case |node| for a full-scale input, raw counts; Infinity when unbounded. */
  worstCase: number;
  /** Worst-case accumulator magnitude of this section and the accumulator's limit. */
  accumulatorWorstCase: number;
  accumulatorLimit: number;
}

const HEADROOM_HORIZON = 4096;

/**
 * Worst-case node and accumulator magnitudes for a full-scale input (2^(W−1) counts), via the
 * L1 norm of the impulse response from the input to each section's output (the sum |h| over
 * 4096 samples; Infinity when it has not decayed, i.e. a pole on or near the unit circle).
 * Accumulator: Σ|c|·(worst |signal|) per group, signals limited to the word by saturation.
 */
export function headroom(impl: FixedImplementation): NodeHeadroom[] {
  const W = impl.wordLength;
  const fs = 2 ** (W - 1);
  const { quantized } = realSections(impl);
  const out: NodeHeadroom[] = [];
  let prevWorst = fs;
  impl.sections.forEach((sec, k) => {
    const h = cascadeImpulse(quantized.slice(0, k + 1), HEADROOM_HORIZON);
    const tail = Math.abs(h[h.length - 1]) + Math.abs(h[h.length - 2] ?? 0);
    const norm = l1(h);
    const worst = tail > 1e-9 * Math.max(1, norm) ? Infinity : norm * fs;
    const xMax = Math.min(prevWorst, fs), yMax = Math.min(worst, fs);
    const sigMax: Record<string, number> = { x0: xMax, x1: xMax, x2: xMax, dx: 2 * xMax, ddx: 4 * xMax, y1: yMax, y2: yMax };
    let accWorst = 0;
    for (const g of sec.groups) accWorst = Math.max(accWorst, g.terms.reduce((s, t) => s + Math.abs(t.coef) * sigMax[t.signal], 0));
    out.push({ section: k + 1, l1FromInput: norm, worstCase: worst, accumulatorWorstCase: accWorst, accumulatorLimit: 2 ** (2 * W - 1) - 1 });
    prevWorst = worst;
  });
  return out;
}

/**
 * Bound on |y_model − y_ideal| (raw output counts, fixed point; real units, float32) for any
 * input of `horizon` samples with |u| ≤ uMax, while nothing saturates. Derivation:
 *   y_model = h_q ∗ u + Σ_k g_k ∗ e_k, y_ideal = h ∗ u, so
 *   |y_model − y_ideal| ≤ ‖h_q − h‖₁·uMax + Σ_k ‖g_k‖₁·max|e_k|,
 * where h_q is the impulse response of the quantized coefficients, h that of the ideal discrete
 * transfer function (times the folded scale), g_k the response from an error injected at
 * section k's output node (through 1/A_k and the later sections) to the output, and e_k that
 * section's arithmetic error per sample:
 * - fixed point: round to nearest gives |e_k| ≤ 1/2 LSB, plus 2^(−F_lo)/2 for the inner
 *   rounding of a two-group (offset form) section; the cascade works on y·2^G, so these count
 *   2^−G output counts each, and the final shift by G adds 1/2 count;
 * - float32: every operation rounds with relative error ≤ 2^−24 (unit roundoff); a section
 *   makes at most 9 of them on values bounded by M_k = Σ|b|·X_k + Σ|a|·Y_k (X_k, Y_k the
 *   largest input and output magnitudes of the section in the run), so |e_k| ≤ 9·2^−24·M_k.
 * ‖·‖₁ sums over `horizon` samples, which covers exactly the samples a run of that length uses.
 */
export function referenceBound(
  impl: Implementation,
  idealTf: DiscreteTf,
  gainFold: number,
  horizon: number,
  uMax: number,
  nodeMax?: { x: number[]; y: number[] },
): number {
  const { quantized } = realSections(impl);
  // Fixed point: the cascade works on y·2^G; the final roundShift by G adds 1/2 count.
  const outScale = impl.kind === 'fixed' ? 2 ** -impl.outputShift : 1;
  const hq = cascadeImpulse(quantized, horizon).map((v) => v * outScale);
  const numScaled = idealTf.num.map((c) => c * gainFold);
  const impulse = Array.from({ length: horizon }, (_, n) => (n === 0 ? 1 : 0));
  const h = filterIdeal(numScaled, idealTf.den, impulse);
  let bound = l1(hq.map((v, i) => v - h[i])) * uMax;
  quantized.forEach((s, k) => {
    const g = cascadeImpulse(quantized, horizon, k);
    let e: number;
    if (impl.kind === 'fixed') {
      const sec = impl.sections[k];
      e = (0.5 + (sec.groups.length === 2 ? 0.5 * 2 ** -sec.groups[0].shift : 0)) * 2 ** -impl.outputShift;
    } else {
      const X = nodeMax?.x[k] ?? uMax, Y = nodeMax?.y[k] ?? uMax;
      const M = (Math.abs(s.b[0]) + Math.abs(s.b[1]) + Math.abs(s.b[2])) * X + (Math.abs(s.a[0]) + Math.abs(s.a[1])) * Y;
      e = 9 * 2 ** -24 * M;
    }
    bound += l1(g) * e;
  });
  if (impl.kind === 'fixed' && impl.outputShift > 0) bound += 0.5;
  // Double-precision reference itself: a relative allowance far below one LSB.
  return bound * (1 + 1e-9) + 1e-9;
}
