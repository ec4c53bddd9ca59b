import { splitRoots } from './poly';
import { expm, matMulInto } from './linalg';
import type { Zpk } from './types';

/**
 * State-space realizations x' = A x + B u, y = C x + D u (single input, single output).
 * Built as a cascade of first- and second-order sections from the roots (never from
 * expanded polynomials), which keeps the matrices well conditioned at any rate.
 * A is n×n, flat row-major (entry (i, j) at a[i·n + j], as in ./linalg).
 */
export interface StateSpace {
  n: number;
  a: number[];
  b: number[];
  c: number[];
  d: number;
}

/** One section's (A, B, C, D): A as rows (1×1 or 2×2). */
interface SectionSs {
  a: number[][];
  b: number[];
  c: number[];
  d: number;
}

interface Section {
  /** poles: one real, two real, or a complex pair (given by its upper member) */
  kind: 'real1' | 'real2' | 'pair';
  p: number[]; // real poles (real1: [p]; real2: [p1, p2]); pair: [σ, ω]
  num: number[]; // numerator, descending, degree ≤ section order
}

function sections(zpk: Zpk): Section[] {
  const P = splitRoots(zpk.poles);
  const Z = splitRoots(zpk.zeros);
  if (P.unpaired.length || Z.unpaired.length) throw new Error('complex roots must come in conjugate pairs');
  const secs: Section[] = [];
  for (const r of P.pairs) secs.push({ kind: 'pair', p: [r.re, Math.abs(r.im)], num: [] });
  // Complex zero pairs need a second-order section; merge two real poles when short of pairs.
  let nextReal = 0;
  let pairSlots = secs.length;
  while (pairSlots < Z.pairs.length && P.real.length - nextReal >= 2) {
    secs.push({ kind: 'real2', p: [P.real[nextReal], P.real[nextReal + 1]], num: [] });
    nextReal += 2;
    pairSlots++;
  }
  for (; nextReal < P.real.length; nextReal++) secs.push({ kind: 'real1', p: [P.real[nextReal]], num: [] });
  // Numerators as factor lists, then expanded per section (degree ≤ 2): each zero pair to
  // the first second-order section with room, each real zero to the first section with room.
  const factors: number[][][] = [];
  const capacity: number[] = [];
  for (const s of secs) {
    factors.push([]);
    capacity.push(s.kind === 'real1' ? 1 : 2);
  }
  for (const zp of Z.pairs) {
    let k = 0;
    while (k < secs.length && !(secs[k].kind !== 'real1' && capacity[k] === 2)) k++;
    if (k === secs.length) k = -1;
    factors[k].push([1, -2 * zp.re, zp.re * zp.re + zp.im * zp.im]);
    capacity[k] = 0;
  }
  for (const z of Z.real) {
    let k = 0;
    while (k < capacity.length && !(capacity[k] > 0)) k++;
    if (k === capacity.length) k = -1;
    factors[k].push([1, -z]);
    capacity[k] -= 1;
  }
  for (let i = 0; i < secs.length; i++) {
    let num = [1];
    for (const f of factors[i]) num = mulPoly(num, f);
    secs[i].num = num;
  }
  return secs;
}

function mulPoly(a: number[], b: number[]): number[] {
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
}

function sectionSs(s: Section): SectionSs {
  if (s.kind === 'real1') {
    // (b1 s + b0)/(s − p) = b1 + (b0 + b1 p)/(s − p)
    const [b1, b0] = s.num.length === 2 ? s.num : [0, s.num[0]];
    const p = s.p[0];
    return { a: [[p]], b: [1], c: [b0 + b1 * p], d: b1 };
  }
  const num = s.num.length === 3 ? s.num : s.num.length === 2 ? [0, ...s.num] : [0, 0, s.num[0]];
  const b2 = num[0];
  if (s.kind === 'pair') {
    // modal form A = [[σ, ω], [−ω, σ]], B = [0, 1]: (sI − A)⁻¹B = [ω, s − σ]ᵀ / Δ
    const [sig, om] = s.p;
    const r1 = num[1] + 2 * sig * b2;
    const r0 = num[2] - (sig * sig + om * om) * b2;
    return { a: [[sig, om], [-om, sig]], b: [0, 1], c: [(r0 + r1 * sig) / om, r1], d: b2 };
  }
  // two real poles in series: x1 = u/(s − p1), x2 = x1/(s − p2)
  const [p1, p2] = s.p;
  const r1 = num[1] + (p1 + p2) * b2;
  const r0 = num[2] - p1 * p2 * b2;
  return { a: [[p1, 0], [1, p2]], b: [1, 0], c: [r1, r0 + r1 * p2], d: b2 };
}

