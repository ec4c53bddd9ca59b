import { z } from 'zod';
import { compensatorSchema, rootIm, rootRe, type CompensatorInput } from './compensator';
import { seriesFormatSchema, seriesSchema } from './series';

/**
 * The compute API `POST /api/v1/discretize` (DESIGN.md "The compute API"): request and
 * response. Imports only zod (the client bundles it).
 *
 * Units: sample rate and every `...Hz` field in Hz; roots in rad/s (s-plane) or
 * dimensionless (z-plane); magnitudes in dB; phases in degrees; times in seconds.
 */

export const METHOD_NAMES = ['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler'] as const;
export const methodNameSchema = z
  .enum(METHOD_NAMES, { error: `method must be one of ${METHOD_NAMES.join(', ')}` })
  .describe('tustin (bilinear), prewarp (bilinear prewarped at ω₀), matched (pole–zero), zoh (step invariant), backward-euler');
export type MethodName = z.infer<typeof methodNameSchema>;

/** Highest accepted sample rate, Hz. */
export const MAX_SAMPLE_RATE_HZ = 1e7;
export const DEFAULT_RESPONSE_POINTS = 200;
export const MAX_RESPONSE_POINTS = 2000;

/** True when the compensator has a zero or pole at s = 0 (DC gain 0, infinite or 0/0). */
export function hasRootAtOrigin(c: CompensatorInput): boolean {
  if (c.form === 'tf') return c.num[c.num.length - 1] === 0 || c.den[c.den.length - 1] === 0;
  return [...c.zeros, ...c.poles].some((r) => rootRe(r) === 0 && rootIm(r) === 0);
}

/**
 * DESIGN.md's default prewarp frequency ω₀ = √(|z₁|·|p₁|) in rad/s, from the first zero
 * and the first pole as entered (the frequency of largest phase shift of a single lead or
 * lag). Null where undefined: tf form, no zero or no pole, or the first one at s = 0.
 * Example: zeros [-3], poles [-18] → √54 ≈ 7.348 rad/s.
 */
export function defaultPrewarpRadPerSec(c: CompensatorInput): number | null {
  if (c.form !== 'zpk' || c.zeros.length === 0 || c.poles.length === 0) return null;
  const z1 = Math.hypot(rootRe(c.zeros[0]), rootIm(c.zeros[0]));
  const p1 = Math.hypot(rootRe(c.poles[0]), rootIm(c.poles[0]));
  if (z1 === 0 || p1 === 0) return null;
  return Math.sqrt(z1 * p1);
}

const finite = (what: string) => z.number({ error: `${what} must be a finite number` });

