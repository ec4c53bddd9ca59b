import { abs, cx, div, exp, expm1, hypot, mul, scale, sub } from './complex';
import { DspInputError } from './errors';
import { complexDet } from './linalg';
import { evalZpk, zpkToDiscreteTf } from './lti';
import { eigenvalues, polyFromRoots, polyRoots, trimLeading } from './poly';
import { zohSs, zpkToSs, type StateSpace } from './realization';
import type { Complex, DiscreteTf, MethodName, Zpk } from './types';

/**
 * The five discretization methods of DESIGN.md, on roots. Input: a continuous zpk in s
 * (rad/s), sample rate in Hz. Output: zpk in z, K·Π(z − zᵢ)/Π(z − pᵢ) with zeros at z = ∞
 * omitted, and the difference-equation form (num/den of z⁰, z⁻¹ …, equal lengths).
 *
 * Example: discretizeZpk({zeros: [{re: −3, im: 0}], poles: [{re: −18, im: 0}], gain: 25}, 'tustin', 250)
 *   → zeros [0.988072 = 497/503], poles [0.930502 = 482/518], gain 24.2761 = 25·503/518;
 *     num [24.2761, −23.9865], den [1, −0.930502].
 */
export interface DiscretizeOptions {
  /** ω₀ in rad/s: required by `prewarp`, and by `matched` when the DC gain is 0 or infinite. */
  prewarpRadPerSec?: number;
}

export interface DiscreteResult {
  zpk: Zpk;
  tf: DiscreteTf;
  /**
   * H(z = 1) from the structure without the zpk product's 1 − zᵢ, which cancels for roots
   * near z = 1 (ZOH: H(0) by step invariance; the others K_d times each root's 1 − z in a
   * form exact for its map); null when infinite.
   */
  dcGain: number | null;
}

/**
 * Generalized bilinear map s = c·(z − 1)/(z + 1): each root r → (c + r)/(c − r), each zero
 * at infinity → z = −1, gain K·Π(c − zᵢ)/Π(c − pᵢ) (from s − r = (c − r)(z − (c + r)/(c − r))/(z + 1)).
 * c = 2/T is Tustin; c = ω₀/tan(ω₀T/2) is Tustin prewarped at ω₀.
 */
export function bilinearZpk(cont: Zpk, c: number): Zpk {
  const cc = cx(c);
  let g = cx(cont.gain);
  for (const z of cont.zeros) g = mul(g, sub(cc, z));
  for (const p of cont.poles) g = div(g, sub(cc, p));
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  // r → (c + r)/(c − r); zeros at infinity → −1
  for (const r of cont.zeros) zeros.push(div(cx(c + r.re, r.im), sub(cc, r)));
  for (let k = cont.zeros.length; k < cont.poles.length; k++) zeros.push(cx(-1));
  for (const r of cont.poles) poles.push(div(cx(c + r.re, r.im), sub(cc, r)));
  return { zeros, poles, gain: g.re };
}

/**
 * Backward Euler s = (z − 1)/(T z): each root r → 1/(1 − rT), each zero at infinity → z = 0,
 * gain K·T^(np − nz)·Π(1 − zᵢT)/Π(1 − pᵢT) (from s − r = ((1 − rT)/T)(z − 1/(1 − rT))/z).
 */
export function backwardEulerZpk(cont: Zpk, periodSec: number): Zpk {
  const T = periodSec;
  const one = cx(1);
  let g = cx(cont.gain * Math.pow(T, cont.poles.length - cont.zeros.length));
  for (const z of cont.zeros) g = mul(g, sub(one, scale(z, T)));
  for (const p of cont.poles) g = div(g, sub(one, scale(p, T)));
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  // r → 1/(1 − rT); zeros at infinity → 0
  for (const r of cont.zeros) zeros.push(div(one, sub(one, scale(r, T))));
  for (let k = cont.zeros.length; k < cont.poles.length; k++) zeros.push(cx(0));
  for (const r of cont.poles) poles.push(div(one, sub(one, scale(r, T))));
  return { zeros, poles, gain: g.re };
}

/** True when a root lies exactly at s = 0. */
const atOrigin = (r: Complex) => r.re === 0 && r.im === 0;

/**
 * H_d(1) = kd·Π(1 − zᵢ)/Π(1 − pᵢ) of a model with gain kd whose map sends each continuous
 * root r to a z with 1 − z = oneLess(r), written in a form exact for the map, and each zero
 * at infinity to a z with 1 − z = oneLessAtInfinity. The zpk product subtracts the rounded
 * z from 1 instead and keeps only ~|1 − z|/ε of its digits (2e-6 relative for a root at
 * −0.001 rad/s at 10 MHz by Tustin). Null with a pole at s = 0 (z = 1 exactly), 0 with a
 * zero there.
 */
