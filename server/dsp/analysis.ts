import type { Margins, RootInfo, StepResponse } from '../../schemas/discretize';
import { abs, cx, log1p, sub } from './complex';
import { evalZpk } from './lti';
import { polyAdd, polyRoots, trimLeading } from './poly';
import { zohSs, zpkToSs } from './realization';
import type { Complex, Zpk } from './types';

/**
 * Analysis of continuous and discrete transfer functions: equivalent s-plane roots,
 * stability, frequency responses, loop margins and step responses. Frequencies: ω in
 * rad/s inside, Hz on the wire; magnitudes dB; phases degrees.
 */

const DEG = 180 / Math.PI;
/** |z| within this of 1 counts as on the unit circle (roots mapped from s = jω land there up to rounding). */
export const UNIT_CIRCLE_TOL = 1e-12;
/** Magnitudes are floored here so −∞ dB (a zero on the axis or circle) stays a number. */
export const MIN_DB = -400;

const r = (c: Complex): Complex => ({ re: c.re, im: c.im });

/** s = ln(z)/T, via log1p(z − 1) so roots near z = 1 keep their digits. Null for z = 0. */
export function zToS(z: Complex, periodSec: number): Complex | null {
  if (z.re === 0 && z.im === 0) return null;
  const l = log1p(sub(z, cx(1)));
  return { re: l.re / periodSec, im: l.im / periodSec };
}

function dampingAndFreq(s: Complex | null): { zeta: number | null; wn: number | null } {
  if (!s) return { zeta: null, wn: null };
  const wn = abs(s);
  return { zeta: wn === 0 ? null : -s.re / wn, wn };
}

/** RootInfo of a continuous root s (z = null) or of a discrete root z with its origin. */
export function rootInfo(z: Complex | null, s: Complex | null, continuous: Complex | null): RootInfo {
  const { zeta, wn } = dampingAndFreq(s);
  const c = dampingAndFreq(continuous);
  return {
    z: z && r(z),
    s: s && r(s),
    dampingRatio: zeta,
    naturalFreqRadPerSec: wn,
    continuous: continuous && r(continuous),
    naturalFreqDriftPercent: wn !== null && c.wn !== null && c.wn > 0 ? (100 * (wn - c.wn)) / c.wn : null,
    dampingRatioDrift: zeta !== null && c.zeta !== null ? zeta - c.zeta : null,
  };
}

/**
 * Pairs each discrete root with the continuous root it most likely came from: by index
 * where the method maps roots one to one (`byIndex`), else greedily by distance to e^{sT}.
 */
export function pairRoots(discrete: Complex[], continuous: Complex[], periodSec: number, byIndex: boolean): (Complex | null)[] {
  if (byIndex) return discrete.map((_, i) => continuous[i] ?? null);
  const out: (Complex | null)[] = discrete.map(() => null);
  const used = new Array<boolean>(discrete.length).fill(false);
  const mapped = continuous.map((s) => ({ s, z: expT(s, periodSec) }));
  // nearest pairs first
  const cand: Array<[number, number, number]> = [];
  mapped.forEach((m, ci) => discrete.forEach((d, di) => cand.push([abs(sub(d, m.z)), ci, di])));
  cand.sort((a, b) => a[0] - b[0]);
  const cUsed = new Array<boolean>(continuous.length).fill(false);
  for (const [dist, ci, di] of cand) {
    if (cUsed[ci] || used[di] || dist > 0.5) continue;
    cUsed[ci] = used[di] = true;
    out[di] = mapped[ci].s;
  }
  return out;
}

const expT = (s: Complex, T: number): Complex => {
  const m = Math.exp(s.re * T);
  return { re: m * Math.cos(s.im * T), im: m * Math.sin(s.im * T) };
};

