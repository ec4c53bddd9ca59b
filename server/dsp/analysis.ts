import type { Margins, RootInfo, StepResponse } from '../../schemas/discretize';
import { cx, hypot as complexHypot } from './complex';
import { evalZpk } from './lti';
import { polyAdd, polyRoots } from './poly';
import { zohSs, zpkToSs } from './realization';
import type { Complex, Zpk } from './types';

/**
 * Analysis of continuous and discrete transfer functions: equivalent s-plane roots,
 * stability, frequency responses, loop margins and step responses. Frequencies: ω in
 * rad/s inside, Hz on the wire; magnitudes dB; phases degrees.
 */

// bound once: a module-local name is called directly in the grid loops (an imported
// binding is read through the module's export object on every call)
const hypot = complexHypot;
const DEG = 180 / Math.PI;
/** dB of a power ratio per unit of its natural logarithm, 10/ln 10. */
const DB_PER_LN_POWER = 10 / Math.LN10;
/** |z| within this of 1 counts as on the unit circle (roots mapped from s = jω land there up to rounding). */
export const UNIT_CIRCLE_TOL = 1e-12;
/** Magnitudes are floored here so −∞ dB (a zero on the axis or circle) stays a number. */
export const MIN_DB = -400;

const r = (c: Complex): Complex => ({ re: c.re, im: c.im });

/**
 * |z − 1| below this uses ln z = log1p(z − 1) (zToS); elsewhere the plain ln|z| + j·arg z.
 * In the log1p form |z|² − 1 = 2·Re w + |w|² (w = z − 1) is formed without cancellation,
 * so roots near z = 1 (slow roots at high rates) keep their digits; away from z = 1 it
 * has nothing to gain, and as |z| → 0 it rounds |z|² − 1 to −1 (ln|z| = −∞ below
 * |z| ≈ 1e-8, digits lost well before), or overflows |w|² for |z| above ~1e154.
 */
const LOG1P_RADIUS = 0.5;

/**
 * s = ln(z)/T (principal logarithm, Im s·T in (−π, π]); null for z = 0. Near z = 1
 * ln z = log1p(z − 1) (see LOG1P_RADIUS), elsewhere ln|z| + j·atan2(Im z, Re z): every
 * z ≠ 0 gives a finite s, |Re s| ≤ 745/T (ln of the smallest double).
 */
export function zToS(z: Complex, periodSec: number): Complex | null {
  if (z.re === 0 && z.im === 0) return null;
  const wr = z.re - 1;
  const wi = z.im - 0;
  if (wr * wr + wi * wi < LOG1P_RADIUS * LOG1P_RADIUS) {
    // log1p(w): ½·log1p(2 Re w + |w|²) + j·atan2(Im w, 1 + Re w) (complex.ts log1p);
    // Re z in (0.5, 1.5) here, so w and 1 + Re w = Re z are exact
    const t = 2 * wr + wr * wr + wi * wi;
    return { re: (0.5 * Math.log1p(t)) / periodSec, im: Math.atan2(wi, 1 + wr) / periodSec };
  }
  return { re: Math.log(hypot(z.re, z.im)) / periodSec, im: Math.atan2(z.im, z.re) / periodSec };
}

/** RootInfo of a continuous root s (z = null) or of a discrete root z with its origin. */
export function rootInfo(z: Complex | null, s: Complex | null, continuous: Complex | null): RootInfo {
  // damping ratio ζ = −Re s/|s| and natural frequency ωn = |s|, of s and of its origin
  const wn = s ? hypot(s.re, s.im) : null;
  const zeta = s && wn !== 0 ? -s.re / (wn as number) : null;
  const cWn = continuous ? hypot(continuous.re, continuous.im) : null;
  const cZeta = continuous && cWn !== 0 ? -continuous.re / (cWn as number) : null;
  return {
    z: z && r(z),
    s: s && r(s),
    dampingRatio: zeta,
    naturalFreqRadPerSec: wn,
    continuous: continuous && r(continuous),
    naturalFreqDriftPercent: wn !== null && cWn !== null && cWn > 0 ? (100 * (wn - cWn)) / cWn : null,
    dampingRatioDrift: zeta !== null && cZeta !== null ? zeta - cZeta : null,
  };
}

/**
 * Pairs each discrete root with the continuous root it most likely came from: by index
 * where the method maps roots one to one (`byIndex`), else greedily by distance to e^{sT}.
 */
export function pairRoots(discrete: Complex[], continuous: Complex[], periodSec: number, byIndex: boolean): (Complex | null)[] {
  const nd = discrete.length;
  const nc = continuous.length;
  const out: (Complex | null)[] = new Array(nd);
  if (byIndex) {
    for (let i = 0; i < nd; i++) out[i] = continuous[i] ?? null;
    return out;
  }
  for (let i = 0; i < nd; i++) out[i] = null;
  // candidate (ci, di) at index ci·nd + di: distance from discrete root di to e^{s_ci·T}
  const dist = new Array<number>(nc * nd);
  const order = new Array<number>(nc * nd);
  for (let ci = 0; ci < nc; ci++) {
    const sc = continuous[ci];
    const m = Math.exp(sc.re * periodSec);
    const er = m * Math.cos(sc.im * periodSec);
    const ei = m * Math.sin(sc.im * periodSec);
    for (let di = 0; di < nd; di++) {
      dist[ci * nd + di] = hypot(discrete[di].re - er, discrete[di].im - ei);
      order[ci * nd + di] = ci * nd + di;
    }
  }
  // nearest pairs first (a stable sort: ties keep the order above)
  order.sort((a, b) => dist[a] - dist[b]);
  const used = new Array<boolean>(nd).fill(false);
  const cUsed = new Array<boolean>(nc).fill(false);
  for (let k = 0; k < order.length; k++) {
    const idx = order[k];
    const ci = Math.floor(idx / nd);
    const di = idx - ci * nd;
    if (cUsed[ci] || used[di] || dist[idx] > 0.5) continue;
    cUsed[ci] = used[di] = true;
    out[di] = continuous[ci];
  }
  return out;
}

