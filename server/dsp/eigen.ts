import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/**
 * Eigenvalues of a small real square matrix, without eigenvectors.
 *
 * ml-matrix's EigenvalueDecomposition (the EISPACK orthes/hqr2 pair in its JAMA form)
 * also accumulates the eigenvectors and back-substitutes for them, which is most of its
 * cost on the 2×2 … 12×12 matrices of this engine, and it allocates Matrix objects on
 * every call. `eigenvaluesInto` performs the same Householder reduction to Hessenberg form
 * and the same shifted double-step QR iteration, operation for operation and over the same
 * index ranges, on a flat row-major copy, and leaves out only the arithmetic that writes
 * the eigenvector matrix V (which never feeds back into H). The eigenvalues are therefore
 * bit for bit those of ml-matrix 6.x, in the same order. A symmetric input takes ml-matrix's
 * symmetric path (tridiagonal QL), as ml-matrix itself would, by calling it.
 *
 * Like hqr2, the iteration has no iteration cap: callers must not pass non-finite entries.
 */

/** Scratch: the Hessenberg matrix (row-major, n·n) and the Householder vector. */
let scratchH = new Float64Array(144);
let scratchOrt = new Float64Array(12);

/**
 * Eigenvalues of the n×n matrix `a` (row-major, a[i·n + j]) into re[0 … n−1] and
 * im[0 … n−1] (complex pairs as (re, +im), (re, −im) in consecutive slots). `a` is not
 * modified.
 */
export function eigenvaluesInto(a: ArrayLike<number>, n: number, re: Float64Array, im: Float64Array): void {
  if (isSymmetric(a, n)) {
    symmetricEigenvalues(a, n, re, im);
    return;
  }
  if (scratchH.length < n * n) {
    scratchH = new Float64Array(n * n);
    scratchOrt = new Float64Array(n);
  }
  const H = scratchH;
  for (let i = 0; i < n * n; i++) H[i] = a[i];
  const ort = scratchOrt;
  ort.fill(0, 0, n);
  reduceToHessenberg(n, H, ort);
  hessenbergQr(n, H, re, im);
}

function isSymmetric(a: ArrayLike<number>, n: number): boolean {
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) if (a[i * n + j] !== a[j * n + i]) return false;
  return true;
}

/** The symmetric case, rare here (a diagonal or symmetric zero-dynamics matrix): ml-matrix's own path. */
function symmetricEigenvalues(a: ArrayLike<number>, n: number, re: Float64Array, im: Float64Array): void {
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(Array.from({ length: n }, (_, j) => a[i * n + j]));
  const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: false });
  const d = evd.realEigenvalues;
  const e = evd.imaginaryEigenvalues;
  for (let i = 0; i < n; i++) {
    re[i] = d[i];
    im[i] = e[i];
  }
}

/** Householder reduction to upper Hessenberg form (EISPACK orthes; H in place, V not formed). */
function reduceToHessenberg(n: number, H: Float64Array, ort: Float64Array): void {
  const low = 0;
  const high = n - 1;
  for (let m = low + 1; m <= high - 1; m++) {
    let scale = 0;
    for (let i = m; i <= high; i++) scale = scale + Math.abs(H[i * n + m - 1]);
    if (scale !== 0) {
      let h = 0;
      for (let i = high; i >= m; i--) {
        ort[i] = H[i * n + m - 1] / scale;
        h += ort[i] * ort[i];
      }
      let g = Math.sqrt(h);
      if (ort[m] > 0) g = -g;
      h = h - ort[m] * g;
      ort[m] = ort[m] - g;
      for (let j = m; j < n; j++) {
        let f = 0;
        for (let i = high; i >= m; i--) f += ort[i] * H[i * n + j];
        f = f / h;
        for (let i = m; i <= high; i++) H[i * n + j] = H[i * n + j] - f * ort[i];
      }
      for (let i = 0; i <= high; i++) {
        let f = 0;
        for (let j = high; j >= m; j--) f += ort[j] * H[i * n + j];
        f = f / h;
        for (let j = m; j <= high; j++) H[i * n + j] = H[i * n + j] - f * ort[j];
      }
      ort[m] = scale * ort[m];
      H[m * n + m - 1] = scale * g;
    }
  }
}

