import { add, cx as complexOf, hypot as complexHypot, mul, sub } from './complex';
import { eigenvaluesInto } from './eigen';
import type { Complex } from './types';

// bound once: a module-local name is called directly (an imported binding is read
// through the module's export object on every call)
const hypot = complexHypot;
const cx = complexOf;

/**
 * Real polynomials as coefficient arrays in DESCENDING powers of the variable
 * (scipy's order): [1, 5, 6] is x² + 5x + 6. Roots are {re, im}.
 */

/** Drops leading (highest-power) zeros; keeps at least one coefficient. */
export function trimLeading(p: readonly number[]): number[] {
  let i = 0;
  while (i < p.length - 1 && p[i] === 0) i++;
  return p.slice(i);
}

/** Product of two descending polynomials. Example: polyMul([1, 1], [1, -1]) = [1, 0, -1]. */
export function polyMul(a: readonly number[], b: readonly number[]): number[] {
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
}

/** Sum of two descending polynomials, aligned at the constant term. */
export function polyAdd(a: readonly number[], b: readonly number[]): number[] {
  const n = Math.max(a.length, b.length);
  const out = new Array<number>(n).fill(0);
  for (let i = 0; i < a.length; i++) out[n - a.length + i] += a[i];
  for (let i = 0; i < b.length; i++) out[n - b.length + i] += b[i];
  return out;
}

/** Horner evaluation at a complex point (absPolyval repeats it on scalars for the Newton polish). */
export function polyval(p: readonly number[], x: Complex): Complex {
  let re = 0;
  let im = 0;
  for (const c of p) {
    const r = re * x.re - im * x.im + c;
    im = re * x.im + im * x.re;
    re = r;
  }
  return { re, im };
}

/**
 * Splits roots into real ones and complex pairs (each pair given by its member with
 * im > 0). Conjugates are matched by nearest partner; an unmatched complex root is
 * returned in `unpaired`.
 */
export function splitRoots(roots: readonly Complex[]): { real: number[]; pairs: Complex[]; unpaired: Complex[] } {
  const real: number[] = [];
  const upper: Complex[] = [];
  const lower: Complex[] = [];
  for (let i = 0; i < roots.length; i++) {
    const r = roots[i];
    if (r.im === 0) real.push(r.re);
    else if (r.im > 0) upper.push(r);
    else lower.push(r);
  }
  const pairs: Complex[] = [];
  const unpaired: Complex[] = [];
  const used = new Array<boolean>(lower.length).fill(false);
  for (let i = 0; i < upper.length; i++) {
    const u = upper[i];
    let best = -1;
    let bestD = Infinity;
    for (let j = 0; j < lower.length; j++) {
      if (used[j]) continue;
      const d = hypot(lower[j].re - u.re, lower[j].im + u.im);
      if (d < bestD) {
        bestD = d;
        best = j;
      }
    }
    if (best < 0 || bestD > 1e-6 * Math.max(1, hypot(u.re, u.im))) unpaired.push(u);
    else {
      used[best] = true;
      const l = lower[best];
      pairs.push({ re: (u.re + l.re) / 2, im: (u.im - l.im) / 2 });
    }
  }
  for (let j = 0; j < lower.length; j++) if (!used[j]) unpaired.push(lower[j]);
  return { real, pairs, unpaired };
}

/**
 * Monic real polynomial with the given roots, descending. Conjugate pairs are multiplied
 * as real quadratics x² − 2·Re(r)·x + |r|², so the result is exactly real.
 * Example: polyFromRoots([{re: -2, im: 0}, {re: -3, im: 0}]) = [1, 5, 6].
 */
export function polyFromRoots(roots: readonly Complex[]): number[] {
  const { real, pairs, unpaired } = splitRoots(roots);
  let p = [1];
  for (const r of real) p = polyMul(p, [1, -r]);
  for (const r of pairs) p = polyMul(p, [1, -2 * r.re, r.re * r.re + r.im * r.im]);
  if (unpaired.length > 0) {
    // Not a real polynomial; multiply in complex arithmetic and keep the real part.
    let c: Complex[] = [cx(1)];
    for (const r of unpaired) {
      const next: Complex[] = new Array(c.length + 1).fill(null).map(() => cx(0));
      c.forEach((v, i) => {
        next[i] = add(next[i], v);
        next[i + 1] = sub(next[i + 1], mul(v, r));
      });
      c = next;
    }
    p = polyMul(p, c.map((v) => v.re));
  }
  return p;
}