export function discreteStability(poles: Complex[]): { stable: boolean; marginal: boolean } {
  let outside = false;
  let on = false;
  for (const p of poles) {
    const m = abs(p);
    if (m > 1 + UNIT_CIRCLE_TOL) outside = true;
    else if (m >= 1 - UNIT_CIRCLE_TOL) on = true;
  }
  return { stable: !outside && !on, marginal: on && !outside };
}

/** H(s = 0) of a continuous zpk; null when infinite (a pole at s = 0). */
export function continuousDcGain(h: Zpk): number | null {
  if (h.poles.some((p) => p.re === 0 && p.im === 0)) return null;
  if (h.zeros.some((z) => z.re === 0 && z.im === 0)) return 0;
  return evalZpk(h, cx(0)).re;
}

/** H(z = 1) of a discrete zpk; null when infinite (a pole at z = 1). */
export function discreteDcGain(h: Zpk): number | null {
  if (h.poles.some((p) => p.re === 1 && p.im === 0)) return null;
  if (h.zeros.some((z) => z.re === 1 && z.im === 0)) return 0;
  const v = evalZpk(h, cx(1)).re;
  return Number.isFinite(v) ? v : null;
}

/** Log-spaced grid of n points from lo to hi (inclusive). */
export function logGrid(lo: number, hi: number, n: number): number[] {
  const a = Math.log(lo);
  const b = Math.log(hi);
  const out = new Array<number>(n);
  const step = (b - a) / (n - 1);
  for (let i = 0; i < n; i++) out[i] = Math.exp(a + step * i);
  out[0] = lo;
  out[n - 1] = hi;
  return out;
}

/** Roots unpacked into flat arrays for fast repeated evaluation. */
export interface Evaluator {
  k: number;
  zr: Float64Array;
  zi: Float64Array;
  pr: Float64Array;
  pi: Float64Array;
}
export function evaluator(h: Zpk): Evaluator {
  return {
    k: h.gain,
    zr: Float64Array.from(h.zeros, (z) => z.re),
    zi: Float64Array.from(h.zeros, (z) => z.im),
    pr: Float64Array.from(h.poles, (p) => p.re),
    pi: Float64Array.from(h.poles, (p) => p.im),
  };
}

/**
 * Magnitude (dB) and phase (deg) of a zpk at x = xr + j·xi (x = jω continuous,
 * x = e^{jωT} discrete). The phase is the sum of the root angles, so it is unwrapped by
 * construction (it jumps only where a root sits on the axis or circle).
 */
export function responseAt(h: Zpk | Evaluator, x: Complex): { db: number; deg: number } {
  evalInto('k' in h ? h : evaluator(h), x.re, x.im);
  return { db: outDb, deg: outDeg };
}

// Results of evalInto (module scratch, so the grid loops allocate nothing per point).
let outDb = 0;
let outDeg = 0;

function evalInto(e: Evaluator, xr: number, xi: number): void {
  let mag2 = e.k * e.k;
  let ph = e.k < 0 ? Math.PI : 0;
  const { zr, zi, pr, pi } = e;
  for (let i = 0; i < zr.length; i++) {
    const dr = xr - zr[i];
    const di = xi - zi[i];
    mag2 *= dr * dr + di * di;
    ph += Math.atan2(di, dr);
  }
  for (let i = 0; i < pr.length; i++) {
    const dr = xr - pr[i];
    const di = xi - pi[i];
    mag2 /= dr * dr + di * di;
    ph -= Math.atan2(di, dr);
  }
  let db = (10 / Math.LN10) * Math.log(mag2);
  if (!Number.isFinite(db) || mag2 === 0) db = logSumDb(e, { re: xr, im: xi });
  outDb = Number.isFinite(db) ? Math.max(MIN_DB, db) : db > 0 ? -MIN_DB : MIN_DB;
  outDeg = ph * DEG;
}