function dcGainOfMap(cont: Zpk, kd: number, oneLessAtInfinity: number, oneLess: (r: Complex) => Complex): number | null {
  if (cont.poles.some(atOrigin)) return null;
  if (cont.zeros.some(atOrigin)) return 0;
  let g = cx(kd * Math.pow(oneLessAtInfinity, cont.poles.length - cont.zeros.length));
  for (const z of cont.zeros) g = mul(g, oneLess(z));
  for (const p of cont.poles) g = div(g, oneLess(p));
  return Number.isFinite(g.re) ? g.re : null;
}

/** H_d(1) of a bilinear model (s = c·(z − 1)/(z + 1)): z = (c + r)/(c − r) has 1 − z = −2r/(c − r); a zero at infinity, z = −1, 1 − z = 2. */
function bilinearDcGain(cont: Zpk, c: number, kd: number): number | null {
  const cc = cx(c);
  return dcGainOfMap(cont, kd, 2, (r) => div(scale(r, -2), sub(cc, r)));
}

/** H_d(1) of a backward-Euler model (s = (z − 1)/(T z)): z = 1/(1 − rT) has 1 − z = −rT/(1 − rT); a zero at infinity, z = 0, 1 − z = 1. */
function backwardEulerDcGain(cont: Zpk, T: number, kd: number): number | null {
  const one = cx(1);
  return dcGainOfMap(cont, kd, 1, (r) => div(scale(r, -T), sub(one, scale(r, T))));
}

/**
 * Matched pole–zero: z = e^{rT} for finite roots (s = 0 → z = 1 exactly), every zero at
 * infinity → z = −1. Gain matched at DC, K_d = K·Π zᵢ/(e^{zᵢT} − 1) · Π (e^{pᵢT} − 1)/pᵢ / 2^(np − nz)
 * (expm1 keeps it exact at high rates); where the DC gain is 0 or infinite (a root at
 * s = 0), |H_d(e^{jω₀T})| = |H(jω₀)| with the sign of K kept (|H_d| from
 * matchedUnitMagnitude, again without subtracting rounded exponentials).
 */
export function matchedZpk(cont: Zpk, periodSec: number, prewarpRadPerSec?: number): Zpk {
  const T = periodSec;
  const extra = cont.poles.length - cont.zeros.length;
  const zeros = [...cont.zeros.map((r) => exp(scale(r, T))), ...Array.from({ length: extra }, () => cx(-1))];
  const poles = cont.poles.map((r) => exp(scale(r, T)));
  const unit: Zpk = { zeros, poles, gain: 1 };
  if (!cont.zeros.some(atOrigin) && !cont.poles.some(atOrigin)) {
    let g = cx(cont.gain / Math.pow(2, extra));
    for (const z of cont.zeros) g = mul(g, div(z, expm1(scale(z, T))));
    for (const p of cont.poles) g = mul(g, div(expm1(scale(p, T)), p));
    return { ...unit, gain: g.re };
  }
  const w0 = prewarpRadPerSec;
  if (w0 === undefined || !(w0 > 0) || !Number.isFinite(w0)) {
    throw new DspInputError('matched pole–zero needs a prewarp frequency when the DC gain is 0 or infinite', [
      { path: 'prewarpHz', message: 'give prewarpHz: the gain is matched there because the DC gain is 0 or infinite' },
    ]);
  }
  const hc = abs(evalZpk(cont, cx(0, w0)));
  const hd = matchedUnitMagnitude(cont, T, w0);
  if (!(hd > 0) || !Number.isFinite(hd) || !(hc > 0) || !Number.isFinite(hc)) {
    throw new DspInputError('matched pole–zero cannot match the gain at this prewarp frequency (a root lies on it)', [
      { path: 'prewarpHz', message: 'choose a prewarp frequency away from the roots on the imaginary axis' },
    ]);
  }
  return { ...unit, gain: Math.sign(cont.gain) * (hc / hd) };
}