export function discreteStability(poles: Complex[]): { stable: boolean; marginal: boolean } {
  let outside = false;
  let on = false;
  for (let i = 0; i < poles.length; i++) {
    const m = hypot(poles[i].re, poles[i].im);
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
  const nz = h.zeros.length;
  const np = h.poles.length;
  const zr = new Float64Array(nz);
  const zi = new Float64Array(nz);
  const pr = new Float64Array(np);
  const pi = new Float64Array(np);
  for (let i = 0; i < nz; i++) {
    zr[i] = h.zeros[i].re;
    zi[i] = h.zeros[i].im;
  }
  for (let i = 0; i < np; i++) {
    pr[i] = h.poles[i].re;
    pi[i] = h.poles[i].im;
  }
  return { k: h.gain, zr, zi, pr, pi };
}

/**
 * Magnitude (dB) and phase (deg) of a zpk at x = xr + j·xi (x = jω continuous,
 * x = e^{jωT} discrete). The phase is the sum of the principal root angles (each
 * atan2(x − r) in (−π, π]); along a response contour it is made continuous by whole turns
 * (branchTurns, phaseDegAt).
 */
export function responseAt(h: Zpk | Evaluator, x: Complex): { db: number; deg: number } {
  evalInto('k' in h ? h : evaluator(h), x.re, x.im);
  return { db: outDb, deg: outDeg };
}

// Results of evalInto (module scratch: no object per call). It serves responseAt and the
// loop evaluations' fallback to the log-sum form (findCrossings, lnMagPhaseInto); the
// response grids use gridResponse.
let outDb = 0;
let outDeg = 0;

function evalInto(e: Evaluator, xr: number, xi: number): void {
  let mag2 = e.k * e.k;
  const { zr, zi, pr, pi } = e;
  for (let i = 0; i < zr.length; i++) {
    const dr = xr - zr[i];
    const di = xi - zi[i];
    mag2 *= dr * dr + di * di;
  }
  for (let i = 0; i < pr.length; i++) {
    const dr = xr - pr[i];
    const di = xi - pi[i];
    mag2 /= dr * dr + di * di;
  }
  outDb = dbOf(e, mag2, xr, xi);
  outDeg = phaseSum(e, xr, xi) * DEG;
}

/** 20·log10|H(x)| as a sum of logs (no overflow); the slow path of dbOf. */
function logSumDb(e: Evaluator, x: Complex): number {
  let l = Math.log(Math.abs(e.k));
  for (let i = 0; i < e.zr.length; i++) l += Math.log(hypot(x.re - e.zr[i], x.im - e.zi[i]));
  for (let i = 0; i < e.pr.length; i++) l -= Math.log(hypot(x.re - e.pr[i], x.im - e.pi[i]));
  return (20 / Math.LN10) * l;
}

export interface Response {
  magnitudeDb: number[];
  phaseDeg: number[];
}

/**
 * Response of a continuous zpk (or its evaluator) at x = jω for ω in `omegas` (rad/s). `periodSec`, when
 * given, sets the scale below which a root counts as on the jω axis (ON_CONTOUR·max(|r|, 1/T),
 * the rounding scale of the discrete models' roots at that rate; see branchRule).
 */
export function continuousResponse(hIn: Zpk | Evaluator, omegas: number[], periodSec?: number): Response {
  return gridResponse('k' in hIn ? hIn : evaluator(hIn), null, omegas, periodSec ? 1 / periodSec : 0);
}

// Per-point accumulators of gridResponse (module scratch, grown as needed).
let accMag2 = new Float64Array(512);
let accPh = new Float64Array(512);
let accTurns = new Float64Array(512);

/*
 * Continuous phase along a response contour. The principal angle atan2(x − r) of a root
 * r jumps by 2π wherever x − r crosses the negative real axis, which happens on the
 * contour itself, not only where x passes r: for x = e^{jωT} and a root with
 * 0 < Im r < 1 where the circle passes left of r at the height of r (every complex root
 * inside the circle, e.g. −10 ± 20j at 200 Hz at ~98 Hz), for x = jω and a complex root
 * in the right half-plane at ω = Im r. The sum of root angles then jumps by 360°.
 * The angle of x − r has a branch that is continuous along the whole contour as long as r
 * is not on it, and it lies in a fixed interval shorter than 2π (or of width 2π, open):
 *   x = jω:      Re r < 0: (−π/2, π/2), the principal value itself;
 *                Re r > 0: π + ∠(r − x) ∈ (π/2, 3π/2)            (Re(r − x) > 0).
 *   x = e^{jθ}:  |r| < 1: θ + ∠(1 − r·x̄) ∈ (−π/2, 3π/2)          (θ ∈ [0, π], |r·x̄| < 1);
 *                |r| > 1: ∠(−r) + ∠(1 − x/r) ∈ ∠(−r) ± π/2        (|x/r| < 1).
 * So the principal value p differs from that branch by a whole turn exactly where p falls
 * outside the interval, which the signs of x − r = dr + j·di decide without any further
 * arithmetic (rule 1: +1 turn in the open third quadrant dr < 0, di < 0, for the
 * interval (−π/2, 3π/2), which holds the continuous ones for Re r > 0 and the discrete ones
 * for |r| ≤ 1 (or on the circle within ON_CONTOUR) and for |r| > 1 with Re r > 0 ≥ Im r
 * (∠(−r) ∈ [π/2, π]); rule 2: −1 turn for
 * dr < 0, di ≥ 0, for |r| > 1 with Re r > 0 and Im r > 0 (∠(−r) ∈ (−π, −π/2)); no turn
 * for |r| > 1 with Re r ≤ 0, whose interval lies within [−π, π]). These are the
 * comparisons atan2 itself branches on (x.re < Re r ⇔ dr < 0, x.im < Im r ⇔ di < 0, exactly),
 * so a whole turn is added exactly where atan2 left the continuous branch. Whole turns are
 * chosen per point, not by comparing neighbours, so the phase at a point does not depend
 * on the grid: a root close to the contour, whose angle swings by nearly 180° between two
 * grid points, or a coarse grid cannot make it pick the wrong turn, and one point can be
 * evaluated alone (band errors) exactly as on the grid. A root on the contour itself keeps
 * its genuine ±180° step (there x − r passes through 0), and so does a root within rounding
 * of it (ON_CONTOUR), so that the continuous and the discrete phases of a root on the
 * contour step the same way whichever side rounding put it on. Every phase is then taken
 * relative to its first grid point (turns there subtracted), so point 0 keeps its
 * principal root sum and with it the rule that shifts a discrete phase by a multiple of
 * 360° to start beside the continuous one.
 */

/**
 * A root this close to a response contour is taken as on it: |Re s| ≤ ON_CONTOUR·max(|s|, 1/T)
 * for x = jω, ln|z| ≤ ON_CONTOUR (|z|² ≤ 1 + 2·ON_CONTOUR) for x = e^{jωT} (the same bound:
 * ln|z| = Re s·T for z = e^{sT}), far above the rounding of the discrete roots (a few
 * 1e-16 in ln|z|) and far below any grid spacing (the step at such a root is narrower
 * than ON_CONTOUR·max(|s|, 1/T) rad/s). On the contour, a root keeps the step its principal
 * angle makes where x passes it: +180° (x − r turns from pointing down to pointing up
 * through the right). A root at z = −1 is never passed: the contour ends there, at
 * θ = fl(π) just above the real axis (circleAngle), and its angle keeps the limit +90°.
 */
const ON_CONTOUR = 1e-12;

/**
 * The turn rule of a root (a, b) on a contour (see above): 0 none, 1 or 2. `axisScale`:
 * 1/T for x = jω when the sample period is known (else 0).
 */
function branchRule(a: number, b: number, discrete: boolean, axisScale: number): number {
  if (!discrete) {
    // Re r ≤ 0: dr = −Re r ≥ 0, never a turn; Re r > 0 but on the axis: the principal angle
    if (!(a > 0)) return 0;
    return a > ON_CONTOUR * Math.max(hypot(a, b), axisScale) ? 1 : 0;
  }
  if (a * a + b * b <= 1 + 2 * ON_CONTOUR) return 1;
  if (!(a > 0)) return 0;
  return b > 0 ? 2 : 1;
}

/** Whole turns to add to the principal angle of x − r for a root (a, b) under `rule`. */
function turnOf(rule: number, a: number, b: number, xr: number, xi: number): number {
  if (rule === 1) return xr < a && xi < b ? 1 : 0;
  if (rule === 2) return xr < a && xi >= b ? -1 : 0;
  return 0;
}

/**
 * Whole turns (of 2π) by which the continuous phase of H at x on a response contour
 * (x = jω, `discrete` false; x = e^{jωT}, `discrete` true) exceeds the principal root
 * sum of responseAt: Σ over zeros less Σ over poles of each root's turns (see above).
 * `axisScale` as for branchRule (x = jω only).
 */
export function branchTurns(e: Evaluator, xr: number, xi: number, discrete: boolean, axisScale = 0): number {
  let t = 0;
  for (let i = 0; i < e.zr.length; i++) t += turnOf(branchRule(e.zr[i], e.zi[i], discrete, axisScale), e.zr[i], e.zi[i], xr, xi);
  for (let i = 0; i < e.pr.length; i++) t -= turnOf(branchRule(e.pr[i], e.pi[i], discrete, axisScale), e.pr[i], e.pi[i], xr, xi);
  return t;
}

/**
 * How far (deg) a phase of gridResponse may lie from phaseDegAt (the root-by-root sum of
 * responseAt plus the same whole turns):
 * a bound with a wide margin on the rounding of either form (below 1e-12 deg on 2.5M
 * random points of random designs, roots on the grid and the unit circle included).
 */
export const PHASE_SLACK_DEG = 1e-9;
/**
 * |x − r|² of a zero or pole taken in a pair must lie within these bounds: the products of
 * two factors, and of two pairs, then stay far from under- and overflow.
 */
const PAIR_SQ_LO = 1e-140;
const PAIR_SQ_HI = 1e140;
const pairInRange = (sq: number): boolean => sq > PAIR_SQ_LO && sq < PAIR_SQ_HI;

/**
 * Magnitude (dB) and phase (deg) of a zpk at the points x = xr[i] + j·xi[i] (xr null: 0),
 * computed one root at a time over all the points (tight loops; atan2 is what a response
 * costs).
 * - Magnitudes: exactly as responseAt (the same products and quotients in the same order).
 * - Phases: responseAt sums the root angles, ∠(x − zᵢ) − ∠(x − pᵢ), one atan2 per root.
 *   Here zero k is taken with pole k: where both x − z and x − p lie above the real axis
 *   (Im r < Im x: always for real roots and the lower member of a pair, on both response
 *   grids, whose points have Im x > 0) both angles lie in (0, π), so their difference is
 *   the angle of u = (x − z)·conj(x − p), with no multiple of 2π to add. Two such pairs
 *   whose u and v both lie in the right half-plane (each angle within ±π/2) are taken
 *   together again: ∠u + ∠v = ∠(u·v). So one atan2 serves up to four roots. Elsewhere,
 *   and for the roots left over, one atan2 each. The result is the same sum up to
 *   rounding, within PHASE_SLACK_DEG; point 0, which fixes the 360° shift of a discrete
 *   phase against the continuous one, takes the root-by-root sum itself. Then every point
 *   gets its whole turns relative to point 0 (see "Continuous phase along a response
 *   contour" above; x = e^{jωT} when xr is given, else x = jω): phaseDeg[i] =
 *   ∠·180/π + 360·(turns_i − turns_0), the same as phaseDegAt with turns0 = turns_0.
 */
function gridResponse(e: Evaluator, xr: ArrayLike<number> | null, xi: ArrayLike<number>, axisScale: number): Response {
  const n = xi.length;
  if (accMag2.length < n) {
    accMag2 = new Float64Array(n);
    accPh = new Float64Array(n);
  }
  const mag2 = accMag2;
  const ph = accPh;
  const k2 = e.k * e.k;
  const ph0 = e.k < 0 ? Math.PI : 0;
  for (let i = 0; i < n; i++) {
    mag2[i] = k2;
    ph[i] = ph0;
  }
  const { zr, zi, pr, pi } = e;
  // |H|²: zeros, then poles, as evalInto
  for (let r = 0; r < zr.length; r++) {
    const ar = zr[r];
    const ai = zi[r];
    for (let i = 0; i < n; i++) {
      const dr = (xr ? xr[i] : 0) - ar;
      const di = xi[i] - ai;
      mag2[i] *= dr * dr + di * di;
    }
  }
  for (let r = 0; r < pr.length; r++) {
    const ar = pr[r];
    const ai = pi[r];
    for (let i = 0; i < n; i++) {
      const dr = (xr ? xr[i] : 0) - ar;
      const di = xi[i] - ai;
      mag2[i] /= dr * dr + di * di;
    }
  }
  // ∠H: zero k taken with pole k, two such pairs at a time, then the roots left over one by one
  const pairs = Math.min(zr.length, pr.length);
  for (let r = 0; r < pairs; r += 2) {
    const two = r + 1 < pairs;
    const z0r = zr[r];
    const z0i = zi[r];
    const p0r = pr[r];
    const p0i = pi[r];
    const z1r = two ? zr[r + 1] : 0;
    const z1i = two ? zi[r + 1] : 0;
    const p1r = two ? pr[r + 1] : 0;
    const p1i = two ? pi[r + 1] : 0;
    for (let i = 0; i < n; i++) {
      const x = xr ? xr[i] : 0;
      const y = xi[i];
      // pair r: u = (x − z)·conj(x − p) = (a + jb)(c − jd)
      const a = x - z0r;
      const b = y - z0i;
      const c = x - p0r;
      const d = y - p0i;
      const ok0 = b > 0 && d > 0 && pairInRange(a * a + b * b) && pairInRange(c * c + d * d);
      const ur = a * c + b * d;
      const ui = b * c - a * d;
      if (!two) {
        ph[i] += ok0 ? Math.atan2(ui, ur) : Math.atan2(b, a) - Math.atan2(d, c);
        continue;
      }
      // pair r + 1: v = (e + jf)(g − jh)
      const e1 = x - z1r;
      const f1 = y - z1i;
      const g1 = x - p1r;
      const h1 = y - p1i;
      const ok1 = f1 > 0 && h1 > 0 && pairInRange(e1 * e1 + f1 * f1) && pairInRange(g1 * g1 + h1 * h1);
      const vr = e1 * g1 + f1 * h1;
      const vi = f1 * g1 - e1 * h1;
      if (ok0 && ok1 && ur > 0 && vr > 0) {
        // both in the right half-plane: |∠u + ∠v| < π, so ∠u + ∠v = ∠(u·v)
        ph[i] += Math.atan2(ur * vi + ui * vr, ur * vr - ui * vi);
      } else {
        ph[i] += ok0 ? Math.atan2(ui, ur) : Math.atan2(b, a) - Math.atan2(d, c);
        ph[i] += ok1 ? Math.atan2(vi, vr) : Math.atan2(f1, e1) - Math.atan2(h1, g1);
      }
    }
  }
  for (let r = pairs; r < zr.length; r++) {
    const ar = zr[r];
    const ai = zi[r];
    for (let i = 0; i < n; i++) ph[i] += Math.atan2(xi[i] - ai, (xr ? xr[i] : 0) - ar);
  }
  for (let r = pairs; r < pr.length; r++) {
    const ar = pr[r];
    const ai = pi[r];
    for (let i = 0; i < n; i++) ph[i] -= Math.atan2(xi[i] - ai, (xr ? xr[i] : 0) - ar);
  }
  if (n > 0) ph[0] = phaseSum(e, xr ? xr[0] : 0, xi[0]);
  const turns = n > 0 ? gridTurns(e, xr, xi, axisScale) : null;
  const magnitudeDb = new Array<number>(n);
  const phaseDeg = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    // dbOf, with its common case (finite and not below MIN_DB) in line
    const db = DB_PER_LN_POWER * Math.log(mag2[i]);
    magnitudeDb[i] = db > MIN_DB && db < Infinity ? db : dbOf(e, mag2[i], xr ? xr[i] : 0, xi[i]);
    phaseDeg[i] = ph[i] * DEG;
  }
  if (turns) {
    const t0 = turns[0];
    for (let i = 1; i < n; i++) if (turns[i] !== t0) phaseDeg[i] += 360 * (turns[i] - t0);
  }
  return { magnitudeDb, phaseDeg };
}