export const discretizeRequestSchema = z
  .strictObject({
    compensator: compensatorSchema,
    sampleRateHz: finite('sampleRateHz')
      .positive('sampleRateHz must be greater than 0')
      .max(MAX_SAMPLE_RATE_HZ, `sampleRateHz must not exceed ${MAX_SAMPLE_RATE_HZ} Hz`)
      .describe('sample rate fs, Hz; T = 1/fs'),
    methods: z
      .array(methodNameSchema)
      .min(1, 'choose at least one method')
      .max(METHOD_NAMES.length)
      .refine((m) => new Set(m).size === m.length, 'each method at most once')
      .default([...METHOD_NAMES])
      .describe('methods to run; default all five'),
    prewarpHz: finite('prewarpHz')
      .optional()
      .describe('prewarp frequency f₀ in Hz, in (0, fs/2); default √(|z₁|·|p₁|)/(2π) from the first zero and pole'),
    plant: compensatorSchema.optional().describe('continuous plant (roots may lie anywhere); discretized by ZOH'),
    delaySamples: z
      .union([z.literal(0), z.literal(1)], { error: 'delaySamples must be 0 or 1' })
      .default(0)
      .describe('computation delay in samples between the controller output and the plant (0 or 1)'),
    responsePoints: z
      .number({ error: 'responsePoints must be an integer' })
      .int('responsePoints must be an integer')
      .min(10, 'responsePoints must be at least 10')
      .max(MAX_RESPONSE_POINTS, `responsePoints must not exceed ${MAX_RESPONSE_POINTS}`)
      .default(DEFAULT_RESPONSE_POINTS)
      .describe('number of log-spaced frequency points up to Nyquist'),
    bandHz: finite('bandHz')
      .positive('bandHz must be greater than 0')
      .optional()
      .describe('upper edge of the band for the largest response errors, Hz; default fs/8 (a quarter of Nyquist)'),
    seriesFormat: seriesFormatSchema
      .default('numbers')
      .describe('how the long series of the answer are written: "numbers" (JSON arrays, default) or "packed" (float64 little-endian in base64, bit for bit the same values)'),
  })
  .superRefine((req, ctx) => {
    const fs = req.sampleRateHz;
    if (!(fs > 0) || !Number.isFinite(fs)) return;
    const nyquistRad = Math.PI * fs;
    const c = req.compensator;
    // Every finite compensator root must lie below Nyquist, |s| < π·fs (DESIGN.md).
    if (c.form === 'zpk') {
      for (const key of ['zeros', 'poles'] as const) {
        c[key].forEach((r, i) => {
          const mag = Math.hypot(rootRe(r), rootIm(r));
          if (mag >= nyquistRad) {
            const root = typeof r === 'number' ? `${r}` : `${r.re}${r.im < 0 ? '−' : '+'}${Math.abs(r.im)}j`;
            ctx.addIssue({
              code: 'custom',
              path: ['compensator', key, i],
              message: `the ${key === 'zeros' ? 'zero' : 'pole'} s = ${root} rad/s (|s| = ${mag.toPrecision(6)} rad/s) is at or beyond Nyquist (π·fs = ${nyquistRad.toPrecision(6)} rad/s); use a sample rate above ${(mag / Math.PI).toPrecision(6)} Hz`,
            });
          }
        });
      }
    }
    if (req.prewarpHz !== undefined && !(req.prewarpHz > 0 && req.prewarpHz < fs / 2)) {
      ctx.addIssue({ code: 'custom', path: ['prewarpHz'], message: `prewarpHz must lie in (0, fs/2) = (0, ${fs / 2}) Hz` });
    }
    if (req.bandHz !== undefined && req.bandHz > fs / 2) {
      ctx.addIssue({ code: 'custom', path: ['bandHz'], message: `bandHz must not exceed Nyquist, fs/2 = ${fs / 2} Hz` });
    }
    if (req.prewarpHz === undefined && defaultPrewarpRadPerSec(c) === null) {
      const methods = req.methods ?? METHOD_NAMES;
      const pi = methods.indexOf('prewarp');
      if (pi >= 0) {
        ctx.addIssue({
          code: 'custom',
          path: ['prewarpHz'],
          message: 'the prewarp method needs prewarpHz here: its default √(|z₁|·|p₁|) is undefined (tf form, no zero or no pole, or the first at s = 0)',
        });
      }
      const mi = methods.indexOf('matched');
      if (mi >= 0 && hasRootAtOrigin(c)) {
        ctx.addIssue({
          code: 'custom',
          path: ['prewarpHz'],
          message: 'matched pole–zero matches the gain at the prewarp frequency when the DC gain is 0 or infinite; give prewarpHz (its default √(|z₁|·|p₁|) is undefined here)',
        });
      }
    }
  });
/** The parsed request (defaults filled in). */
export type DiscretizeRequest = z.output<typeof discretizeRequestSchema>;
/** The request body as sent (optional fields may be missing). */
export type DiscretizeRequestBody = z.input<typeof discretizeRequestSchema>;

// ---------------------------------------------------------------- response