/**
 * Cascade realization of K·Π(s − zᵢ)/Π(s − pᵢ) (proper). The gain sits on the last
 * section's output. Example: 25(s + 3)/(s + 18) → A = [[−18]], B = [1], C = [25·(−15)], D = 25.
 *
 * The sections are connected in series one after the other, u → first → second → y:
 * appending a section (a, b, c, d) to the cascade so far (A, B, C, D) gives
 * [[A, 0], [b·C, a]], [B; b·D], [C·d, c], D·d. The matrices are filled in place in that
 * order, so every entry is the same product as when each connection is formed anew.
 */
export function zpkToSs(zpk: Zpk): StateSpace {
  const secs = sections(zpk).map(sectionSs);
  let n = 0;
  for (const s of secs) n += s.b.length;
  const a = zeros(n * n);
  const b = zeros(n);
  const c = zeros(n);
  let d = 1;
  let off = 0;
  for (const s of secs) {
    const m = s.b.length;
    for (let i = 0; i < m; i++) {
      const row = (off + i) * n;
      for (let j = 0; j < off; j++) a[row + j] = s.b[i] * c[j];
      for (let j = 0; j < m; j++) a[row + off + j] = s.a[i][j];
      b[off + i] = s.b[i] * d;
    }
    for (let j = 0; j < off; j++) c[j] = c[j] * s.d;
    for (let i = 0; i < m; i++) c[off + i] = s.c[i];
    d = d * s.d;
    off += m;
  }
  for (let j = 0; j < n; j++) c[j] = c[j] * zpk.gain;
  return { n, a, b, c, d: d * zpk.gain };
}

/**
 * Zero-order-hold (step-invariant) discretization of a state-space model:
 * [[Φ, Γ, Ψ], [0, 1, 0], [0, 0, I]] = expm([[A, B, I], [0, 0, 0], [0, 0, 0]]·T)
 * (the augmented-matrix form used by scipy.signal.cont2discrete 'zoh', with the identity
 * block added to get Ψ = ∫₀ᵀ e^{Aτ} dτ). Returns Φ, Γ = ΨB and Φ − I = AΨ, the last
 * formed by a product, not a subtraction, so it keeps its digits when Φ ≈ I.
 * C and D are unchanged.
 */
export function zohSs(ss: StateSpace, periodSec: number): { phi: number[]; gamma: number[]; phiMinusI: number[] } {
  const n = ss.n;
  const size = 2 * n + 1;
  const m = zeros(size * size);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) m[i * size + j] = ss.a[i * n + j] * periodSec;
    m[i * size + n] = ss.b[i] * periodSec;
    m[i * size + n + 1 + i] = periodSec;
  }
  const e = expm(m, size);
  const phi = zeros(n * n);
  const gamma = zeros(n);
  const psi = zeros(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      phi[i * n + j] = e[i * size + j];
      psi[i * n + j] = e[i * size + n + 1 + j];
    }
    gamma[i] = e[i * size + n];
  }
  const phiMinusI = zeros(n * n);
  matMulInto(phiMinusI, ss.a, psi, n);
  return { phi, gamma, phiMinusI };
}

/** A plain array of k zeros (plain arrays: small typed arrays cost more to allocate). */
function zeros(k: number): number[] {
  return new Array<number>(k).fill(0);
}
