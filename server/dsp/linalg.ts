import { hypot as complexHypot } from './complex';
import type { Complex } from './types';

// bound once: a module-local name is called directly (an imported binding is read
// through the module's export object on every call)
const hypot = complexHypot;

/**
 * Small dense real matrices, square, stored flat in row-major order: entry (i, j) of an
 * n×n matrix is m[i·n + j] (sizes ≤ ~25 here). Every routine performs the operations of
 * the textbook loops in their order (so results do not depend on the storage).
 * `expm` is written out rather than taken from mathjs because mathjs 15's expm costs
 * ~0.7 ms on an 11×11 matrix and the whole compute request must stay under 2 ms.
 *
 * Its intermediate matrices live in module scratch buffers: a Float64Array of more than
 * 8 entries is allocated outside the JS heap and costs about a microsecond, more than
 * the arithmetic on these small matrices.
 */

/** A flat row-major square matrix (plain array for results, typed scratch inside expm). */
export type FlatMat = number[] | Float64Array;

/** Scratch buffers of expm, by slot; grown on demand, never shrunk. */
const pool: Float64Array[] = [];
function scratch(slot: number, size: number): Float64Array {
  let buf = pool[slot];
  if (!buf || buf.length < size) pool[slot] = buf = new Float64Array(Math.max(size, 64));
  return buf;
}

/** out = a·b (n×n; out distinct from a and b). Terms with a zero factor from a are skipped (they add nothing). */
export function matMulInto(out: Float64Array | number[], a: FlatMat, b: FlatMat, n: number): void {
  for (let k = 0; k < n * n; k++) out[k] = 0;
  for (let i = 0; i < n; i++) {
    const ai = i * n;
    for (let p = 0; p < n; p++) {
      const v = a[ai + p];
      if (v === 0) continue;
      const bp = p * n;
      for (let j = 0; j < n; j++) out[ai + j] += v * b[bp + j];
    }
  }
}

/** out = c1·M1 + c2·M2 + c3·M3 (+ c4·M4) + eyeCoef·I, summed term by term in that order from 0. */
function lincombInto(out: Float64Array, n: number, eyeCoef: number, c1: number, m1: Float64Array, c2: number, m2: Float64Array, c3: number, m3: Float64Array, c4 = 0, m4: Float64Array | null = null): void {
  const nn = n * n;
  for (let k = 0; k < nn; k++) out[k] = 0;
  for (let k = 0; k < nn; k++) out[k] += c1 * m1[k];
  for (let k = 0; k < nn; k++) out[k] += c2 * m2[k];
  for (let k = 0; k < nn; k++) out[k] += c3 * m3[k];
  if (m4) for (let k = 0; k < nn; k++) out[k] += c4 * m4[k];
  for (let i = 0; i < n; i++) out[i * n + i] += eyeCoef;
}

/** out = c1·M1 + c2·M2, summed from 0 in that order. */
function lincomb2Into(out: Float64Array, n: number, c1: number, m1: Float64Array, c2: number, m2: Float64Array): void {
  const nn = n * n;
  for (let k = 0; k < nn; k++) out[k] = 0;
  for (let k = 0; k < nn; k++) out[k] += c1 * m1[k];
  for (let k = 0; k < nn; k++) out[k] += c2 * m2[k];
}

/**
 * Solves A X = B (both n×n) by Gaussian elimination with partial pivoting, in place:
 * A is destroyed and B becomes X.
 */
function solveInPlace(a: Float64Array, b: Float64Array, n: number): void {
  const m = n;
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let i = col + 1; i < n; i++) if (Math.abs(a[i * n + col]) > Math.abs(a[piv * n + col])) piv = i;
    if (piv !== col) {
      swapRows(a, n, col, piv);
      swapRows(b, m, col, piv);
    }
    const d = a[col * n + col];
    if (d === 0) throw new Error('singular matrix');
    for (let i = col + 1; i < n; i++) {
      const f = a[i * n + col] / d;
      if (f === 0) continue;
      for (let j = col; j < n; j++) a[i * n + j] -= f * a[col * n + j];
      for (let j = 0; j < m; j++) b[i * m + j] -= f * b[col * m + j];
    }
  }
  for (let col = n - 1; col >= 0; col--) {
    for (let j = 0; j < m; j++) {
      let s = b[col * m + j];
      for (let k = col + 1; k < n; k++) s -= a[col * n + k] * b[k * m + j];
      b[col * m + j] = s / a[col * n + col];
    }
  }
}

function swapRows(m: Float64Array | number[], cols: number, r1: number, r2: number): void {
  for (let j = 0; j < cols; j++) {
    const t = m[r1 * cols + j];
    m[r1 * cols + j] = m[r2 * cols + j];
    m[r2 * cols + j] = t;
  }
}