/** 20·log10|H(x)| as a sum of logs (no overflow); the slow path of responseAt. */
function logSumDb(e: Evaluator, x: Complex): number {
  let l = Math.log(Math.abs(e.k));
  for (let i = 0; i < e.zr.length; i++) l += Math.log(Math.hypot(x.re - e.zr[i], x.im - e.zi[i]));
  for (let i = 0; i < e.pr.length; i++) l -= Math.log(Math.hypot(x.re - e.pr[i], x.im - e.pi[i]));
  return (20 / Math.LN10) * l;
}

export interface Response {
  magnitudeDb: number[];
  phaseDeg: number[];
}

export function continuousResponse(hIn: Zpk, omegas: number[]): Response {
  const h = evaluator(hIn);
  const n = omegas.length;
  const magnitudeDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    evalInto(h, 0, omegas[i]);
    magnitudeDb[i] = outDb;
    phaseDeg[i] = outDeg;
  }
  return { magnitudeDb, phaseDeg };
}

/** Discrete response on the grid, its phase shifted by a multiple of 360° to start beside `reference`. */
export function discreteResponse(hIn: Zpk, omegas: number[], periodSec: number, reference?: Response): Response & { shiftDeg: number } {
  const h = evaluator(hIn);
  const n = omegas.length;
  const magnitudeDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    const wt = omegas[i] * periodSec;
    evalInto(h, Math.cos(wt), Math.sin(wt));
    magnitudeDb[i] = outDb;
    phaseDeg[i] = outDeg;
  }
  let shiftDeg = 0;
  if (reference && n) shiftDeg = 360 * Math.round((reference.phaseDeg[0] - phaseDeg[0]) / 360);
  if (shiftDeg !== 0) for (let i = 0; i < n; i++) phaseDeg[i] += shiftDeg;
  return { magnitudeDb, phaseDeg, shiftDeg };
}

// ------------------------------------------------------------------ margins

export interface Crossings {
  /** ω (rad/s) where |L| = 1, with the phase margin there (deg, in (−180, 180]) */
  gain: Array<{ omega: number; phaseMarginDeg: number }>;
  /** ω (rad/s) where ∠L = −180° (mod 360°), with the gain margin there (dB) */
  phase: Array<{ omega: number; gainMarginDb: number }>;
}

const wrap180 = (deg: number) => {
  let v = ((deg + 180) % 360 + 360) % 360 - 180;
  if (v === -180) v = 180;
  return v;
};

/**
 * All gain and phase crossovers of a loop L(ω) on [lo, hi] rad/s: dense log grid, then
 * bisection on log ω (DESIGN.md lessons: dense evaluation, then refine). `at(ω)` gives
 * ln|L| and the phase in radians on any branch; the grid phase is unwrapped.
 */