/**
 * |Π(x − zᵢ)/Π(x − pᵢ)| at x = e^{jω₀T} for the matched roots of `cont` (unit gain). Each
 * finite root's factor is e^{jω₀T} − e^{rT} = e^{rT}·expm1((jω₀ − r)T): subtracting the two
 * rounded exponentials instead loses the digits they share, which is most of them when
 * ω₀T and rT are small (1e-8 relative at ω₀T ~ 1e-10: a PI (s + 0.01)/s at 10 MHz with
 * prewarpHz 0.001); the complex expm1 (complex.ts: expm1 of the real part, cos − 1 as
 * −2 sin²(θ/2)) keeps them. A zero at infinity (z = −1) gives |e^{jω₀T} + 1| = 2 cos(ω₀T/2)
 * (ω₀T < π).
 */
function matchedUnitMagnitude(cont: Zpk, T: number, w0: number): number {
  let m = 1;
  for (const z of cont.zeros) m *= Math.exp(z.re * T) * abs(expm1(cx(-z.re * T, (w0 - z.im) * T)));
  for (let k = cont.zeros.length; k < cont.poles.length; k++) m *= 2 * Math.cos((w0 * T) / 2);
  for (const p of cont.poles) m /= Math.exp(p.re * T) * abs(expm1(cx(-p.re * T, (w0 - p.im) * T)));
  return m;
}

/**
 * H_d(1) of a matched model: z = e^{rT} has 1 − z = −expm1(rT) (1e-7 relative lost by
 * subtraction for a root at −0.1 rad/s at 10 MHz); a zero at infinity, z = −1, 1 − z = 2.
 */
function matchedDcGain(cont: Zpk, T: number, kd: number): number | null {
  return dcGainOfMap(cont, kd, 2, (r) => scale(expm1(scale(r, T)), -1));
}

/**
 * Zero-order hold (step invariant). Poles e^{pᵢT} exactly. The numerator N(z) = det(zI − Φ)·H_d(z)
 * = det [[zI − Φ, Γ], [−C, D]] is evaluated at the n + 1 points zₖ = e^{iπ(2k+1)/(n+1)} on the
 * unit circle (far from the poles clustered near z = 1 at high rates, so nothing cancels) and
 * its coefficients recovered by the inverse DFT; Φ, Γ come from expm of the augmented
 * matrix of a cascade realization. num[0] = D exactly (0 for a strictly proper H(s): the
 * one-sample delay).
 */
export function zohDiscretize(cont: Zpk, periodSec: number): DiscreteResult {
  const T = periodSec;
  const n = cont.poles.length;
  const poles = cont.poles.map((r) => exp(scale(r, T)));
  const den = polyFromRoots(poles);
  const dcGain = zohDcGain(cont);
  if (n === 0) {
    return { zpk: { zeros: [], poles: [], gain: cont.gain }, tf: { num: [cont.gain], den: [1] }, dcGain };
  }
  const ss = zpkToSs(cont);
  const { phi, gamma, phiMinusI } = zohSs(ss, T);
  // N(zₖ) = det [[zₖI − Φ, Γ], [−C, D]], an (n+1)×(n+1) complex matrix
  const size = n + 1;
  const values: Complex[] = [];
  const mRe = new Array<number>(size * size).fill(0);
  const mIm = new Array<number>(size * size).fill(0);
  for (let k = 0; k <= n; k++) {
    const th = (Math.PI * (2 * k + 1)) / (n + 1);
    const zr = Math.cos(th);
    const zi = Math.sin(th);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const v = phi[i * n + j];
        mRe[i * size + j] = i === j ? zr - v : -v;
        mIm[i * size + j] = i === j ? zi - 0 : 0;
      }
      mRe[i * size + n] = gamma[i];
      mIm[i * size + n] = 0;
    }
    for (let j = 0; j < n; j++) {
      mRe[n * size + j] = -ss.c[j];
      mIm[n * size + j] = 0;
    }
    mRe[n * size + n] = ss.d;
    mIm[n * size + n] = 0;
    values.push(complexDet(mRe, mIm, size));
  }
  // a_m (coefficient of z^m) = (1/(n+1)) Σₖ N(zₖ)·conj(zₖ)^m
  const asc: number[] = [];
  for (let mPow = 0; mPow <= n; mPow++) {
    let s = 0;
    for (let k = 0; k <= n; k++) {
      const th = -(Math.PI * (2 * k + 1) * mPow) / (n + 1);
      s += values[k].re * Math.cos(th) - values[k].im * Math.sin(th);
    }
    asc.push(s / (n + 1));
  }
  asc[n] = ss.d;
  const num = asc.reverse();
  const trimmed = trimLeading(num);
  const zeros = zohZeros(ss, phi, gamma, phiMinusI) ?? (trimmed.length > 1 ? polyRoots(trimmed) : []);
  refineSmallestZero(zeros, dcGain, cont.poles, T, trimmed[0]);
  // s = 0 → z = 1 exactly: a continuous zero at the origin stays a discrete zero at 1
  // (step invariance: H_d(1) = H(0) = 0).
  const originZeros = cont.zeros.filter(atOrigin).length;
  for (let k = 0; k < originZeros; k++) {
    let best = -1;
    zeros.forEach((z, i) => {
      if (z.im === 0 && (best < 0 || Math.abs(z.re - 1) < Math.abs(zeros[best].re - 1))) best = i;
    });
    if (best >= 0) zeros[best] = cx(1);
  }
  return { zpk: { zeros, poles, gain: trimmed[0] }, tf: { num, den }, dcGain };
}