/** 1-norm (largest absolute column sum). */
function norm1(a: FlatMat, n: number): number {
  let best = 0;
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Math.abs(a[i * n + j]);
    best = Math.max(best, s);
  }
  return best;
}

// Padé coefficients and θ13 of the scaling-and-squaring method, from N. J. Higham,
// "The scaling and squaring method for the matrix exponential revisited", SIAM J.
// Matrix Anal. Appl. 26 (2005), Table 2.3 / eq. (2.7) (the algorithm behind scipy's expm).
const B13 = [
  64764752532480000, 32382376266240000, 7771770303897600, 1187353796428800, 129060195264000, 10559470521600,
  670442572800, 33522128640, 1323241920, 40840800, 960960, 16380, 182, 1,
];
const THETA13 = 5.371920351148152;

/** Matrix exponential e^A of an n×n matrix by Padé(13) with scaling and squaring (Higham 2005); a new array. */
export function expm(aIn: FlatMat, n: number): number[] {
  const nn = n * n;
  const nrm = norm1(aIn, n);
  if (!Number.isFinite(nrm)) throw new RangeError('expm of a non-finite matrix');
  const s = nrm > THETA13 ? Math.max(0, Math.ceil(Math.log2(nrm / THETA13))) : 0;
  const f = Math.pow(2, -s);
  const a = scratch(0, nn);
  for (let k = 0; k < nn; k++) a[k] = aIn[k] * f;
  const a2 = scratch(1, nn);
  const a4 = scratch(2, nn);
  const a6 = scratch(3, nn);
  const t = scratch(4, nn);
  const u1 = scratch(5, nn);
  const u = scratch(6, nn);
  const v1 = scratch(7, nn);
  const v = scratch(8, nn);
  matMulInto(a2, a, a, n);
  matMulInto(a4, a2, a2, n);
  matMulInto(a6, a4, a2, n);
  const b = B13;
  lincombInto(t, n, 0, b[13], a6, b[11], a4, b[9], a2);
  matMulInto(u1, a6, t, n);
  lincombInto(t, n, b[1], 1, u1, b[7], a6, b[5], a4, b[3], a2);
  matMulInto(u, a, t, n);
  lincombInto(t, n, 0, b[12], a6, b[10], a4, b[8], a2);
  matMulInto(v1, a6, t, n);
  lincombInto(v, n, b[0], 1, v1, b[6], a6, b[4], a4, b[2], a2);
  // r = (V − U)⁻¹ (V + U), then squared s times
  const p = scratch(9, nn);
  let r = scratch(10, nn);
  lincomb2Into(p, n, 1, v, -1, u);
  lincomb2Into(r, n, 1, v, 1, u);
  solveInPlace(p, r, n);
  let spare = p;
  for (let k = 0; k < s; k++) {
    matMulInto(spare, r, r, n);
    const done = spare;
    spare = r;
    r = done;
  }
  const out = new Array<number>(nn);
  for (let k = 0; k < nn; k++) out[k] = r[k];
  return out;
}

/**
 * Determinant of a small complex n×n matrix, real and imaginary parts row-major in re/im
 * (both overwritten), by LU with partial pivoting.
 */
export function complexDet(re: number[], im: number[], n: number): Complex {
  let dRe = 1;
  let dIm = 0;
  for (let col = 0; col < n; col++) {
    let piv = col;
    let best = hypot(re[col * n + col], im[col * n + col]);
    for (let i = col + 1; i < n; i++) {
      const v = hypot(re[i * n + col], im[i * n + col]);
      if (v > best) {
        best = v;
        piv = i;
      }
    }
    if (best === 0) return { re: 0, im: 0 };
    if (piv !== col) {
      swapRows(re, n, col, piv);
      swapRows(im, n, col, piv);
      dRe = -dRe;
      dIm = -dIm;
    }
    const pr = re[col * n + col];
    const pi = im[col * n + col];
    const t = dRe * pr - dIm * pi;
    dIm = dRe * pi + dIm * pr;
    dRe = t;
    const den = pr * pr + pi * pi;
    for (let i = col + 1; i < n; i++) {
      // f = m[i][col] / pivot
      const ar = re[i * n + col];
      const ai = im[i * n + col];
      if (ar === 0 && ai === 0) continue;
      const fr = (ar * pr + ai * pi) / den;
      const fi = (ai * pr - ar * pi) / den;
      for (let j = col; j < n; j++) {
        const br = re[col * n + j];
        const bi = im[col * n + j];
        re[i * n + j] -= fr * br - fi * bi;
        im[i * n + j] -= fr * bi + fi * br;
      }
    }
  }
  return { re: dRe, im: dIm };
}
