/**
 * Ill-posed loops: 1 + L(∞) = 0 (L = C·P, negative unity feedback) leaves the closed loop
 * without a proper transfer function (the definition of well-posedness of a feedback
 * loop). The compute API answers 400 naming `plant`, for the continuous loop and for each
 * sampled loop (there 1 + C_d(z = ∞)·P_d(z = ∞) = 0, the message naming the method that gave
 * C_d), and answers every loop where 1 + L(∞) is small but not zero.
 */
import { closedLoopPoles } from '../../../server/dsp/analysis';
import { DspInputError } from '../../../server/dsp/errors';
import { runDiscretize } from '../../../server/dsp/run';
import { discretizeRequestSchema, discretizeResponseSchema, METHOD_NAMES, type DiscretizeRequestBody } from '../../../schemas/discretize';

const run = (body: DiscretizeRequestBody) => runDiscretize(discretizeRequestSchema.parse(body));

/** The error runDiscretize throws for body (fails the test when it answers). */
function refusal(body: DiscretizeRequestBody): DspInputError {
  try {
    run(body);
  } catch (e) {
    if (e instanceof DspInputError) return e;
    throw e;
  }
  throw new Error('answered');
}

function expectIllPosed(body: DiscretizeRequestBody) {
  const e = refusal(body);
  expect(e.message).toBe('the loop is ill-posed: 1 + C(∞)·P(∞) = 0');
  expect(e.issues.map((i) => i.path)).toEqual(['plant']);
}

/** The sampled loop of `method` is refused: its own message, naming the method, still path `plant`. */
function expectSampledIllPosed(body: DiscretizeRequestBody, method: string) {
  const e = refusal(body);
  expect(e.message).toBe(`the sampled loop of ${method} is ill-posed: 1 + C_d(z = ∞)·P_d(z = ∞) = 0`);
  expect(e.issues.map((i) => i.path)).toEqual(['plant']);
  expect(e.issues[0].message).toContain(`with ${method}, the sampled closed loop`);
}

// the plant s/(s + 1): P(∞) = 1, and its ZOH model keeps b0 = D = P(∞) = 1
const plant = { form: 'tf' as const, num: [1, 0], den: [1, 1] };

describe('the characteristic polynomial', () => {
  it('reports a vanished leading coefficient as lead 0 (den·z^d + num, descending)', () => {
    // L = −s/(s + 1): den + num = (s + 1) + (−s) = 0·s + 1
    expect(closedLoopPoles([-1, 0], [1, 1]).lead).toBe(0);
    // with a one-sample delay: z(z + 1) − z = z² + 0·z, leading coefficient 1
    expect(closedLoopPoles([-1, 0], [1, 1], 1).lead).toBe(1);
    // 1 + L(∞) = 1 − 0.999999 = 1e-6 (up to the rounding of 0.999999)
    expect(closedLoopPoles([-0.999999, 0], [1, 1]).lead).toBeCloseTo(1e-6, 15);
  });
});