/**
 * Shifted double-step QR iteration on an upper Hessenberg matrix (the eigenvalue part of
 * EISPACK hqr2): deflates one real eigenvalue or a 2×2 block at a time from the bottom.
 * d/e get the real and imaginary parts.
 */
function hessenbergQr(nn: number, H: Float64Array, d: Float64Array, e: Float64Array): void {
  const N = nn;
  let n = nn - 1;
  const low = 0;
  const high = nn - 1;
  const eps = Number.EPSILON;
  let exshift = 0;
  let norm = 0;
  let p = 0;
  let q = 0;
  let r = 0;
  let s = 0;
  let z = 0;
  let iter = 0;
  let l: number;
  let m: number;
  let w: number;
  let x = 0;
  let y: number;

  for (let i = 0; i < nn; i++) {
    if (i < low || i > high) {
      d[i] = H[i * N + i];
      e[i] = 0;
    }
    for (let j = Math.max(i - 1, 0); j < nn; j++) norm = norm + Math.abs(H[i * N + j]);
  }

  while (n >= low) {
    // look for a single small subdiagonal element
    l = n;
    while (l > low) {
      s = Math.abs(H[(l - 1) * N + l - 1]) + Math.abs(H[l * N + l]);
      if (s === 0) s = norm;
      if (Math.abs(H[l * N + l - 1]) < eps * s) break;
      l--;
    }

    if (l === n) {
      // one root found
      H[n * N + n] = H[n * N + n] + exshift;
      d[n] = H[n * N + n];
      e[n] = 0;
      n--;
      iter = 0;
    } else if (l === n - 1) {
      // two roots found
      w = H[n * N + n - 1] * H[(n - 1) * N + n];
      p = (H[(n - 1) * N + n - 1] - H[n * N + n]) / 2;
      q = p * p + w;
      z = Math.sqrt(Math.abs(q));
      H[n * N + n] = H[n * N + n] + exshift;
      H[(n - 1) * N + n - 1] = H[(n - 1) * N + n - 1] + exshift;
      x = H[n * N + n];
      if (q >= 0) {
        // real pair
        z = p >= 0 ? p + z : p - z;
        d[n - 1] = x + z;
        d[n] = d[n - 1];
        if (z !== 0) d[n] = x - w / z;
        e[n - 1] = 0;
        e[n] = 0;
        x = H[n * N + n - 1];
        s = Math.abs(x) + Math.abs(z);
        p = x / s;
        q = z / s;
        r = Math.sqrt(p * p + q * q);
        p = p / r;
        q = q / r;
        // row and column rotation (they change H outside the deflated block, which later
        // windows may read)
        for (let j = n - 1; j < nn; j++) {
          z = H[(n - 1) * N + j];
          H[(n - 1) * N + j] = q * z + p * H[n * N + j];
          H[n * N + j] = q * H[n * N + j] - p * z;
        }
        for (let i = 0; i <= n; i++) {
          z = H[i * N + n - 1];
          H[i * N + n - 1] = q * z + p * H[i * N + n];
          H[i * N + n] = q * H[i * N + n] - p * z;
        }
      } else {
        // complex pair
        d[n - 1] = x + p;
        d[n] = x + p;
        e[n - 1] = z;
        e[n] = -z;
      }
      n = n - 2;
      iter = 0;
    } else {
      // no convergence yet: form the shift
      x = H[n * N + n];
      y = 0;
      w = 0;
      if (l < n) {
        y = H[(n - 1) * N + n - 1];
        w = H[n * N + n - 1] * H[(n - 1) * N + n];
      }
      // Wilkinson's original ad hoc shift
      if (iter === 10) {
        exshift += x;
        for (let i = low; i <= n; i++) H[i * N + i] = H[i * N + i] - x;
        s = Math.abs(H[n * N + n - 1]) + Math.abs(H[(n - 1) * N + n - 2]);
        x = y = 0.75 * s; // eslint-disable-line no-multi-assign
        w = -0.4375 * s * s;
      }
      // MATLAB's ad hoc shift
      if (iter === 30) {
        s = (y - x) / 2;
        s = s * s + w;
        if (s > 0) {
          s = Math.sqrt(s);
          if (y < x) s = -s;
          s = x - w / ((y - x) / 2 + s);
          for (let i = low; i <= n; i++) H[i * N + i] = H[i * N + i] - s;
          exshift += s;
          x = y = w = 0.964; // eslint-disable-line no-multi-assign
        }
      }
      iter = iter + 1;

      // look for two consecutive small subdiagonal elements
      m = n - 2;
      while (m >= l) {
        z = H[m * N + m];
        r = x - z;
        s = y - z;
        p = (r * s - w) / H[(m + 1) * N + m] + H[m * N + m + 1];
        q = H[(m + 1) * N + m + 1] - z - r - s;
        r = H[(m + 2) * N + m + 1];
        s = Math.abs(p) + Math.abs(q) + Math.abs(r);
        p = p / s;
        q = q / s;
        r = r / s;
        if (m === l) break;
        if (
          Math.abs(H[m * N + m - 1]) * (Math.abs(q) + Math.abs(r)) <
          eps * (Math.abs(p) * (Math.abs(H[(m - 1) * N + m - 1]) + Math.abs(z) + Math.abs(H[(m + 1) * N + m + 1])))
        ) {
          break;
        }
        m--;
      }

      for (let i = m + 2; i <= n; i++) {
        H[i * N + i - 2] = 0;
        if (i > m + 2) H[i * N + i - 3] = 0;
      }

      // double QR step on rows l … n and columns m … n
      for (let k = m; k <= n - 1; k++) {
        const notlast = k !== n - 1;
        if (k !== m) {
          p = H[k * N + k - 1];
          q = H[(k + 1) * N + k - 1];
          r = notlast ? H[(k + 2) * N + k - 1] : 0;
          x = Math.abs(p) + Math.abs(q) + Math.abs(r);
          if (x !== 0) {
            p = p / x;
            q = q / x;
            r = r / x;
          }
        }
        if (x === 0) break;
        s = Math.sqrt(p * p + q * q + r * r);
        if (p < 0) s = -s;
        if (s !== 0) {
          if (k !== m) H[k * N + k - 1] = -s * x;
          else if (l !== m) H[k * N + k - 1] = -H[k * N + k - 1];
          p = p + s;
          x = p / s;
          y = q / s;
          z = r / s;
          q = q / p;
          r = r / p;
          // row modification
          for (let j = k; j < nn; j++) {
            p = H[k * N + j] + q * H[(k + 1) * N + j];
            if (notlast) {
              p = p + r * H[(k + 2) * N + j];
              H[(k + 2) * N + j] = H[(k + 2) * N + j] - p * z;
            }
            H[k * N + j] = H[k * N + j] - p * x;
            H[(k + 1) * N + j] = H[(k + 1) * N + j] - p * y;
          }
          // column modification
          for (let i = 0; i <= Math.min(n, k + 3); i++) {
            p = x * H[i * N + k] + y * H[i * N + k + 1];
            if (notlast) {
              p = p + z * H[i * N + k + 2];
              H[i * N + k + 2] = H[i * N + k + 2] - p * r;
            }
            H[i * N + k] = H[i * N + k] - p;
            H[i * N + k + 1] = H[i * N + k + 1] - p * q;
          }
        }
      }
    }
  }
}
