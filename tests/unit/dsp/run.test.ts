import { discretizeRequestSchema, discretizeResponseSchema, type DiscretizeRequestBody } from '../../../schemas/discretize';
import { runDiscretize } from '../../../server/dsp/run';

const run = (body: DiscretizeRequestBody) => runDiscretize(discretizeRequestSchema.parse(body));
const example: DiscretizeRequestBody = {
  compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 },
  sampleRateHz: 250,
  methods: ['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler'],
  prewarpHz: 1.2,
  plant: { form: 'tf', num: [8], den: [1, 5, 0] },
};

describe('runDiscretize: the contract example', () => {
  const res = run({ ...example, responsePoints: 400 });

  it('answers the response schema, one object per method', () => {
    expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
    expect(Object.keys(res.methods).sort()).toEqual(['backward-euler', 'matched', 'prewarp', 'tustin', 'zoh']);
    expect(res.frequencyHz).toHaveLength(400);
    expect(res.frequencyHz[399]).toBe(125);
    expect(JSON.stringify(res)).not.toMatch(/null,null|NaN|Infinity/);
  });

  it('has num/den of length n + 1 and ZOH num[0] = 0 only for a strictly proper H(s)', () => {
    for (const m of Object.values(res.methods)) {
      expect(m!.num).toHaveLength(2);
      expect(m!.den).toHaveLength(2);
      expect(m!.den[0]).toBe(1);
    }
    // the lead is biproper, so ZOH keeps b0 = K
    expect(res.methods.zoh!.num[0]).toBe(25);
    expect(res.plant!.discrete.num[0]).toBe(0);
  });

  it('reports the DC gain, stability and the drift of the pole', () => {
    for (const m of ['tustin', 'matched', 'zoh'] as const) expect(res.methods[m]!.dcGain!).toBeCloseTo((25 * 3) / 18, 12);
    const p = res.methods.matched!.poleInfo[0];
    // matched maps e^{sT} and back, so the equivalent s is the continuous pole
    expect(p.s!.re).toBeCloseTo(-18, 10);
    expect(p.naturalFreqDriftPercent!).toBeCloseTo(0, 8);
    expect(res.methods.tustin!.poleInfo[0].naturalFreqDriftPercent).not.toBe(0);
    expect(res.methods.tustin!.stable).toBe(true);
    expect(res.methods.tustin!.marginal).toBe(false);
    // ω₀ = 2π·1.2 rad/s is used by prewarp only (the lead has no root at 0)
    expect(res.methods.prewarp!.prewarpRadPerSec).toBeCloseTo(2 * Math.PI * 1.2, 12);
    expect(res.methods.matched!.prewarpRadPerSec).toBeNull();
  });

  it('gives a loop with margins and closed-loop poles for every method', () => {
    expect(res.continuousLoop!.stable).toBe(true);
    for (const m of Object.values(res.methods)) {
      expect(m!.closedLoopPoles).toHaveLength(3);
      expect(m!.loop!.stable).toBe(true);
      expect(m!.loop!.margins.phaseMarginDeg).not.toBeNull();
      expect(m!.loop!.step.finalValue!).toBeCloseTo(1, 10); // type-1 loop: no steady-state error
    }
  });

  it('measures the frequency-response error against the continuous compensator', () => {
    // matched and Tustin barely move a lead sampled at 250 Hz, ZOH adds half a sample of lag
    expect(res.methods.tustin!.maxMagnitudeErrorDb).toBeLessThan(0.05);
    expect(res.methods.zoh!.maxPhaseErrorDeg).toBeGreaterThan(res.methods.tustin!.maxPhaseErrorDeg);
    expect(res.bandHz).toBe(250 / 8);
    const i = res.frequencyHz.findIndex((f) => f > 1);
    expect(res.methods.tustin!.response.phaseDeg[i] - res.continuous.response.phaseDeg[i]).toBeLessThan(1);
  });
});