describe('continuous loop: C = −(s + 1)/(s + 2), P = s/(s + 1)', () => {
  // zpk gain is the ratio of leading coefficients, so C(∞) = K = −1 and 1 + C(∞)·P(∞) = 1 − 1 = 0
  const compensator = { form: 'zpk' as const, zeros: [-1], poles: [-2], gain: -1 };

  it('is refused as ill-posed naming the plant, with every method alone and all together, with and without the delay; K = −0.999999 is answered', () => {
    for (const delaySamples of [0, 1] as const) {
      for (const methods of [[...METHOD_NAMES], ...METHOD_NAMES.map((m) => [m])]) {
        expectIllPosed({ compensator, plant, sampleRateHz: 100, prewarpHz: 1, methods, delaySamples });
      }
      // 1 + C(∞)P(∞) = 1e-6: characteristic polynomial (s + 1)(s + 2) + K·s(s + 1) = (1 + K)s² + (3 + K)s + 2
      const K = -0.999999;
      const res = run({ compensator: { ...compensator, gain: K }, plant, sampleRateHz: 100, prewarpHz: 1, delaySamples });
      expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
      const a = 1 + K;
      const b = 3 + K;
      // quadratic formula, cancellation-free: roots (−b − √(b² − 8a))/(2a) and 4/(−b − √(b² − 8a))
      const q = -b - Math.sqrt(b * b - 8 * a);
      const expected = [q / (2 * a), 4 / q].sort((x, y) => x - y);
      const got = res.continuousLoop!.closedLoopPoles.map((p) => p.s!.re).sort((x, y) => x - y);
      expect(got).toHaveLength(2);
      // a = 1 + K carries the rounding of K (1e-16 absolute, 1e-10 relative): the fast root with it
      expect(Math.abs(got[0] - expected[0])).toBeLessThanOrEqual(1e-9 * Math.abs(expected[0]));
      expect(Math.abs(got[1] - expected[1])).toBeLessThanOrEqual(1e-9 * Math.abs(expected[1]));
      for (const m of Object.values(res.methods)) expect(m!.loop!.closedLoopPoles).toHaveLength(2 + delaySamples);
    }
  });
});

describe('sampled loops ill-posed where the continuous loop is not', () => {
  it('Tustin: C_d(z = ∞) = C(s = 2/T) (the bilinear map sends z = ∞ to s = 2/T); refused, answered with the delay or off by 5e-7', () => {
    // fs = 100: 2/T = 200, C(200) = −2·(200 + 56)/(200 + 312) = −1 exactly; P_d(∞) = 1: 1 + L_d(∞) = 0.
    // The continuous loop: 1 + C(∞)P(∞) = 1 − 2 = −1, well-posed.
    const body: DiscretizeRequestBody = { compensator: { form: 'zpk', zeros: [-56], poles: [-312], gain: -2 }, plant, sampleRateHz: 100, methods: ['tustin'] };
    expectSampledIllPosed(body, 'tustin');
    // a one-sample delay makes L_d = C_d·P_d·z⁻¹ strictly proper: 1 + L_d(∞) = 1, answered with n + 1 = 3 poles
    const delayed = run({ ...body, delaySamples: 1 });
    expect(delayed.methods.tustin!.loop!.closedLoopPoles).toHaveLength(3);
    // K = −1.999999: 1 + L_d(∞) = 1 − 0.9999995 = 5e-7, answered
    const near = run({ ...body, compensator: { form: 'zpk', zeros: [-56], poles: [-312], gain: -1.999999 } });
    expect(discretizeResponseSchema.safeParse(near).success).toBe(true);
    expect(near.methods.tustin!.loop!.closedLoopPoles).toHaveLength(2);
  });

  it('backward Euler: C_d(z = ∞) = C(s = 1/T) (s = (z − 1)/(Tz) → 1/T); refused, answered with the delay', () => {
    // fs = 1: C(1) = −2·(1 + 1)/(1 + 3) = −1 exactly; continuous 1 + C(∞)P(∞) = −1
    const body: DiscretizeRequestBody = { compensator: { form: 'zpk', zeros: [-1], poles: [-3], gain: -2 }, plant, sampleRateHz: 1, methods: ['backward-euler', 'zoh'] };
    expectSampledIllPosed(body, 'backward-euler');
    // the method named is the one whose loop is ill-posed, not the first asked for
    expectSampledIllPosed({ ...body, methods: ['zoh', 'backward-euler'] }, 'backward-euler');
    expect(run({ ...body, delaySamples: 1 }).methods['backward-euler']!.loop!.closedLoopPoles).toHaveLength(3);
    // ZOH keeps b0 = C(∞) = −2: its loop alone is well-posed
    expect(run({ ...body, methods: ['zoh'] }).methods.zoh!.loop!.closedLoopPoles).toHaveLength(2);
  });
});