/**
 * H_d(1) of the ZOH model: equal to H(0) by step invariance (a held constant input is
 * sampled exactly), evaluated from the continuous roots in product form. The state-space
 * form D + C(I − Φ)⁻¹Γ cancels when |H(0)| ≪ |D|, and the product over the discrete
 * zeros carries their eigenvalue error, so neither is used for the reported value.
 * Null with a pole at s = 0 (z = 1), 0 with a zero there.
 */
function zohDcGain(cont: Zpk): number | null {
  if (cont.poles.some(atOrigin)) return null;
  if (cont.zeros.some(atOrigin)) return 0;
  const v = evalZpk(cont, cx(0)).re;
  return Number.isFinite(v) ? v : null;
}

/**
 * Transmission zeros of the discrete model (Φ, Γ, C, D), computed as w = z − 1 so the
 * zeros clustered near z = 1 at high rates keep their relative accuracy:
 * D ≠ 0: z − 1 = eig((Φ − I) − ΓC/D); D = 0 with CΓ ≠ 0: the zero dynamics
 * x⁺ = (I − Γ(CΓ)⁻¹C)Φx give z − 1 = eig((Φ − I) − Γ(CΓ)⁻¹CΦ), less the one
 * eigenvalue at z = 0 (w = −1) that direction Γ contributes. Null when CΓ vanishes
 * (relative degree above one; the caller falls back to the numerator's roots).
 */
function zohZeros(ss: StateSpace, phi: number[], gamma: number[], phiMinusI: number[]): Complex[] | null {
  const n = ss.n;
  const c = ss.c;
  const m: number[][] = [];
  let dropOne = false;
  if (ss.d !== 0) {
    for (let i = 0; i < n; i++) {
      const row: number[] = new Array(n);
      for (let j = 0; j < n; j++) row[j] = phiMinusI[i * n + j] - (gamma[i] * c[j]) / ss.d;
      m.push(row);
    }
  } else {
    let cg = 0;
    let cc = 0;
    let gg = 0;
    let bound = 0;
    for (let i = 0; i < n; i++) cg = cg + c[i] * gamma[i];
    for (let i = 0; i < n; i++) cc = cc + c[i] * c[i];
    for (let i = 0; i < n; i++) gg = gg + gamma[i] * gamma[i];
    const scale = Math.sqrt(cc * gg);
    // CΓ ≈ C·A^{r−1}B·T^r/r! for a continuous relative degree r: small at high rates but
    // nonzero (a sampled system has discrete relative degree one), and the zero dynamics
    // below stay well scaled. Only an exact zero (or a value at rounding level of the
    // products) falls back to the numerator's roots.
    for (let i = 0; i < n; i++) bound = bound + Math.abs(c[i] * gamma[i]);
    bound = bound * 64 * Number.EPSILON;
    if (!(Math.abs(cg) > bound) || !(scale > 0)) return null;
    // C·Φ
    const cphi = new Array<number>(n);
    for (let j = 0; j < n; j++) {
      let acc = 0;
      for (let k = 0; k < n; k++) acc = acc + c[k] * phi[k * n + j];
      cphi[j] = acc;
    }
    for (let i = 0; i < n; i++) {
      const row: number[] = new Array(n);
      for (let j = 0; j < n; j++) row[j] = phiMinusI[i * n + j] - (gamma[i] * cphi[j]) / cg;
      m.push(row);
    }
    dropOne = true;
  }
  const w = eigenvalues(m);
  if (dropOne) {
    let best = 0;
    for (let i = 0; i < w.length; i++) if (hypot(w[i].re + 1, w[i].im) < hypot(w[best].re + 1, w[best].im)) best = i;
    w.splice(best, 1);
  }
  return w.map((v) => cx(1 + v.re, v.im));
}

