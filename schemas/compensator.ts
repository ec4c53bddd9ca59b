import { z } from 'zod';

/**
 * A continuous-time transfer function as entered: gain–zero–pole or polynomials.
 *
 * Conventions (DESIGN.md): roots in rad/s; zpk value = K · Π(s − zᵢ) / Π(s − pᵢ), so the
 * lead 25(s + 3)/(s + 18) is `{form: "zpk", zeros: [-3], poles: [-18], gain: 25}`;
 * `tf` polynomials in descending powers of s: (2s + 6)/(s² + 5s) is
 * `{form: "tf", num: [2, 6], den: [1, 5, 0]}`.
 *
 * Shared by the compute API, the saved-design spec and the client forms, so it imports
 * only zod. Checks here: finite numbers, conjugate pairing, properness, order ≤ 10,
 * nonzero gain and leading coefficient.
 */

/** Highest order accepted for a compensator or a plant (degree of the denominator). */
export const MAX_ORDER = 10;

/** Largest accepted |root| (rad/s) and the accepted range of nonzero gains and coefficients. */
export const MAX_ROOT_MAGNITUDE = 1e12;
export const MAX_COEFFICIENT_MAGNITUDE = 1e150;
export const MIN_COEFFICIENT_MAGNITUDE = 1e-150;

/** Two complex roots count as conjugates when they agree to this relative tolerance. */
const PAIR_TOLERANCE = 1e-9;

const finite = (what: string) => z.number({ error: `${what} must be a finite number` });
/** A root coordinate in rad/s, |x| ≤ 1e12. */
const rootPart = (what: string) =>
  finite(what).refine((v) => Math.abs(v) <= MAX_ROOT_MAGNITUDE, `${what} must lie within ±${MAX_ROOT_MAGNITUDE} rad/s`);
/** A gain or coefficient: 0 or 1e-150 ≤ |x| ≤ 1e150 (keeps every product inside double range). */
const coefficient = (what: string) =>
  finite(what).refine(
    (v) => v === 0 || (Math.abs(v) >= MIN_COEFFICIENT_MAGNITUDE && Math.abs(v) <= MAX_COEFFICIENT_MAGNITUDE),
    `${what} must be 0 or between ${MIN_COEFFICIENT_MAGNITUDE} and ${MAX_COEFFICIENT_MAGNITUDE} in magnitude`,
  );

export const complexSchema = z
  .strictObject({
    re: rootPart('re').describe('real part, rad/s for s-plane roots'),
    im: rootPart('im').describe('imaginary part, rad/s for s-plane roots'),
  })
  .describe('a complex number {re, im}');

/** A root: a real number, or {re, im}; complex roots must come with their conjugate. */
export const rootSchema = z
  .union([rootPart('a root').describe('a real root, rad/s'), complexSchema], {
    error: 'a root must be a finite number or {"re": number, "im": number}',
  })
  .describe('a real root as a number, or a complex root as {re, im} (rad/s)');
export type RootInput = z.infer<typeof rootSchema>;

export function rootRe(r: RootInput): number {
  return typeof r === 'number' ? r : r.re;
}
export function rootIm(r: RootInput): number {
  return typeof r === 'number' ? 0 : r.im;
}

/** Indices of complex roots in `roots` that have no conjugate partner. */
export function unpairedRootIndices(roots: readonly RootInput[]): number[] {
  const used = new Array<boolean>(roots.length).fill(false);
  const bad: number[] = [];
  for (let i = 0; i < roots.length; i++) {
    if (used[i] || rootIm(roots[i]) === 0) continue;
    const re = rootRe(roots[i]);
    const im = rootIm(roots[i]);
    const tol = PAIR_TOLERANCE * Math.max(1, Math.hypot(re, im));
    let partner = -1;
    for (let j = i + 1; j < roots.length; j++) {
      if (used[j]) continue;
      if (Math.abs(rootRe(roots[j]) - re) <= tol && Math.abs(rootIm(roots[j]) + im) <= tol) {
        partner = j;
        break;
      }
    }
    if (partner < 0) bad.push(i);
    else used[i] = used[partner] = true;
  }
  return bad;
}

const rootList = (what: string) =>
  z
    .array(rootSchema)
    .max(MAX_ORDER, `at most ${MAX_ORDER} ${what} (order ≤ ${MAX_ORDER})`)
    .describe(`${what} in rad/s; complex ones in conjugate pairs`);

export const zpkInputSchema = z
  .strictObject({
    form: z.literal('zpk'),
    zeros: rootList('zeros'),
    poles: rootList('poles'),
    gain: coefficient('gain')
      .refine((k) => k !== 0, 'gain must not be 0')
      .describe('root-locus gain K: the ratio of the leading coefficients (not a DC gain)'),
  })
  .superRefine((v, ctx) => {
    for (const key of ['zeros', 'poles'] as const) {
      for (const i of unpairedRootIndices(v[key])) {
        ctx.addIssue({ code: 'custom', path: [key, i], message: 'complex root without its conjugate; complex roots come in conjugate pairs' });
      }
    }
    if (v.zeros.length > v.poles.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['zeros'],
        message: `improper: ${v.zeros.length} zeros but ${v.poles.length} poles; the number of zeros must not exceed the number of poles`,
      });
    }
  });

const coefficientList = (what: string) =>
  z
    .array(coefficient('a coefficient'))
    .min(1, `${what} needs at least one coefficient`)
    .max(MAX_ORDER + 1, `at most ${MAX_ORDER + 1} coefficients (order ≤ ${MAX_ORDER})`)
    .describe(`${what} coefficients in descending powers of s, e.g. [1, 5, 0] for s² + 5s`);

export const tfInputSchema = z
  .strictObject({
    form: z.literal('tf'),
    num: coefficientList('numerator'),
    den: coefficientList('denominator'),
  })
  .superRefine((v, ctx) => {
    if (v.den[0] === 0) {
      ctx.addIssue({ code: 'custom', path: ['den', 0], message: 'the leading coefficient of the denominator must not be 0' });
    }
    const firstNonzero = v.num.findIndex((c) => c !== 0);
    if (firstNonzero < 0) {
      ctx.addIssue({ code: 'custom', path: ['num'], message: 'the numerator is zero (gain 0)' });
    } else if (v.num.length - firstNonzero > v.den.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['num'],
        message: `improper: numerator degree ${v.num.length - firstNonzero - 1} exceeds denominator degree ${v.den.length - 1}`,
      });
    }
  });

/** A continuous-time compensator (or plant): `zpk` or `tf`, discriminated on `form`. */
export const compensatorSchema = z
  .discriminatedUnion('form', [zpkInputSchema, tfInputSchema], { error: 'form must be "zpk" or "tf"' })
  .describe('continuous-time transfer function: {form: "zpk", zeros, poles, gain} or {form: "tf", num, den} (descending powers of s)');
export type CompensatorInput = z.infer<typeof compensatorSchema>;
export type ZpkInput = z.infer<typeof zpkInputSchema>;
export type TfInput = z.infer<typeof tfInputSchema>;