/**
 * Whole turns of every grid point of gridResponse (branchTurns at each point), or null
 * when every one is 0. Roots whose rule cannot apply anywhere on the grid (no point left
 * of the root at the needed height: the common case of real roots and lower members of
 * pairs) are skipped without a pass over the points.
 */
function gridTurns(e: Evaluator, xr: ArrayLike<number> | null, xi: ArrayLike<number>, axisScale: number): Float64Array | null {
  const n = xi.length;
  const discrete = xr !== null;
  let minXr = Infinity;
  let minXi = Infinity;
  let maxXi = -Infinity;
  let extents = false;
  let turns: Float64Array | null = null;
  const { zr, zi, pr, pi } = e;
  for (let r = 0; r < zr.length + pr.length; r++) {
    const isZero = r < zr.length;
    const a = isZero ? zr[r] : pr[r - zr.length];
    const b = isZero ? zi[r] : pi[r - zr.length];
    const rule = branchRule(a, b, discrete, axisScale);
    if (rule === 0) continue;
    if (!extents) {
      for (let i = 0; i < n; i++) {
        const x = xr ? xr[i] : 0;
        if (x < minXr) minXr = x;
        if (xi[i] < minXi) minXi = xi[i];
        if (xi[i] > maxXi) maxXi = xi[i];
      }
      extents = true;
    }
    if (!(minXr < a) || (rule === 1 ? !(minXi < b) : !(maxXi >= b))) continue;
    if (!turns) {
      if (accTurns.length < n) accTurns = new Float64Array(Math.max(n, 2 * accTurns.length));
      turns = accTurns;
      turns.fill(0, 0, n);
    }
    const sign = isZero ? 1 : -1;
    for (let i = 0; i < n; i++) turns[i] += sign * turnOf(rule, a, b, xr ? xr[i] : 0, xi[i]);
  }
  return turns;
}