describe('closed-form loop: K = 1, plant ωn²/(s(s + 2ζωn)), ζ = 0.5, ωn = 4 rad/s', () => {
  const zeta = 0.5;
  const wn = 4;
  const res = run({
    compensator: { form: 'zpk', zeros: [], poles: [], gain: 1 },
    plant: { form: 'zpk', zeros: [], poles: [0, -2 * zeta * wn], gain: wn * wn },
    sampleRateHz: 100,
    methods: ['tustin', 'zoh'],
  });
  const loop = res.continuousLoop!;

  it('has the closed-loop poles −ζωn ± jωn√(1 − ζ²) with ζ and ωn', () => {
    for (const p of loop.closedLoopPoles) {
      expect(p.dampingRatio!).toBeCloseTo(zeta, 12);
      expect(p.naturalFreqRadPerSec!).toBeCloseTo(wn, 12);
    }
  });

  it('has the textbook phase margin atan(2ζ/√(√(1 + 4ζ⁴) − 2ζ²)) and no gain margin (from memory: standard second-order loop formulas)', () => {
    const x = Math.sqrt(Math.sqrt(1 + 4 * zeta ** 4) - 2 * zeta ** 2);
    expect(loop.margins.phaseMarginDeg!).toBeCloseTo((Math.atan((2 * zeta) / x) * 180) / Math.PI, 8);
    expect(loop.margins.gainCrossoverHz! * 2 * Math.PI).toBeCloseTo(wn * x, 8);
    expect(loop.margins.gainMarginDb).toBeNull();
  });

  it('steps exactly: y(t) = 1 − e^{−ζωn t}(cos ωd t + ζ/√(1 − ζ²) sin ωd t), overshoot 100·e^{−πζ/√(1 − ζ²)} %', () => {
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    const y = (t: number) => 1 - Math.exp(-zeta * wn * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
    loop.step.timeSec.forEach((t, k) => expect(Math.abs(loop.step.output[k] - y(t))).toBeLessThan(1e-10));
    expect(loop.step.overshootPercent!).toBeCloseTo(100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 1);
    // 2 % settling of this response, found on a dense grid of the formula
    let last = 0;
    for (let t = 0; t < 5; t += 1e-4) if (Math.abs(y(t) - 1) > 0.02) last = t;
    expect(Math.abs(loop.step.settlingTimeSec! - last)).toBeLessThan(0.02);
  });

  it('gives the sampled loop the step of its own difference equation (ZOH plant, Ogata closed form)', () => {
    // ZOH of a/(s(s + a))·(ωn²/a) with a = 2ζωn: num ∝ (aT − 1 + e^{−aT}) z + (1 − e^{−aT} − aT e^{−aT})
    const a = 2 * zeta * wn;
    const T = 0.01;
    const e = Math.exp(-a * T);
    const k = (wn * wn) / (a * a);
    const b1 = k * (a * T - 1 + e);
    const b2 = k * (1 - e - a * T * e);
    const a1 = -(1 + e);
    const a2 = e;
    // closed loop y[n] = −(a1 + b1) y[n−1] − (a2 + b2) y[n−2] + b1 u[n−1] + b2 u[n−2], u = 1
    const step = res.methods.zoh!.loop!.step;
    const last = Math.round(step.timeSec[step.timeSec.length - 1] / T);
    const ys: number[] = [];
    const y = (n: number) => (n < 0 ? 0 : ys[n]);
    const u = (n: number) => (n < 0 ? 0 : 1);
    for (let i = 0; i <= last; i++) ys.push(-(a1 + b1) * y(i - 1) - (a2 + b2) * y(i - 2) + b1 * u(i - 1) + b2 * u(i - 2));
    expect(step.timeSec.length).toBeGreaterThan(20);
    step.timeSec.forEach((t, j) => {
      expect(Math.abs(step.output[j] - ys[Math.round(t / T)])).toBeLessThan(1e-9);
    });
  });
});

describe('warnings', () => {
  const codes = (body: DiscretizeRequestBody) => run(body).warnings.map((w) => w.code);

  it('warns when a corner is above fs/10 (common practice)', () => {
    expect(codes({ ...example, sampleRateHz: 20, prewarpHz: 1 })).toContain('corner-near-rate');
    expect(codes(example)).not.toContain('corner-near-rate');
  });

  it('warns when the rate is low for the closed-loop bandwidth (common practice: 10–30×)', () => {
    const fast = { ...example, compensator: { form: 'zpk' as const, zeros: [-3], poles: [-18], gain: 250 } };
    expect(codes({ ...fast, sampleRateHz: 40, prewarpHz: 1 })).toContain('rate-low-for-bandwidth');
    expect(codes({ ...fast, sampleRateHz: 1000 })).not.toContain('rate-low-for-bandwidth');
  });

  it('warns about an option the chosen methods ignore, never silently', () => {
    expect(codes({ ...example, methods: ['tustin', 'zoh'] })).toContain('prewarp-unused');
    expect(codes(example)).not.toContain('prewarp-unused');
    const { plant: _p, ...noPlant } = example;
    expect(codes({ ...noPlant, delaySamples: 1 })).toContain('delay-unused');
  });

  it('warns when sampling destabilizes a loop that is stable in continuous time', () => {
    const body: DiscretizeRequestBody = {
      compensator: { form: 'zpk', zeros: [-1], poles: [-10], gain: 400 },
      plant: { form: 'zpk', zeros: [], poles: [0, -2], gain: 1 },
      sampleRateHz: 8,
      methods: ['zoh'],
      delaySamples: 1,
    };
    const res = run(body);
    expect(res.continuousLoop!.stable).toBe(true);
    expect(res.methods.zoh!.loop!.stable).toBe(false);
    expect(res.warnings.map((w) => w.code)).toContain('loop-unstable-after-sampling');
    expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
  });
});

describe('other designs through the whole answer', () => {
  it('PI-lead in tf form with prewarpHz: matched uses ω₀, DC gain null, marginal', () => {
    const res = run({ compensator: { form: 'tf', num: [12, 54, 24], den: [1, 30, 0] }, sampleRateHz: 100, prewarpHz: 0.5 });
    const m = res.methods.matched!;
    expect(m.prewarpRadPerSec).toBeCloseTo(Math.PI, 12);
    expect(m.dcGain).toBeNull();
    expect(m.marginal).toBe(true);
    expect(m.stable).toBe(false);
    expect(res.continuous.dcGain).toBeNull();
    expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
  });

  it('a pure gain and an order-10 design both answer', () => {
    expect(run({ compensator: { form: 'zpk', zeros: [], poles: [], gain: 3 }, sampleRateHz: 10, methods: ['tustin', 'zoh', 'matched', 'backward-euler'] }).methods.zoh!.num).toEqual([3]);
    const poles = Array.from({ length: 10 }, (_, i) => -(i + 1));
    const res = run({ compensator: { form: 'zpk', zeros: [-0.5, -1.5], poles, gain: 5 }, sampleRateHz: 50, plant: { form: 'tf', num: [1], den: [1, 1, 0] } });
    expect(res.methods.zoh!.num).toHaveLength(11);
    expect(discretizeResponseSchema.safeParse(res).success).toBe(true);
  });

  it('answers a full request quickly (a loose bound here; timing is measured by server/dsp/bench.ts)', () => {
    run(example);
    const t0 = performance.now();
    for (let i = 0; i < 20; i++) run({ ...example, responsePoints: 400 });
    expect((performance.now() - t0) / 20).toBeLessThan(250);
  });
});