/** A complex value of the answer (no input bounds: z-plane roots of unstable plants can be huge). */
const complexSchema = z.object({ re: z.number(), im: z.number() }).describe('a complex number {re, im}');
const num = (d: string) => z.number().describe(d);
const nullableNum = (d: string) => z.number().nullable().describe(d);

/** A root with its equivalent s-plane value and its drift from the continuous root. */
export const rootInfoSchema = z.object({
  z: complexSchema.nullable().describe('z-plane root (null for continuous-time roots)'),
  s: complexSchema.nullable().describe('s-plane value in rad/s: the continuous root, or ln(z)/T for a z-plane root (null for z = 0)'),
  dampingRatio: nullableNum('damping ratio ζ = −Re(s)/|s| (null when s is 0 or undefined)'),
  naturalFreqRadPerSec: nullableNum('natural frequency ωn = |s|, rad/s'),
  continuous: complexSchema.nullable().describe('the continuous root this one came from, rad/s (null when it has none, e.g. a zero from infinity)'),
  naturalFreqDriftPercent: nullableNum('100·(ωn − ωn,continuous)/ωn,continuous, percent'),
  dampingRatioDrift: nullableNum('ζ − ζ,continuous (absolute)'),
});
export type RootInfo = z.infer<typeof rootInfoSchema>;

export const frequencyResponseSchema = z.object({
  magnitudeDb: seriesSchema.describe('20·log10|H|, dB, one per frequencyHz point (floored at −400 dB)'),
  phaseDeg: seriesSchema.describe('unwrapped phase, degrees, one per frequencyHz point'),
});

export const marginsSchema = z.object({
  gainMarginDb: nullableNum('gain margin −20·log10|L| at the phase crossover with the smallest margin, dB (null: no phase crossover)'),
  phaseCrossoverHz: nullableNum('frequency where the loop phase crosses −180°, Hz'),
  phaseMarginDeg: nullableNum('phase margin 180° + ∠L at the gain crossover with the smallest margin, degrees (null: no gain crossover)'),
  gainCrossoverHz: nullableNum('frequency where |L| crosses 1, Hz'),
});
export type Margins = z.infer<typeof marginsSchema>;

export const stepResponseSchema = z.object({
  timeSec: seriesSchema.describe('sample times, s'),
  output: seriesSchema.describe('closed-loop output for a unit step reference'),
  finalValue: nullableNum('closed-loop DC gain (null when the loop is not stable)'),
  overshootPercent: nullableNum('peak overshoot above the final value, percent'),
  riseTimeSec: nullableNum('10–90 % rise time, s'),
  settlingTimeSec: nullableNum('2 % settling time, s (null when not settled in the window)'),
});
export type StepResponse = z.infer<typeof stepResponseSchema>;

export const loopSchema = z.object({
  closedLoopPoles: z.array(rootInfoSchema).describe('closed-loop poles (negative unity feedback) with ζ, ωn and drift'),
  stable: z.boolean().describe('every closed-loop pole strictly in the left half-plane / inside the unit circle'),
  margins: marginsSchema,
  step: stepResponseSchema,
});
export type LoopResult = z.infer<typeof loopSchema>;

