import type { CompensatorInput, RootInput } from '../../schemas/compensator';
import { cx } from './complex';
import { polyFromRoots, polyRoots, trimLeading } from './poly';
import type { Complex, DiscreteTf, Zpk } from './types';

/** A schema root (number or {re, im}) as a Complex. */
export const rootToComplex = (r: RootInput): Complex => (typeof r === 'number' ? cx(r) : cx(r.re, r.im));

/**
 * The compensator as entered → zpk in s (rad/s). tf polynomials (descending powers of s)
 * are factored by `polyRoots`; K is the ratio of the leading coefficients.
 * Example: {form: "tf", num: [2, 6], den: [1, 5, 0]} → zeros [−3], poles [0, −5], gain 2.
 */
export function inputToZpk(c: CompensatorInput): Zpk {
  if (c.form === 'zpk') return { zeros: c.zeros.map(rootToComplex), poles: c.poles.map(rootToComplex), gain: c.gain };
  const num = trimLeading(c.num);
  return { zeros: polyRoots(num), poles: polyRoots(c.den), gain: num[0] / c.den[0] };
}

/** zpk → polynomials in descending powers (den monic). Example: 25(s+3)/(s+18) → [25, 75] / [1, 18]. */
export function zpkToTfDescending(zpk: Zpk): { num: number[]; den: number[] } {
  return { num: polyFromRoots(zpk.zeros).map((v) => v * zpk.gain), den: polyFromRoots(zpk.poles) };
}

/**
 * Discrete zpk → difference-equation form (DESIGN.md): num = [b0 … bn], den = [1, a1 … an],
 * equal lengths n + 1 with n = number of poles, leading zeros kept.
 * Example: 0.5(z − 0.2)/((z − 0.9)(z − 0.1)) → num [0, 0.5, −0.1], den [1, −1, 0.09].
 */
export function zpkToDiscreteTf(zpk: Zpk): DiscreteTf {
  const den = polyFromRoots(zpk.poles);
  const numShort = polyFromRoots(zpk.zeros).map((v) => v * zpk.gain);
  const num = new Array<number>(den.length - numShort.length).fill(0).concat(numShort);
  return { num, den };
}

/** K·Π(x − zᵢ)/Π(x − pᵢ) at a complex point, in product form. */
export function evalZpk(zpk: Zpk, x: Complex): Complex {
  // complex.ts mul and div (Smith's algorithm) written out on scalars
  let vr = zpk.gain;
  let vi = 0;
  for (let i = 0; i < zpk.zeros.length; i++) {
    const dr = x.re - zpk.zeros[i].re;
    const di = x.im - zpk.zeros[i].im;
    const t = vr * dr - vi * di;
    vi = vr * di + vi * dr;
    vr = t;
  }
  for (let i = 0; i < zpk.poles.length; i++) {
    const dr = x.re - zpk.poles[i].re;
    const di = x.im - zpk.poles[i].im;
    if (Math.abs(dr) >= Math.abs(di)) {
      const r = di / dr;
      const d = dr + di * r;
      const t = (vr + vi * r) / d;
      vi = (vi - vr * r) / d;
      vr = t;
    } else {
      const r = dr / di;
      const d = dr * r + di;
      const t = (vr * r + vi) / d;
      vi = (vi * r - vr) / d;
      vr = t;
    }
  }
  return { re: vr, im: vi };
}

/** Series connection of two zpk values (roots concatenated, gains multiplied). */
export const zpkSeries = (a: Zpk, b: Zpk): Zpk => ({ zeros: [...a.zeros, ...b.zeros], poles: [...a.poles, ...b.poles], gain: a.gain * b.gain });