/** ∠H(x) (rad) as the sum of the principal root angles (the phase of evalInto and responseAt). */
function phaseSum(e: Evaluator, xr: number, xi: number): number {
  let ph = e.k < 0 ? Math.PI : 0;
  for (let i = 0; i < e.zr.length; i++) ph += Math.atan2(xi - e.zi[i], xr - e.zr[i]);
  for (let i = 0; i < e.pr.length; i++) ph -= Math.atan2(xi - e.pi[i], xr - e.pr[i]);
  return ph;
}

/**
 * The phase (deg) at x = xr + j·xi on a response contour (x = jω, or x = e^{jωT} when
 * `discrete`), root by root: the principal root sum of responseAt plus 360° per whole turn
 * of branchTurns beyond `turns0` (the turns of the contour's first grid point), as
 * gridResponse plots it (`axisScale` as for continuousResponse: 1/T or 0).
 */
export function phaseDegAt(e: Evaluator, xr: number, xi: number, discrete: boolean, turns0: number, axisScale = 0): number {
  const k = branchTurns(e, xr, xi, discrete, axisScale) - turns0;
  const deg = phaseSum(e, xr, xi) * DEG;
  return k === 0 ? deg : deg + 360 * k;
}

/** The dB value of evalInto from |H|² at x (the log-sum form where |H|² under- or overflows), floored at MIN_DB. */
function dbOf(e: Evaluator, mag2: number, xr: number, xi: number): number {
  let db = DB_PER_LN_POWER * Math.log(mag2);
  if (!Number.isFinite(db) || mag2 === 0) db = logSumDb(e, { re: xr, im: xi });
  return Number.isFinite(db) ? Math.max(MIN_DB, db) : db > 0 ? -MIN_DB : MIN_DB;
}

