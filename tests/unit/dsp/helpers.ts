import type { Complex } from '../../../server/dsp/types';

/** max |a − b| / max(|b|): the relative-to-largest-coefficient error of the acceptance bar. */
export function relToLargest(a: readonly number[], b: readonly number[]): number {
  if (a.length !== b.length) return Infinity;
  const scale = Math.max(...b.map(Math.abs));
  return Math.max(...a.map((v, i) => Math.abs(v - b[i]))) / scale;
}

export const c = (re: number, im = 0): Complex => ({ re, im });

/** Sorts complex values by (re, im) for order-free comparison. */
export const sortC = (xs: Complex[]) => [...xs].sort((a, b) => a.re - b.re || a.im - b.im);

export function expectComplexClose(a: Complex, b: Complex, tol: number) {
  expect(Math.hypot(a.re - b.re, a.im - b.im)).toBeLessThanOrEqual(tol * Math.max(1, Math.hypot(b.re, b.im)));
}
