import { hypot } from './complex';
import type { Complex } from './types';

/**
 * Small dense real matrices as row-major number[][] (sizes ≤ ~25 here).
 * `expm` is written out rather than taken from mathjs because mathjs 15's expm costs
 * ~0.7 ms on an 11×11 matrix and the whole compute request must stay under 2 ms.
 */
export type Mat = number[][];

export function zeros(r: number, c: number): Mat {
  const m: Mat = [];
  for (let i = 0; i < r; i++) {
    const row: number[] = [];
    for (let j = 0; j < c; j++) row.push(0);
    m.push(row);
  }
  return m;
}
export const identity = (n: number): Mat => {
  const m = zeros(n, n);
  for (let i = 0; i < n; i++) m[i][i] = 1;
  return m;
};

export function matMul(a: Mat, b: Mat): Mat {
  const n = a.length;
  const k = b.length;
  const m = b[0]?.length ?? 0;
  const out = zeros(n, m);
  for (let i = 0; i < n; i++) {
    const ai = a[i];
    const oi = out[i];
    for (let p = 0; p < k; p++) {
      const v = ai[p];
      if (v === 0) continue;
      const bp = b[p];
      for (let j = 0; j < m; j++) oi[j] += v * bp[j];
    }
  }
  return out;
}

/** Σ cᵢ·Mᵢ (+ c0·I when `eyeCoef` is given). */
function lincomb(terms: Array<[number, Mat]>, n: number, eyeCoef = 0): Mat {
  const out = zeros(n, n);
  for (const [c, m] of terms) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i][j] += c * m[i][j];
  for (let i = 0; i < n; i++) out[i][i] += eyeCoef;
  return out;
}

/** Solves A X = B (A square) by Gaussian elimination with partial pivoting. */
export function solve(aIn: Mat, bIn: Mat): Mat {
  const n = aIn.length;
  const a = aIn.map((r) => r.slice());
  const b = bIn.map((r) => r.slice());
  const m = b[0].length;
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let i = col + 1; i < n; i++) if (Math.abs(a[i][col]) > Math.abs(a[piv][col])) piv = i;
    [a[col], a[piv]] = [a[piv], a[col]];
    [b[col], b[piv]] = [b[piv], b[col]];
    const d = a[col][col];
    if (d === 0) throw new Error('singular matrix');
    for (let i = col + 1; i < n; i++) {
      const f = a[i][col] / d;
      if (f === 0) continue;
      for (let j = col; j < n; j++) a[i][j] -= f * a[col][j];
      for (let j = 0; j < m; j++) b[i][j] -= f * b[col][j];
    }
  }
  for (let col = n - 1; col >= 0; col--) {
    for (let j = 0; j < m; j++) {
      let s = b[col][j];
      for (let k = col + 1; k < n; k++) s -= a[col][k] * b[k][j];
      b[col][j] = s / a[col][col];
    }
  }
  return b;
}

function norm1(a: Mat): number {
  let best = 0;
  for (let j = 0; j < a.length; j++) {
    let s = 0;
    for (let i = 0; i < a.length; i++) s += Math.abs(a[i][j]);
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

/** Matrix exponential e^A by Padé(13) with scaling and squaring (Higham 2005). */
export function expm(aIn: Mat): Mat {
  const n = aIn.length;
  const nrm = norm1(aIn);
  if (!Number.isFinite(nrm)) throw new RangeError('expm of a non-finite matrix');
  const s = nrm > THETA13 ? Math.max(0, Math.ceil(Math.log2(nrm / THETA13))) : 0;
  const f = Math.pow(2, -s);
  const a = aIn.map((r) => r.map((v) => v * f));
  const a2 = matMul(a, a);
  const a4 = matMul(a2, a2);
  const a6 = matMul(a4, a2);
  const b = B13;
  const u1 = matMul(a6, lincomb([[b[13], a6], [b[11], a4], [b[9], a2]], n));
  const u = matMul(a, lincomb([[1, u1], [b[7], a6], [b[5], a4], [b[3], a2]], n, b[1]));
  const v1 = matMul(a6, lincomb([[b[12], a6], [b[10], a4], [b[8], a2]], n));
  const v = lincomb([[1, v1], [b[6], a6], [b[4], a4], [b[2], a2]], n, b[0]);
  let r = solve(lincomb([[1, v], [-1, u]], n), lincomb([[1, v], [1, u]], n));
  for (let k = 0; k < s; k++) r = matMul(r, r);
  return r;
}

/** Determinant of a small complex matrix (rows of {re, im}) by LU with partial pivoting. */
export function complexDet(mIn: Complex[][]): Complex {
  const n = mIn.length;
  const re = mIn.map((r) => r.map((c) => c.re));
  const im = mIn.map((r) => r.map((c) => c.im));
  let dRe = 1;
  let dIm = 0;
  for (let col = 0; col < n; col++) {
    let piv = col;
    let best = hypot(re[col][col], im[col][col]);
    for (let i = col + 1; i < n; i++) {
      const v = hypot(re[i][col], im[i][col]);
      if (v > best) {
        best = v;
        piv = i;
      }
    }
    if (best === 0) return { re: 0, im: 0 };
    if (piv !== col) {
      [re[col], re[piv]] = [re[piv], re[col]];
      [im[col], im[piv]] = [im[piv], im[col]];
      dRe = -dRe;
      dIm = -dIm;
    }
    const pr = re[col][col];
    const pi = im[col][col];
    const t = dRe * pr - dIm * pi;
    dIm = dRe * pi + dIm * pr;
    dRe = t;
    const den = pr * pr + pi * pi;
    for (let i = col + 1; i < n; i++) {
      // f = m[i][col] / pivot
      const ar = re[i][col];
      const ai = im[i][col];
      if (ar === 0 && ai === 0) continue;
      const fr = (ar * pr + ai * pi) / den;
      const fi = (ai * pr - ar * pi) / den;
      for (let j = col; j < n; j++) {
        const br = re[col][j];
        const bi = im[col][j];
        re[i][j] -= fr * br - fi * bi;
        im[i][j] -= fr * bi + fi * br;
      }
    }
  }
  return { re: dRe, im: dIm };
}