/**
 * θ = ωT of the point e^{jθ} for ω (rad/s) up to Nyquist, at most π. At Nyquist ω = 2π·(fs/2)
 * and T = 1/fs, and the rounded product lands a hair above π for about one sample rate in
 * seven (fs = 13 Hz): e^{jθ} then lies below the real axis, past z = −1, and a zero at
 * z = −1 (Tustin's zeros from infinity) turns its angle from +90° to −90° there, a −180° step
 * of the plotted phase at the last grid point. Clamped, the point is e^{j·fl(π)} = −1 + 1.2e-16j,
 * z = −1 on the side the contour comes from (a root at −1 keeps its limit angle +90°; every
 * other factor is its value at z = −1 to 1e-16; numpy's e^{jπ} is the same point). Taking
 * sin θ = 0 exactly instead would give a root at −1 the angle atan2(0, 0) = 0, a −90° step.
 */
export function circleAngle(omega: number, periodSec: number): number {
  const wt = omega * periodSec;
  return wt > Math.PI && wt <= PAST_NYQUIST ? Math.PI : wt;
}
/**
 * ωT up to this is Nyquist overshot by rounding (grid ends: 1 ulp; a crossover refined at
 * the top end: ~1e-13) and is taken as π; beyond it (no point of a grid, only a non-finite
 * ω from a failed refinement) circleAngle leaves ωT alone, as before.
 */
const PAST_NYQUIST = Math.PI * (1 + 1e-9);

/** The points e^{jωT} of a frequency grid (shared by every method at one sample period; ωT by circleAngle). */
export interface UnitCircleGrid {
  re: number[];
  im: number[];
}
export function unitCircleGrid(omegas: readonly number[], periodSec: number): UnitCircleGrid {
  const n = omegas.length;
  const re = new Array<number>(n);
  const im = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    const wt = circleAngle(omegas[i], periodSec);
    re[i] = Math.cos(wt);
    im[i] = Math.sin(wt);
  }
  return { re, im };
}

/** Discrete response on the grid, its phase shifted by a multiple of 360° to start beside `reference`. */
export function discreteResponse(hIn: Zpk | Evaluator, omegas: number[] | UnitCircleGrid, periodSec: number, reference?: Response): Response & { shiftDeg: number } {
  const h = 'k' in hIn ? hIn : evaluator(hIn);
  const g = Array.isArray(omegas) ? unitCircleGrid(omegas, periodSec) : omegas;
  const { magnitudeDb, phaseDeg } = gridResponse(h, g.re, g.im, 0);
  const n = phaseDeg.length;
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
 * Where a loop is evaluated for its crossovers: a log grid of ω on [lo, hi] rad/s with
 * its points x = jω (continuous loop, periodSec null) or x = e^{jωT} (discrete loop; ωT by
 * circleAngle, so hi = π/T is z = −1).
 * The same grid serves every method of a request (it depends only on T and ω₀).
 */
export interface CrossingGrid {
  ws: number[];
  xr: number[];
  xi: number[];
  periodSec: number | null;
}
export function crossingGrid(lo: number, hi: number, points: number, periodSec: number | null): CrossingGrid {
  const ws = logGrid(lo, hi, points);
  const n = ws.length;
  const xr = new Array<number>(n);
  const xi = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    const w = ws[i];
    if (periodSec === null) {
      xr[i] = 0;
      xi[i] = w;
    } else {
      const wt = circleAngle(w, periodSec);
      xr[i] = Math.cos(wt);
      xi[i] = Math.sin(wt);
    }
  }
  return { ws, xr, xi, periodSec };
}

/** lnMagPhaseInto at the point of ω (jω, or e^{jωT} with ωT by circleAngle); `want` as there. */
function loopAt(e: Evaluator, periodSec: number | null, w: number, want: number): void {
  if (periodSec === null) lnMagPhaseInto(e, 0, w, want);
  else {
    const wt = circleAngle(w, periodSec);
    lnMagPhaseInto(e, Math.cos(wt), Math.sin(wt), want);
  }
}

/** Phase at ω on the branch nearest `ref` (rad). */
function phaseNear(e: Evaluator, periodSec: number | null, w: number, ref: number): number {
  loopAt(e, periodSec, w, WANT_PHASE);
  return ref + wrapPi(lmPh - ref);
}

/** The function whose root bisectCrossing seeks at ω: ln|L| (mode 0) or the phase on the branch of `ref` less `line` (mode 1). */
function crossingValue(e: Evaluator, T: number | null, w: number, mode: 0 | 1, ref: number, line: number): number {
  if (mode === 0) {
    loopAt(e, T, w, WANT_MAG);
    return lmLn;
  }
  return phaseNear(e, T, w, ref) - line;
}

/**
 * Root on log ω, between grid points a and b where f changes sign, by Illinois regula
 * falsi. f is ln|L| (mode 0; fa, fb its values at a and b) or the phase on the branch
 * of `ref` less `line` (mode 1).
 */
