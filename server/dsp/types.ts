/**
 * Shared numeric types of the computation core.
 *
 * Conventions (see DESIGN.md):
 * - s-domain roots and corner frequencies in rad/s; sample rate in Hz; T = 1/fs.
 * - A zpk value is K · Π(x − zᵢ) / Π(x − pᵢ), x = s or z. A lead K(s + 3)/(s + 18) is
 *   { zeros: [{re: -3, im: 0}], poles: [{re: -18, im: 0}], gain: K }.
 * - Discrete transfer functions in difference-equation form: num = [b0 … bn],
 *   den = [1, a1 … an], coefficients of z⁰, z⁻¹, … z⁻ⁿ, equal lengths n + 1.
 *   Example: y[k] = b0 u[k] + b1 u[k−1] − a1 y[k−1]  ⇔  num = [b0, b1], den = [1, a1].
 */
export interface Complex {
  re: number;
  im: number;
}

/** Roots and root-locus gain (ratio of leading coefficients), in s or in z. */
export interface Zpk {
  zeros: Complex[];
  poles: Complex[];
  gain: number;
}

/** Difference-equation form: ascending powers of z⁻¹, den[0] = 1, equal lengths. */
export interface DiscreteTf {
  num: number[];
  den: number[];
}

import { METHOD_NAMES } from '../../schemas/discretize';

/** The five methods, in display order (defined once, in the shared schema). */
export { METHOD_NAMES };
export type MethodName = (typeof METHOD_NAMES)[number];