export function findCrossings(at: (w: number) => { lnMag: number; ph: number }, lo: number, hi: number, points = 300): Crossings {
  const ws = logGrid(lo, hi, points);
  const mags: number[] = [];
  const phs: number[] = [];
  for (const w of ws) {
    const v = at(w);
    mags.push(v.lnMag);
    const prev = phs.length ? phs[phs.length - 1] : v.ph;
    phs.push(prev + wrapPi(v.ph - prev));
  }
  const out: Crossings = { gain: [], phase: [] };
  // Root of f between a and b (sign change), on log ω: Illinois regula falsi.
  const bisect = (a: number, b: number, f: (w: number) => number): number => {
    let x0 = Math.log(a);
    let x1 = Math.log(b);
    let f0 = f(a);
    let f1 = f(b);
    if (f0 === 0) return a;
    if (f1 === 0) return b;
    let side = 0;
    for (let k = 0; k < 100 && Math.abs(x1 - x0) > 1e-15 * Math.max(1, Math.abs(x0)); k++) {
      const x = (x0 * f1 - x1 * f0) / (f1 - f0);
      const fx = f(Math.exp(x));
      if (fx === 0) return Math.exp(x);
      if (Math.sign(fx) === Math.sign(f1)) {
        x1 = x;
        f1 = fx;
        if (side === -1) f0 /= 2;
        side = -1;
      } else {
        x0 = x;
        f0 = fx;
        if (side === 1) f1 /= 2;
        side = 1;
      }
      if (Math.abs(fx) < 1e-15) break;
    }
    return Math.exp((x0 * f1 - x1 * f0) / (f1 - f0));
  };
  const phaseNear = (w: number, ref: number) => {
    const v = at(w).ph;
    return ref + wrapPi(v - ref);
  };
  for (let i = 0; i + 1 < ws.length; i++) {
    if (mags[i] === 0 || Math.sign(mags[i]) !== Math.sign(mags[i + 1])) {
      if (mags[i] === 0 && i > 0 && mags[i - 1] === 0) continue;
      const w = mags[i] === 0 ? ws[i] : bisect(ws[i], ws[i + 1], (x) => at(x).lnMag);
      const ph = phaseNear(w, phs[i]);
      out.gain.push({ omega: w, phaseMarginDeg: wrap180(180 + ph * DEG) });
    }
    // crossing of a line −π + 2πm between grid points i and i+1
    const ka = Math.floor((phs[i] + Math.PI) / (2 * Math.PI));
    const kb = Math.floor((phs[i + 1] + Math.PI) / (2 * Math.PI));
    if (ka !== kb) {
      const line = -Math.PI + 2 * Math.PI * Math.max(ka, kb);
      const ref = phs[i];
      const w = bisect(ws[i], ws[i + 1], (x) => phaseNear(x, ref) - line);
      out.phase.push({ omega: w, gainMarginDb: (-20 / Math.LN10) * at(w).lnMag });
    }
  }
  // The top end (Nyquist for a discrete loop, where L is real) may sit exactly on −180°.
  const last = phs[phs.length - 1];
  const offLine = wrapPi(last + Math.PI);
  if (Math.abs(offLine) < 1e-7 && !out.phase.some((p) => Math.abs(p.omega - hi) <= 1e-9 * hi)) {
    out.phase.push({ omega: hi, gainMarginDb: (-20 / Math.LN10) * mags[mags.length - 1] });
  }
  return out;
}

const wrapPi = (x: number) => x - 2 * Math.PI * Math.round(x / (2 * Math.PI));

/** The smallest margins (in absolute value, sign kept) of a set of crossovers. */
export function pickMargins(c: Crossings): Margins {
  let g: Crossings['phase'][number] | null = null;
  for (const p of c.phase) if (!g || Math.abs(p.gainMarginDb) < Math.abs(g.gainMarginDb)) g = p;
  let ph: Crossings['gain'][number] | null = null;
  for (const p of c.gain) if (!ph || Math.abs(p.phaseMarginDeg) < Math.abs(ph.phaseMarginDeg)) ph = p;
  return {
    gainMarginDb: g ? g.gainMarginDb : null,
    phaseCrossoverHz: g ? g.omega / (2 * Math.PI) : null,
    phaseMarginDeg: ph ? ph.phaseMarginDeg : null,
    gainCrossoverHz: ph ? ph.omega / (2 * Math.PI) : null,
  };
}

/** ln|L| and ∠L of a zpk loop at x, in product form (one atan2). */
export function lnMagPhase(e: Evaluator, xr: number, xi: number): { lnMag: number; ph: number } {
  let vr = e.k;
  let vi = 0;
  for (let i = 0; i < e.zr.length; i++) {
    const dr = xr - e.zr[i];
    const di = xi - e.zi[i];
    const t = vr * dr - vi * di;
    vi = vr * di + vi * dr;
    vr = t;
  }
  let qr = 1;
  let qi = 0;
  for (let i = 0; i < e.pr.length; i++) {
    const dr = xr - e.pr[i];
    const di = xi - e.pi[i];
    const t = qr * dr - qi * di;
    qi = qr * di + qi * dr;
    qr = t;
  }
  const m = Math.hypot(vr, vi) / Math.hypot(qr, qi);
  if (!(m > 0) || !Number.isFinite(m)) {
    // fall back to the log-sum form when the products under- or overflow
    const rr = responseAt(e, { re: xr, im: xi });
    return { lnMag: (rr.db * Math.LN10) / 20, ph: rr.deg / DEG };
  }
  return { lnMag: Math.log(m), ph: Math.atan2(vi, vr) - Math.atan2(qi, qr) };
}