function bisectCrossing(e: Evaluator, T: number | null, a: number, b: number, mode: 0 | 1, fa: number, fb: number, ref: number, line: number): number {
  let x0 = Math.log(a);
  let x1 = Math.log(b);
  let f0 = mode === 0 ? fa : crossingValue(e, T, a, mode, ref, line);
  let f1 = mode === 0 ? fb : crossingValue(e, T, b, mode, ref, line);
  if (f0 === 0) return a;
  if (f1 === 0) return b;
  let side = 0;
  for (let k = 0; k < 100 && Math.abs(x1 - x0) > 1e-15 * Math.max(1, Math.abs(x0)); k++) {
    // values at rounding level may lose the sign change (a phase lying on the line over a stretch)
    if (Math.sign(f0) === Math.sign(f1)) break;
    const x = (x0 * f1 - x1 * f0) / (f1 - f0);
    const fx = crossingValue(e, T, Math.exp(x), mode, ref, line);
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
  if (Math.sign(f0) !== Math.sign(f1)) return Math.exp((x0 * f1 - x1 * f0) / (f1 - f0));
  // no sign change (the line touched at an end, or values at rounding level over a
  // stretch): the end nearer the line, never an extrapolation beyond the bracket
  return Math.exp(Math.abs(f0) <= Math.abs(f1) ? x0 : x1);
}

// Grid values of findCrossings (module scratch, grown as needed): the products
// v = K·Π(x − zᵢ) and q = Π(x − pᵢ) at every point (point i at 4i: Re v, Im v, Re q, Im q),
// the sign of ln|L| (+1, −1 or 0), ln|L| (NaN until needed, except at fallback points),
// and the unwrapped phase (rad).
let gProd = new Float64Array(4 * 512);
let gSign = new Float64Array(512);
let gLn = new Float64Array(512);
let gPh = new Float64Array(512);

/** ln|L| at grid point i, as lnMagPhaseInto takes it (log of |v|/|q|), computed when first needed. */
function gridLnAt(i: number): number {
  let v = gLn[i];
  if (v !== v) v = gLn[i] = Math.log(hypot(gProd[4 * i], gProd[4 * i + 1]) / hypot(gProd[4 * i + 2], gProd[4 * i + 3])); // eslint-disable-line no-self-compare
  return v;
}

/**
 * Squared magnitudes strictly between these bounds give |v|/|q| finite and positive (no
 * fallback to the log-sum form) whatever the rounding.
 */
const SQ_LO = 1e-290;
const SQ_HI = 1e290;
/**
 * |v|² and |q|² further apart than this relative margin decide the sign of |v|/|q| − 1
 * (their rounding, and that of the hypot quotient, is some 1e-15 relative).
 */
const SQ_MARGIN = 1e-12;

/**
 * All gain and phase crossovers of a zpk loop on a crossing grid: dense evaluation on
 * the grid, then regula falsi on log ω (DESIGN.md lessons: dense evaluation, then
 * refine). ln|L| and the phase (radians, any branch) are those of lnMagPhaseInto; the
 * grid phase is unwrapped. On the grid ln|L| is needed only for its sign, that of
 * |v|² − |q|² where these are clearly apart (else of |v|/|q| − 1 as computed), so the
 * magnitudes and the logarithm are taken only at the points where they are used.
 */
export function findCrossings(e: Evaluator, grid: CrossingGrid): Crossings {
  const { ws, xr, xi, periodSec: T } = grid;
  const n = ws.length;
  const hi = ws[n - 1];
  if (gSign.length < n) {
    gProd = new Float64Array(4 * n);
    gSign = new Float64Array(n);
    gLn = new Float64Array(n);
    gPh = new Float64Array(n);
  }
  const prods = gProd;
  const sign = gSign;
  const lns = gLn;
  const phs = gPh;
  for (let i = 0; i < n; i++) {
    const x = xr[i];
    const y = xi[i];
    loopProductsInto(e, x, y, prods, 4 * i);
    const ar = prods[4 * i];
    const ai = prods[4 * i + 1];
    const br = prods[4 * i + 2];
    const bi = prods[4 * i + 3];
    const sv = ar * ar + ai * ai;
    const sq = br * br + bi * bi;
    let ph: number;
    lns[i] = NaN;
    if (sv > SQ_LO && sv < SQ_HI && sq > SQ_LO && sq < SQ_HI) {
      if (sv > sq * (1 + SQ_MARGIN)) sign[i] = 1;
      else if (sv < sq * (1 - SQ_MARGIN)) sign[i] = -1;
      else {
        const m = hypot(ar, ai) / hypot(br, bi);
        sign[i] = m > 1 ? 1 : m < 1 ? -1 : 0;
      }
      ph = Math.atan2(ai, ar) - Math.atan2(bi, br);
    } else {
      // squares out of range (rare): ln|L| and ∠L from lnMagPhaseInto itself, with its
      // fallback to the log-sum form (the sign of ln|L| is that of |v|/|q| − 1)
      lnMagPhaseInto(e, x, y, WANT_BOTH);
      lns[i] = lmLn;
      sign[i] = Math.sign(lmLn);
      ph = lmPh;
    }
    const prev = i > 0 ? phs[i - 1] : ph;
    phs[i] = prev + wrapPi(ph - prev);
  }
  const out: Crossings = { gain: [], phase: [] };
  for (let i = 0; i + 1 < n; i++) {
    const sHere = sign[i];
    if (sHere === 0 || sHere !== sign[i + 1]) {
      if (sHere === 0 && i > 0 && sign[i - 1] === 0) continue;
      const w = sHere === 0 ? ws[i] : bisectCrossing(e, T, ws[i], ws[i + 1], 0, gridLnAt(i), gridLnAt(i + 1), 0, 0);
      const ph = phaseNear(e, T, w, phs[i]);
      out.gain.push({ omega: w, phaseMarginDeg: wrap180(180 + ph * DEG) });
    }
    // crossing of a line −π + 2πm between grid points i and i+1
    const ka = Math.floor((phs[i] + Math.PI) / (2 * Math.PI));
    const kb = Math.floor((phs[i + 1] + Math.PI) / (2 * Math.PI));
    if (ka !== kb) {
      const line = -Math.PI + 2 * Math.PI * Math.max(ka, kb);
      const w = bisectCrossing(e, T, ws[i], ws[i + 1], 1, 0, 0, phs[i], line);
      loopAt(e, T, w, WANT_MAG);
      out.phase.push({ omega: w, gainMarginDb: (-20 / Math.LN10) * lmLn });
    }
  }
  // The top end (Nyquist for a discrete loop, where L is real) may sit exactly on −180°.
  const last = phs[n - 1];
  const offLine = wrapPi(last + Math.PI);
  if (Math.abs(offLine) < 1e-7 && !out.phase.some((p) => Math.abs(p.omega - hi) <= 1e-9 * hi)) {
    out.phase.push({ omega: hi, gainMarginDb: (-20 / Math.LN10) * gridLnAt(n - 1) });
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

const WANT_MAG = 1;
const WANT_PHASE = 2;
const WANT_BOTH = 3;
// Results of lnMagPhaseInto (module scratch: the crossover refinement and the bandwidth
// scan allocate nothing per call).
let lmLn = 0;
let lmPh = 0;

/**
 * The loop's products at x = xr + j·xi, v = K·Π(x − zᵢ) and q = Π(x − pᵢ) (L = v/q), one
 * root at a time, into out[at … at + 3] = Re v, Im v, Re q, Im q: the one product loop of
 * lnMagPhaseInto, closedLoopBelow and the crossover grid of findCrossings. The grid writes
 * straight into its own per-point array (gProd, which it keeps for gridLnAt anyway), so
 * sharing the loop costs it only the reads back (about 1 % of the crossing scans).
 */
function loopProductsInto(e: Evaluator, xr: number, xi: number, out: Float64Array, at: number): void {
  const { zr, zi, pr, pi } = e;
  let vr = e.k;
  let vi = 0;
  for (let i = 0; i < zr.length; i++) {
    const dr = xr - zr[i];
    const di = xi - zi[i];
    const t = vr * dr - vi * di;
    vi = vr * di + vi * dr;
    vr = t;
  }
  let qr = 1;
  let qi = 0;
  for (let i = 0; i < pr.length; i++) {
    const dr = xr - pr[i];
    const di = xi - pi[i];
    const t = qr * dr - qi * di;
    qi = qr * di + qi * dr;
    qr = t;
  }
  out[at] = vr;
  out[at + 1] = vi;
  out[at + 2] = qr;
  out[at + 3] = qi;
}
// loopProductsInto's output for a single point (lnMagPhaseInto, closedLoopBelow).
const prod = new Float64Array(4);

/** ln|L| and ∠L of a zpk loop at x (one atan2 per product) into lmLn / lmPh; only the parts in `want` (the other is left 0). */
function lnMagPhaseInto(e: Evaluator, xr: number, xi: number, want: number): void {
  loopProductsInto(e, xr, xi, prod, 0);
  const vr = prod[0];
  const vi = prod[1];
  const qr = prod[2];
  const qi = prod[3];
  const m = hypot(vr, vi) / hypot(qr, qi);
  if (!(m > 0) || !Number.isFinite(m)) {
    // fall back to the log-sum form when the products under- or overflow
    evalInto(e, xr, xi);
    lmLn = (outDb * Math.LN10) / 20;
    lmPh = outDeg / DEG;
    return;
  }
  lmLn = want & WANT_MAG ? Math.log(m) : 0;
  lmPh = want & WANT_PHASE ? Math.atan2(vi, vr) - Math.atan2(qi, qr) : 0;
}

/**
 * |T(jω)| of the continuous closed loop T = L/(1 + L) from the loop's ln|L| and ∠L at jω
 * (ω in rad/s).
 */
function closedLoopMagnitudeAt(e: Evaluator, w: number): number {
  lnMagPhaseInto(e, 0, w, WANT_BOTH);
  const m = Math.exp(lmLn);
  const ph = lmPh;
  return m / hypot(1 + m * Math.cos(ph), m * Math.sin(ph));
}

/**
 * closedLoopMagnitudeAt(e, w) < limit, decided without the logarithm, exponential and
 * trigonometry where the answer is clear: with L = v/q (the same products),
 * |T|² = |v|²/|v + q|², whose rounding (a few ulp) and that of the value
 * closedLoopMagnitudeAt computes (below 1e-9 relative while |L| ≤ 1000·|1 + L| and
 * nothing under- or overflows) cannot change a comparison more than 1e-9 from the limit.
 * Elsewhere the value itself is computed and compared.
 */
function closedLoopBelow(e: Evaluator, w: number, limit: number): boolean {
  loopProductsInto(e, 0, w, prod, 0);
  const vr = prod[0];
  const vi = prod[1];
  const qr = prod[2];
  const qi = prod[3];
  const sv = vr * vr + vi * vi;
  const sq = qr * qr + qi * qi;
  const sw = (vr + qr) * (vr + qr) + (vi + qi) * (vi + qi);
  const lim2 = limit * limit;
  if (sv > SQ_LO && sv < SQ_HI && sq > SQ_LO && sq < SQ_HI && sw > SQ_LO && sw < SQ_HI && sv <= 1e6 * sw && lim2 > SQ_LO && lim2 < SQ_HI) {
    const t2 = sv / sw;
    if (t2 < lim2 * (1 - 1e-9)) return true;
    if (t2 > lim2 * (1 + 1e-9)) return false;
  }
  return closedLoopMagnitudeAt(e, w) < limit;
}

/**
 * −3 dB bandwidth of the continuous closed loop L/(1 + L), rad/s (`loop`: L's evaluator);
 * null when none is found. Scans the 200-point log grid of logGrid(lo, hi, 200) upwards,
 * each point computed only when reached.
 */
export function closedLoopBandwidthRad(loop: Evaluator, lo: number, hi: number): number | null {
  const n = 200;
  const a = Math.log(lo);
  const step = (Math.log(hi) - a) / (n - 1);
  const t0 = closedLoopMagnitudeAt(loop, lo);
  if (!(t0 > 0) || !Number.isFinite(t0)) return null;
  for (let i = 0; i < n; i++) {
    const w = i === 0 ? lo : i === n - 1 ? hi : Math.exp(a + step * i);
    if (closedLoopBelow(loop, w, t0 / Math.SQRT2)) return w;
  }
  return null;
}

// ------------------------------------------------------------------ loops and steps

/**
 * Closed-loop characteristic polynomial den·z^d + num (descending), and its roots.
 * `lead` is its coefficient of the degree of den·z^d, 1 + L(∞) times den's leading
 * coefficient: 0 when the loop is ill-posed (the caller refuses it; the roots are then
 * those of the polynomial without its vanished leading term).
 */
export function closedLoopPoles(numDesc: number[], denDesc: number[], delay = 0): { poles: Complex[]; lead: number } {
  const den = delay > 0 ? [...denDesc, ...new Array<number>(delay).fill(0)] : denDesc;
  const ch = polyAdd(den, numDesc);
  return { poles: polyRoots(ch), lead: ch[0] };
}

/**
 * A step sampled every h seconds (t_k = k·h): figures from the first n samples of y,
 * arrays of the first `shown` samples thinned to ≤ maxPoints (every stride-th and the last).
 */
export function uniformStep(y: ArrayLike<number>, n: number, h: number, finalValue: number | null, shown: number, maxPoints: number): StepResponse {
  let timeSec: number[] = [];
  let output: number[] = [];
  if (shown > 0) {
    const stride = Math.ceil(shown / maxPoints);
    const regular = Math.ceil(shown / stride);
    const withLast = (shown - 1) % stride !== 0;
    const count = regular + (withLast ? 1 : 0);
    timeSec = new Array<number>(count);
    output = new Array<number>(count);
    for (let j = 0, k = 0; j < regular; j++, k += stride) {
      timeSec[j] = k * h;
      output[j] = y[k];
    }
    if (withLast) {
      timeSec[regular] = (shown - 1) * h;
      output[regular] = y[shown - 1];
    }
  }
  const fig = stepFigures(y, n, h, finalValue);
  return { timeSec, output, finalValue, overshootPercent: fig.overshootPercent, riseTimeSec: fig.riseTimeSec, settlingTimeSec: fig.settlingTimeSec };
}

/**
 * Response metrics of a step (DESIGN.md / issue 3): overshoot (%), 10–90 % rise time and
 * 2 % settling time (s) of the first n samples, sample k at time k·h. Null figures without
 * a finite, non-zero final value.
 */
function stepFigures(y: ArrayLike<number>, n: number, h: number, finalValue: number | null): Pick<StepResponse, 'overshootPercent' | 'riseTimeSec' | 'settlingTimeSec'> {
  if (finalValue === null || finalValue === 0 || !Number.isFinite(finalValue)) return { overshootPercent: null, riseTimeSec: null, settlingTimeSec: null };
  const f = finalValue;
  const sgn = Math.sign(f);
  let peak = -Infinity;
  for (let k = 0; k < n; k++) peak = Math.max(peak, sgn * y[k]);
  const overshootPercent = Math.max(0, ((peak - Math.abs(f)) / Math.abs(f)) * 100);
  const t10 = levelCrossing(y, n, h, sgn, 0.1 * Math.abs(f));
  const t90 = levelCrossing(y, n, h, sgn, 0.9 * Math.abs(f));
  const band = 0.02 * Math.abs(f);
  // the last sample outside the 2 % band (−1: none)
  let lastOut = n - 1;
  while (lastOut >= 0 && !(Math.abs(y[lastOut] - f) > band)) lastOut--;
  return {
    overshootPercent,
    riseTimeSec: t10 !== null && t90 !== null ? t90 - t10 : null,
    settlingTimeSec: lastOut === n - 1 ? null : (lastOut + 1) * h,
  };
}

/** First time sgn·y reaches `level` (sample k at k·h), linearly interpolated between samples; null when it never does. */
function levelCrossing(y: ArrayLike<number>, n: number, h: number, sgn: number, level: number): number | null {
  for (let k = 0; k < n; k++) {
    if (sgn * y[k] >= level) {
      if (k === 0) return 0;
      const y0 = sgn * y[k - 1];
      const y1 = sgn * y[k];
      const tk1 = (k - 1) * h;
      const tk = k * h;
      return tk1 + ((level - y0) / (y1 - y0)) * (tk - tk1);
    }
  }
  return null;
}

/** y[k] = C x[k] + D, x[k+1] = F x[k] + g (a held unit step), k = 0 … steps; F n×n row-major. */
function iterateStep(f: number[], g: number[], c: number[], d: number, steps: number): number[] {
  const n = g.length;
  const y = new Array<number>(steps + 1);
  if (n <= MAX_UNROLLED_STATES) stepKernel(n)(f, g, c, d, steps, y);
  else iterateLoop(f, g, c, d, steps, y);
  return y;
}

type StepKernel = (f: number[], g: number[], c: number[], d: number, steps: number, y: number[]) => void;

/** The general loop of iterateStep (states in arrays). */
const iterateLoop: StepKernel = (flat, g, c, d, steps, y) => {
  const n = g.length;
  let x = new Float64Array(n);
  let nx = new Float64Array(n);
  for (let k = 0; k <= steps; k++) {
    let v = d;
    for (let i = 0; i < n; i++) v += c[i] * x[i];
    y[k] = v;
    for (let i = 0; i < n; i++) {
      let s = g[i];
      const row = i * n;
      for (let j = 0; j < n; j++) s += flat[row + j] * x[j];
      nx[i] = s;
    }
    const t = x;
    x = nx;
    nx = t;
  }
};

/**
 * Up to this many states the step is simulated by a loop written out for that size (the
 * states and coefficients in locals, ~4× faster than the general loop). It performs the
 * same operations in the same order, so the samples are bit for bit those of the loop.
 */
const MAX_UNROLLED_STATES = 12;
const kernels: StepKernel[] = [];

function stepKernel(n: number): StepKernel {
  let k = kernels[n];
  if (!k) {
    // Source built from the integer n alone (no input reaches it).
    const lines: string[] = [];
    const terms = (head: string, coef: (j: number) => string) => head + Array.from({ length: n }, (_, j) => ` + ${coef(j)} * x${j}`).join('');
    for (let i = 0; i < n; i++) {
      lines.push(`const g${i} = g[${i}], c${i} = c[${i}];`);
      for (let j = 0; j < n; j++) lines.push(`const f${i}_${j} = f[${i * n + j}];`);
      lines.push(`let x${i} = 0;`);
    }
    lines.push('for (let k = 0; k <= steps; k++) {');
    lines.push(`y[k] = ${terms('d', (j) => `c${j}`)};`);
    for (let i = 0; i < n; i++) lines.push(`const n${i} = ${terms(`g${i}`, (j) => `f${i}_${j}`)};`);
    for (let i = 0; i < n; i++) lines.push(`x${i} = n${i};`);
    lines.push('}');
    // eslint-disable-next-line @typescript-eslint/no-implied-eval, no-new-func
    k = new Function('f', 'g', 'c', 'd', 'steps', 'y', lines.join('\n')) as StepKernel;
    kernels[n] = k;
  }
  return k;
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
