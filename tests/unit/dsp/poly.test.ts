import { polyFromRoots, polyMul, polyRoots, polyval } from '../../../server/dsp/poly';
import { c, expectComplexClose, relToLargest, sortC } from './helpers';

describe('polynomials (descending coefficients)', () => {
  it('expands roots, conjugate pairs as exact real quadratics', () => {
    expect(polyFromRoots([c(-2), c(-3)])).toEqual([1, 5, 6]);
    // (x² + 2x + 5) for −1 ± 2j
    expect(polyFromRoots([c(-1, 2), c(-1, -2)])).toEqual([1, 2, 5]);
    expect(polyMul([1, 1], [1, -1])).toEqual([1, 0, -1]);
  });

  it('evaluates by Horner at complex points', () => {
    const v = polyval([1, 0, 1], c(0, 1)); // x² + 1 at j
    expect(v.re).toBeCloseTo(0, 15);
    expect(v.im).toBeCloseTo(0, 15);
  });

  it('finds simple roots to full precision (identity: roots of the expansion)', () => {
    const roots = [c(-1), c(-10), c(-3, 4), c(-3, -4), c(0.5)];
    const found = sortC(polyRoots(polyFromRoots(roots)));
    sortC(roots).forEach((r, i) => expectComplexClose(found[i], r, 1e-13));
  });

  it('finds x³ − 1 and x⁸ − 1 on the unit circle (where mathjs eigs fails, STACK.md)', () => {
    for (const n of [3, 8]) {
      const p = [1, ...new Array(n - 1).fill(0), -1];
      const roots = polyRoots(p);
      expect(roots).toHaveLength(n);
      for (const r of roots) expect(Math.abs(Math.hypot(r.re, r.im) - 1)).toBeLessThan(1e-14);
      // roots of unity: each is e^{2πik/n}
      const angles = roots.map((r) => Math.atan2(r.im, r.re)).map((a) => (a < -1e-12 ? a + 2 * Math.PI : a)).sort((a, b) => a - b);
      angles.forEach((a, k) => expect(Math.abs(a - (2 * Math.PI * k) / n)).toBeLessThan(1e-13));
    }
  });

  it('gives repeated roots whose expansion reproduces the polynomial (cluster at z = 1)', () => {
    // (z − 1)⁴: the roots are ill-conditioned by nature (error ~ eps^(1/4)), their
    // symmetric functions are not.
    const p = polyFromRoots([c(1), c(1), c(1), c(1)]);
    const roots = polyRoots(p);
    for (const r of roots) expect(Math.hypot(r.re - 1, r.im)).toBeLessThan(1e-3);
    expect(relToLargest(polyFromRoots(roots), p)).toBeLessThan(1e-13);
  });

  it('handles near-unit-circle pairs and a tight real cluster', () => {
    const th = 0.01;
    const roots = [c(0.9999 * Math.cos(th), 0.9999 * Math.sin(th)), c(0.9999 * Math.cos(th), -0.9999 * Math.sin(th)), c(0.99995), c(0.9999)];
    const p = polyFromRoots(roots);
    const found = polyRoots(p);
    // four roots within 1e-2 of z = 1: the eigenvalue solver's backward error shows as
    // ~1e-11 of the largest coefficient; well inside the 1e-9 acceptance bar.
    expect(relToLargest(polyFromRoots(found), p)).toBeLessThan(1e-10);
    for (const r of roots) {
      const nearest = Math.min(...found.map((f) => Math.hypot(f.re - r.re, f.im - r.im)));
      expect(nearest).toBeLessThan(1e-6);
    }
  });

  it('gives exact zero roots for trailing zeros and ignores leading zeros', () => {
    const roots = polyRoots([0, 0, 1, 3, 0, 0]);
    expect(sortC(roots)).toEqual([c(-3), c(0), c(0)]);
  });

  it('keeps complex roots in exact conjugate pairs', () => {
    const roots = polyRoots([1, 1, 1, 1, 1, 1]); // sixth roots of unity except 1
    for (const r of roots.filter((x) => x.im !== 0)) expect(roots.some((o) => o.re === r.re && o.im === -r.im)).toBe(true);
  });

  it('copes with widely scaled coefficients (roots 1e-3 … 1e4)', () => {
    const roots = [c(-1e-3), c(-0.5), c(-20, 30), c(-20, -30), c(-1e4)];
    const found = sortC(polyRoots(polyFromRoots(roots)));
    sortC(roots).forEach((r, i) => expect(Math.hypot(found[i].re - r.re, found[i].im - r.im) / Math.hypot(r.re, r.im)).toBeLessThan(1e-10));
  });
});