/**
 * The zero nearest z = 1, when it is real and isolated, from the exact DC constraint instead
 * of the eigenvalue: step invariance gives N(1) = K·Π(1 − zᵢ) = H(0)·Π(1 − e^{pⱼT}), so with
 * wᵢ = zᵢ − 1 and eⱼ = expm1(pⱼT): Π(−wᵢ) = H(0)·Π(−eⱼ)/K, all factors in product form.
 * An eigenvalue far below the norm of its matrix carries an absolute error (ε·‖Φ − I‖), which
 * can be most of a w ~ 1e-13 (slow zeros with a direct feedthrough); the quotient of the
 * constraint by the other, larger zeros has their relative accuracy. (The same step as taking
 * the small root of a quadratic as c/(a·x_large).) `dc`: H(0) as zohDcGain gives it (left alone
 * where it is 0 or infinite: a root at s = 0); `contPoles`: the continuous poles pⱼ; `lead`: K.
 */
function refineSmallestZero(zeros: Complex[], dc: number | null, contPoles: Complex[], T: number, lead: number): void {
  if (zeros.length === 0 || dc === null || dc === 0 || !(lead !== 0) || !Number.isFinite(lead)) return;
  const w = zeros.map((z) => cx(z.re - 1, z.im));
  let k = 0;
  w.forEach((v, i) => {
    if (abs(v) < abs(w[k])) k = i;
  });
  if (w[k].im !== 0) return;
  const next = Math.min(...w.filter((_, i) => i !== k).map(abs));
  if (!(abs(w[k]) <= 1e-2 * next)) return;
  // P = H(0)·Π(−eⱼ)/K / Π_{i≠k}(−wᵢ), accumulated as a complex product (pairs give a real result)
  let acc = cx(dc / lead);
  for (const p of contPoles) acc = mul(acc, scale(expm1(scale(p, T)), -1));
  for (let i = 0; i < w.length; i++) if (i !== k) acc = div(acc, scale(w[i], -1));
  const wk = -acc.re;
  if (!Number.isFinite(wk) || !(Math.abs(wk - w[k].re) <= 0.5 * Math.abs(w[k].re))) return;
  zeros[k] = cx(1 + wk);
}

/** T and the bilinear constant for a method of the Tustin family. */
function bilinearConstant(method: 'tustin' | 'prewarp', T: number, w0?: number): number {
  if (method === 'tustin') return 2 / T;
  if (w0 === undefined || !(w0 > 0) || !(w0 * T < Math.PI)) {
    throw new DspInputError('prewarp needs a prewarp frequency in (0, fs/2)', [
      { path: 'prewarpHz', message: 'give prewarpHz in (0, fs/2)' },
    ]);
  }
  return w0 / Math.tan((w0 * T) / 2);
}

/**
 * Discretizes a continuous zpk (s in rad/s) at `sampleRateHz` by `method`.
 * Returns zpk in z (zeros at z = ∞ omitted) and the difference-equation tf
 * (num/den of z⁰ … z⁻ⁿ, equal lengths n + 1, leading zeros kept), and H(z = 1) from the
 * structure (DiscreteResult.dcGain). Throws DspInputError when a needed ω₀ is missing.
 */
export function discretizeZpk(
  cont: Zpk,
  method: MethodName,
  sampleRateHz: number,
  opts: DiscretizeOptions = {},
): DiscreteResult {
  const T = 1 / sampleRateHz;
  switch (method) {
    case 'tustin':
    case 'prewarp': {
      const c = bilinearConstant(method, T, opts.prewarpRadPerSec);
      const zpk = bilinearZpk(cont, c);
      return { zpk, tf: zpkToDiscreteTf(zpk), dcGain: bilinearDcGain(cont, c, zpk.gain) };
    }
    case 'backward-euler': {
      const zpk = backwardEulerZpk(cont, T);
      return { zpk, tf: zpkToDiscreteTf(zpk), dcGain: backwardEulerDcGain(cont, T, zpk.gain) };
    }
    case 'matched': {
      const zpk = matchedZpk(cont, T, opts.prewarpRadPerSec);
      return { zpk, tf: zpkToDiscreteTf(zpk), dcGain: matchedDcGain(cont, T, zpk.gain) };
    }
    case 'zoh':
      return zohDiscretize(cont, T);
    default: {
      const never: never = method;
      throw new Error(`unknown method ${String(never)}`);
    }
  }
}