/**
 * Roots of a real polynomial (descending coefficients) as the eigenvalues of its
 * companion matrix (Hessenberg–QR, ./eigen: ml-matrix's eigenvalues without its eigenvectors), after scaling the
 * variable and balancing the matrix, then polished by Newton's method where a root is
 * well separated (clustered roots are left as the eigenvalue solver found them: their
 * symmetric functions, hence the coefficients they expand to, are then accurate).
 * Zero roots from trailing zero coefficients are exact. Leading zeros are ignored.
 * Example: polyRoots([1, 0, -1]) → [1, −1] (in some order).
 */
export function polyRoots(pIn: readonly number[]): Complex[] {
  let p = trimLeading(pIn);
  const zeroRoots: Complex[] = [];
  while (p.length > 1 && p[p.length - 1] === 0) {
    p = p.slice(0, -1);
    zeroRoots.push(cx(0));
  }
  const n = p.length - 1;
  if (n <= 0) return zeroRoots;
  if (n === 1) return [cx(-p[1] / p[0]), ...zeroRoots];
  if (n === 2) return [...quadraticRoots(p[0], p[1], p[2]), ...zeroRoots];
  // Scale x = σ·y with σ = |p_n/p_0|^(1/n) (geometric mean of |roots|) so the companion
  // matrix has entries of order one.
  // (in logarithms, so coefficients of very different sizes do not overflow)
  const logSigma = (Math.log(Math.abs(p[n])) - Math.log(Math.abs(p[0]))) / n;
  const sigma = Math.exp(logSigma);
  const lead = Math.log(Math.abs(p[0]));
  const q = new Array<number>(p.length);
  let finite = true;
  for (let i = 0; i < p.length; i++) {
    const c = p[i];
    q[i] = c === 0 ? 0 : Math.sign(c) * Math.sign(p[0]) * Math.exp(Math.log(Math.abs(c)) - lead - i * logSigma);
    if (!Number.isFinite(q[i])) finite = false;
  }
  if (!Number.isFinite(sigma) || sigma === 0 || !finite) {
    throw new RangeError('polynomial coefficients span too wide a range to factor');
  }
  // companion matrix (row-major): first row −q₁ … −qₙ, ones on the subdiagonal
  const m = new Array<number>(n * n).fill(0);
  for (let j = 0; j < n; j++) m[j] = -q[j + 1];
  for (let i = 1; i < n; i++) m[i * n + i - 1] = 1;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  eigenvaluesOf(m, n, re, im);
  for (let i = 0; i < n; i++) {
    re[i] = re[i] * sigma;
    im[i] = im[i] * sigma;
  }
  // Newton polish of the roots well separated from the others (separation measured
  // between the unpolished roots)
  const roots: Complex[] = new Array(n);
  for (let i = 0; i < n; i++) {
    let sep = Infinity;
    for (let j = 0; j < n; j++) if (j !== i) sep = Math.min(sep, hypot(re[j] - re[i], im[j] - im[i]));
    if (sep > 1e-3 * Math.max(hypot(re[i], im[i]), 1e-300)) {
      newtonPolish(p, re[i], im[i]);
      roots[i] = cx(polishedRe, polishedIm);
    } else roots[i] = cx(re[i], im[i]);
  }
  const out = enforceConjugates(roots);
  for (let i = 0; i < zeroRoots.length; i++) out.push(zeroRoots[i]);
  return out;
}