// ------------------------------------------------------------------ loops and steps

/** Closed-loop characteristic polynomial den·z^d + num (descending), and its roots. */
export function closedLoopPoles(numDesc: number[], denDesc: number[], delay = 0): { poles: Complex[]; lead: number } {
  const den = delay > 0 ? [...denDesc, ...new Array<number>(delay).fill(0)] : denDesc;
  const ch = trimLeading(polyAdd(den, numDesc));
  return { poles: polyRoots(ch), lead: ch[0] };
}

/** Response metrics of a step (DESIGN.md / issue 3: overshoot, 10–90 % rise, 2 % settling). */
export function stepMetrics(t: number[], y: number[], finalValue: number | null): StepResponse {
  const base: StepResponse = { timeSec: t, output: y, finalValue, overshootPercent: null, riseTimeSec: null, settlingTimeSec: null };
  if (finalValue === null || finalValue === 0 || !Number.isFinite(finalValue)) return base;
  const f = finalValue;
  const sgn = Math.sign(f);
  let peak = -Infinity;
  for (const v of y) peak = Math.max(peak, sgn * v);
  base.overshootPercent = Math.max(0, ((peak - Math.abs(f)) / Math.abs(f)) * 100);
  const cross = (level: number): number | null => {
    for (let k = 0; k < y.length; k++) {
      if (sgn * y[k] >= level) {
        if (k === 0) return t[0];
        const y0 = sgn * y[k - 1];
        const y1 = sgn * y[k];
        return t[k - 1] + ((level - y0) / (y1 - y0)) * (t[k] - t[k - 1]);
      }
    }
    return null;
  };
  const t10 = cross(0.1 * Math.abs(f));
  const t90 = cross(0.9 * Math.abs(f));
  base.riseTimeSec = t10 !== null && t90 !== null ? t90 - t10 : null;
  const band = 0.02 * Math.abs(f);
  let lastOut = -1;
  for (let k = 0; k < y.length; k++) if (Math.abs(y[k] - f) > band) lastOut = k;
  base.settlingTimeSec = lastOut === y.length - 1 ? null : lastOut < 0 ? t[0] : t[lastOut + 1];
  return base;
}

/** y[k] = C x[k] + D, x[k+1] = F x[k] + g (a held unit step), k = 0 … steps. */
function iterateStep(f: number[][], g: number[], c: number[], d: number, steps: number): number[] {
  const n = g.length;
  let x = new Float64Array(n);
  let nx = new Float64Array(n);
  const flat = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) flat[i * n + j] = f[i][j];
  const y: number[] = new Array(steps + 1);
  for (let k = 0; k <= steps; k++) {
    let v = d;
    for (let i = 0; i < n; i++) v += c[i] * x[i];
    y[k] = v;
    for (let i = 0; i < n; i++) {
      let s = g[i];
      for (let j = 0; j < n; j++) s += flat[i * n + j] * x[j];
      nx[i] = s;
    }
    const t = x;
    x = nx;
    nx = t;
  }
  return y;
}

/** Continuous step of a zpk closed loop, exactly sampled every h seconds (expm of the augmented matrix). */
export function continuousStep(cl: Zpk, h: number, steps: number): number[] {
  const ss = zpkToSs(cl);
  const { phi, gamma } = zohSs(ss, h);
  return iterateStep(phi, gamma, ss.c, ss.d, steps);
}

/** Discrete step of a z-domain zpk: x[k+1] = A x[k] + B, y = C x + D (cascade realization). */
export function discreteStep(cl: Zpk, steps: number): number[] {
  const ss = zpkToSs(cl);
  return iterateStep(ss.a, ss.b, ss.c, ss.d, steps);
}