export const methodResultSchema = z.object({
  method: methodNameSchema,
  num: z.array(z.number()).describe('b0 … bn: coefficients of z⁰, z⁻¹ … z⁻ⁿ; length n + 1, leading zeros kept'),
  den: z.array(z.number()).describe('1, a1 … an: coefficients of z⁰, z⁻¹ … z⁻ⁿ; length n + 1'),
  gain: num('root-locus gain of H(z) = K·Π(z − zᵢ)/Π(z − pᵢ)'),
  zeros: z.array(complexSchema).describe('finite z-plane zeros (zeros at z = ∞ left out, zeros at z = 0 listed)'),
  poles: z.array(complexSchema).describe('z-plane poles'),
  zeroInfo: z.array(rootInfoSchema),
  poleInfo: z.array(rootInfoSchema),
  dcGain: nullableNum('H(z = 1) from the structure; null when infinite (a pole at z = 1)'),
  stable: z.boolean().describe('every pole strictly inside the unit circle'),
  marginal: z.boolean().describe('a pole on the unit circle and none outside'),
  prewarpRadPerSec: nullableNum('ω₀ used by this method (prewarp; matched when DC gain is 0 or infinite), rad/s'),
  response: frequencyResponseSchema,
  maxMagnitudeErrorDb: num('largest |Δ magnitude| against the continuous compensator up to bandHz, dB'),
  maxMagnitudeErrorAtHz: num('frequency of that largest magnitude error, Hz'),
  maxPhaseErrorDeg: num('largest |Δ phase| against the continuous compensator up to bandHz, degrees'),
  maxPhaseErrorAtHz: num('frequency of that largest phase error, Hz'),
  closedLoopPoles: z.array(complexSchema).optional().describe('with a plant: z-plane closed-loop poles (plant by ZOH, optional delay, negative unity feedback)'),
  loop: loopSchema.optional().describe('with a plant: the discrete loop figures'),
});
export type MethodResult = z.infer<typeof methodResultSchema>;

export const warningSchema = z.object({
  code: z.string().describe('stable machine-readable code, e.g. "rate-low-for-bandwidth"'),
  message: z.string(),
});
export type DspWarning = z.infer<typeof warningSchema>;

export const continuousSchema = z.object({
  zeros: z.array(complexSchema).describe('s-plane zeros, rad/s'),
  poles: z.array(complexSchema).describe('s-plane poles, rad/s'),
  gain: num('root-locus gain K'),
  numDescending: z.array(z.number()).describe('numerator, descending powers of s'),
  denDescending: z.array(z.number()).describe('denominator, descending powers of s, monic'),
  zeroInfo: z.array(rootInfoSchema),
  poleInfo: z.array(rootInfoSchema),
  dcGain: nullableNum('H(s = 0); null when infinite (a pole at s = 0)'),
  response: frequencyResponseSchema,
});

export const discretizeResponseSchema = z.object({
  sampleRateHz: num('fs, Hz'),
  periodSec: num('T = 1/fs, s'),
  nyquistHz: num('fs/2, Hz'),
  bandHz: num('upper band edge used for the largest errors, Hz'),
  prewarpHz: nullableNum('ω₀/(2π) given or defaulted, Hz (null when undefined)'),
  delaySamples: z.union([z.literal(0), z.literal(1)]),
  frequencyHz: seriesSchema.describe('log-spaced frequency grid up to just below Nyquist, Hz'),
  continuous: continuousSchema.describe('the compensator as parsed, H(s)'),
  methods: z
    .object({
      tustin: methodResultSchema.optional(),
      prewarp: methodResultSchema.optional(),
      matched: methodResultSchema.optional(),
      zoh: methodResultSchema.optional(),
      'backward-euler': methodResultSchema.optional(),
    })
    .describe('one object per requested method, keyed by method name'),
  plant: z
    .object({
      zeros: z.array(complexSchema),
      poles: z.array(complexSchema),
      gain: z.number(),
      discrete: z.object({
        num: z.array(z.number()),
        den: z.array(z.number()),
        zeros: z.array(complexSchema),
        poles: z.array(complexSchema),
        gain: z.number(),
      }).describe('plant by ZOH, difference-equation form'),
    })
    .optional(),
  continuousLoop: loopSchema.optional().describe('with a plant: the continuous loop figures'),
  warnings: z.array(warningSchema),
});
/** The answer as computed (every series as numbers). */
export type DiscretizeResponse = z.output<typeof discretizeResponseSchema>;
/** The answer as written on the wire (series as numbers or packed, per `seriesFormat`). */
export type DiscretizeResponseWire = z.input<typeof discretizeResponseSchema>;