/** Eigenvalues of a small real matrix (balanced, then Hessenberg–QR), conjugates exact. */
export function eigenvalues(rows: number[][]): Complex[] {
  const n = rows.length;
  if (n === 0) return [];
  const m = new Array<number>(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m[i * n + j] = rows[i][j];
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  eigenvaluesOf(m, n, re, im);
  const out: Complex[] = new Array(n);
  for (let i = 0; i < n; i++) out[i] = cx(re[i], im[i]);
  return enforceConjugates(out);
}

/**
 * Eigenvalues of an n×n matrix, row-major m[i·n + j] (balanced in place first), into
 * re/im, by the Hessenberg–QR iteration of ./eigen (the eigenvalues ml-matrix's
 * EigenvalueDecomposition gives, bit for bit, without its eigenvector work).
 */
function eigenvaluesOf(m: number[], n: number, re: Float64Array, im: Float64Array): void {
  // The Hessenberg–QR iteration has no iteration cap: never hand it a non-finite entry.
  for (let i = 0; i < n * n; i++) if (!Number.isFinite(m[i])) throw new RangeError('non-finite matrix entry');
  balance(m, n);
  eigenvaluesInto(m, n, re, im);
}

/** Roots of a x² + b x + c without cancellation. */
function quadraticRoots(a: number, b: number, c: number): Complex[] {
  const disc = b * b - 4 * a * c;
  if (disc >= 0) {
    const s = Math.sqrt(disc);
    const q = -0.5 * (b + (b >= 0 ? s : -s));
    if (q === 0) return [cx(0), cx(0)];
    return [cx(q / a), cx(c / q)];
  }
  const re = -b / (2 * a);
  const im = Math.sqrt(-disc) / (2 * Math.abs(a));
  return [cx(re, im), cx(re, -im)];
}

// Result of newtonPolish (module scratch).
let polishedRe = 0;
let polishedIm = 0;

/**
 * Up to a few Newton steps from x0 = x0r + j·x0i on the descending polynomial p, kept only
 * while |p(x)| decreases; the root into polishedRe / polishedIm. (Complex arithmetic
 * written out on scalars: Horner for p and p′, Smith's division.)
 */
function newtonPolish(p: readonly number[], x0r: number, x0i: number): void {
  let xr = x0r;
  let xi = x0i;
  let fx = absPolyval(p, xr, xi);
  for (let k = 0; k < 4 && fx > 0; k++) {
    // value v and derivative d at x by Horner
    let vr = 0;
    let vi = 0;
    let dr = 0;
    let di = 0;
    for (let i = 0; i < p.length; i++) {
      const ndr = dr * xr - di * xi + vr;
      di = dr * xi + di * xr + vi;
      dr = ndr;
      const nvr = vr * xr - vi * xi + p[i];
      vi = vr * xi + vi * xr;
      vr = nvr;
    }
    if (hypot(dr, di) === 0) break;
    // step v/d by Smith's algorithm
    let sr: number;
    let si: number;
    if (Math.abs(dr) >= Math.abs(di)) {
      const r = di / dr;
      const den = dr + di * r;
      sr = (vr + vi * r) / den;
      si = (vi - vr * r) / den;
    } else {
      const r = dr / di;
      const den = dr * r + di;
      sr = (vr * r + vi) / den;
      si = (vi * r - vr) / den;
    }
    const nr = xr - sr;
    const ni = xi - si;
    const fn = absPolyval(p, nr, ni);
    if (!(fn < fx)) break;
    xr = nr;
    xi = ni;
    fx = fn;
  }
  polishedRe = xr;
  polishedIm = xi;
}

/**
 * |p(x)| at x = xr + j·xi by Horner: polyval's arithmetic in the same order, written out on
 * scalars (|polyval(p, x)| with its result object made polyRoots ~7–20 % slower in A/B
 * runs); keep the two in step.
 */
function absPolyval(p: readonly number[], xr: number, xi: number): number {
  let re = 0;
  let im = 0;
  for (let i = 0; i < p.length; i++) {
    const r = re * xr - im * xi + p[i];
    im = re * xi + im * xr;
    re = r;
  }
  return hypot(re, im);
}

/** Real roots stay real; a complex root and its partner become exact conjugates. */
function enforceConjugates(roots: Complex[]): Complex[] {
  const snapped: Complex[] = new Array(roots.length);
  for (let i = 0; i < roots.length; i++) {
    const r = roots[i];
    snapped[i] = Math.abs(r.im) <= 1e-14 * hypot(r.re, r.im) ? cx(r.re) : r;
  }
  const { real, pairs, unpaired } = splitRoots(snapped);
  const out: Complex[] = [];
  for (let i = 0; i < real.length; i++) out.push(cx(real[i]));
  for (let i = 0; i < pairs.length; i++) out.push(pairs[i], cx(pairs[i].re, -pairs[i].im));
  for (let i = 0; i < unpaired.length; i++) out.push(unpaired[i]);
  return out;
}

/** Parlett–Reinsch diagonal balancing by powers of two (EISPACK balanc; in place on row-major m, exact similarity). */
function balance(m: number[], n: number): void {
  let noconv = true;
  for (let iter = 0; iter < 30 && noconv; iter++) {
    noconv = false;
    for (let i = 0; i < n; i++) {
      let c = 0;
      let r = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        c += Math.abs(m[j * n + i]);
        r += Math.abs(m[i * n + j]);
      }
      if (c === 0 || r === 0) continue;
      const s = c + r;
      let f = 1;
      let g = r / 2;
      for (let k = 0; c < g && k < 1100; k++) {
        f *= 2;
        c *= 4;
      }
      g = r * 2;
      for (let k = 0; c >= g && k < 1100; k++) {
        f /= 2;
        c /= 4;
      }
      if (Number.isFinite(f) && f > 0 && (c + r) / f < 0.95 * s) {
        noconv = true;
        for (let j = 0; j < n; j++) m[i * n + j] /= f;
        for (let j = 0; j < n; j++) m[j * n + i] *= f;
      }
    }
  }
}
