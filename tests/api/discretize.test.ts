import request from 'supertest';
import { makeTestApp, signIn } from '../helpers/test-server';
import { discretizeResponseSchema } from '../../schemas/discretize';

let t: Awaited<ReturnType<typeof makeTestApp>>;
let agent: Awaited<ReturnType<typeof signIn>>['agent'];
let csrf: string;
beforeAll(async () => {
  t = await makeTestApp();
  ({ agent, csrf } = await signIn(t.app, 'viewer@example.com'));
});
afterAll(async () => {
  await t.cleanup();
});

// the example request of DESIGN.md's compute API contract
const example = {
  compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 },
  sampleRateHz: 250,
  methods: ['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler'],
  prewarpHz: 1.2,
  plant: { form: 'tf', num: [8], den: [1, 5, 0] },
};

const post = (body: unknown) => agent.post('/api/v1/discretize').set('X-CSRF-Token', csrf).send(body as object);

describe('POST /api/v1/discretize', () => {
  it('needs a signed-in session', async () => {
    await request(t.app).post('/api/v1/discretize').send(example).expect(401);
  });

  it('answers the contract example with all five methods', async () => {
    const res = await post(example).expect(200);
    expect(res.headers['server-timing']).toMatch(/compute;dur=\d/);
    const m = res.body.methods;
    expect(Object.keys(m).sort()).toEqual(['backward-euler', 'matched', 'prewarp', 'tustin', 'zoh']);
    for (const name of Object.keys(m)) {
      expect(m[name].num).toHaveLength(2);
      expect(m[name].den).toHaveLength(2);
      expect(m[name].den[0]).toBe(1);
      expect(m[name].stable).toBe(true);
      expect(m[name].closedLoopPoles.length).toBe(3);
      expect(m[name].loop.margins.phaseMarginDeg).toEqual(expect.any(Number));
    }
    // ZOH of a biproper lead keeps the direct feedthrough: num[0] = K (the value at s = ∞)
    expect(m.zoh.num[0]).toBeCloseTo(25, 12);
    // Tustin pole map z = (1 + pT/2)/(1 − pT/2) for p = −18, T = 1/250 (identity of the bilinear map)
    const T = 1 / 250;
    expect(m.tustin.poles[0].re).toBeCloseTo((1 - 18 * T / 2) / (1 + 18 * T / 2), 12);
    // DC gain kept by Tustin, ZOH and matched: K·z/p = 25·3/18
    for (const name of ['tustin', 'zoh', 'matched']) expect(m[name].dcGain).toBeCloseTo(25 * 3 / 18, 10);
  });

  it('ZOH of a/(s + a) is (1 − e^{−aT})z⁻¹/(1 − e^{−aT}z⁻¹): num[0] = 0 is the one-sample delay', async () => {
    // step-invariant transform of a first-order lag (standard textbook result, from memory)
    const a = 40;
    const fs = 200;
    const res = await post({ compensator: { form: 'zpk', zeros: [], poles: [-a], gain: a }, sampleRateHz: fs, methods: ['zoh'] }).expect(200);
    const e = Math.exp(-a / fs);
    expect(res.body.methods.zoh.num).toEqual([0, expect.any(Number)]);
    expect(res.body.methods.zoh.num[1]).toBeCloseTo(1 - e, 14);
    expect(res.body.methods.zoh.den[1]).toBeCloseTo(-e, 14);
  });

  it('writes the series packed on request, bit for bit the numbers of the plain answer', async () => {
    const plain = (await post(example).expect(200)).body;
    const res = await post({ ...example, seriesFormat: 'packed' }).expect(200);
    const wire = res.body;
    // on the wire: every long series is packed, coefficients and roots stay numbers
    for (const series of [wire.frequencyHz, wire.continuous.response.magnitudeDb, wire.methods.zoh.response.phaseDeg,
      wire.methods.tustin.loop.step.output, wire.continuousLoop.step.timeSec]) {
      expect(series).toEqual({ encoding: 'float64le-base64', count: expect.any(Number), data: expect.any(String) });
    }
    expect(wire.methods.zoh.num).toEqual(plain.methods.zoh.num);
    expect(wire.frequencyHz.count).toBe(plain.frequencyHz.length);
    // the shared schema parses both to the same answer (toEqual compares numbers with Object.is)
    expect(discretizeResponseSchema.parse(wire)).toEqual(discretizeResponseSchema.parse(plain));
    expect(JSON.stringify(res.body).length).toBeLessThan(0.75 * JSON.stringify(plain).length);
  });

  const bad: [string, unknown, string[]][] = [
    ['a string where a number belongs', { ...example, sampleRateHz: '250' }, ['sampleRateHz']],
    ['a boolean gain', { ...example, compensator: { ...example.compensator, gain: true } }, ['compensator.gain']],
    ['a non-finite number (1e999 parses to Infinity)', '__INF__', ['sampleRateHz']],
    ['a sample rate of 0', { ...example, sampleRateHz: 0 }, ['sampleRateHz']],
    ['an unpaired complex root', { ...example, compensator: { form: 'zpk', zeros: [{ re: -3, im: 2 }], poles: [-18, -20], gain: 1 } }, ['compensator.zeros']],
    ['an unknown method', { ...example, methods: ['tustin', 'forward-euler'] }, ['methods.1']],
    ['an unknown form', { ...example, compensator: { form: 'ss', a: [[1]] } }, ['compensator.form']],
    ['an improper compensator', { ...example, compensator: { form: 'tf', num: [1, 2, 3], den: [1, 5] } }, ['compensator']],
    ['an order above 10', { ...example, compensator: { form: 'zpk', zeros: [], poles: Array.from({ length: 11 }, (_, i) => -(i + 1)), gain: 1 } }, ['compensator.poles']],
    ['prewarpHz at Nyquist', { ...example, prewarpHz: 125 }, ['prewarpHz']],
    ['prewarp with its default undefined (tf form)', { ...example, prewarpHz: undefined, compensator: { form: 'tf', num: [25, 75], den: [1, 18] } }, ['prewarpHz']],
    ['an unknown field', { ...example, sampleRate: 250 }, ['(body)']],
    ['a missing compensator', { sampleRateHz: 250 }, ['compensator']],
    ['an unknown series format', { ...example, seriesFormat: 'csv' }, ['seriesFormat']],
  ];

  it.each(bad)('answers %s with 400 naming the field, within a second', async (_what, body, paths) => {
    const t0 = Date.now();
    const res =
      body === '__INF__'
        ? await agent.post('/api/v1/discretize').set('X-CSRF-Token', csrf).set('Content-Type', 'application/json')
          .send(JSON.stringify(example).replace('"sampleRateHz":250', '"sampleRateHz":1e999'))
        : await post(body);
    expect(Date.now() - t0).toBeLessThan(1000);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toEqual(expect.any(String));
    const got: string[] = res.body.error.issues.map((i: { path: string }) => i.path);
    for (const p of paths) expect(got.some((g) => g === p || g.startsWith(`${p}.`) || (p === '(body)' && g === ''))).toBe(true);
  });

  it('refuses a root at or beyond Nyquist, naming the root and the lowest usable rate', async () => {
    // pole at −900 rad/s needs fs > 900/π ≈ 286.5 Hz
    const res = await post({ ...example, compensator: { form: 'zpk', zeros: [-3], poles: [-900], gain: 25 } }).expect(400);
    const issue = res.body.error.issues.find((i: { path: string }) => i.path === 'compensator.poles.0');
    expect(issue.message).toMatch(/-900/);
    expect(issue.message).toMatch(/286\.4/);
  });

  it('answers a body over the size limit with 413', async () => {
    const big = { ...example, compensator: { form: 'tf', num: Array(60000).fill(1.2345678), den: [1, 2] } };
    const res = await post(big);
    expect(res.status).toBe(413);
  });

  it('answers a hostile but small body quickly', async () => {
    const t0 = Date.now();
    const res = await post({ ...example, compensator: { form: 'tf', num: Array(5000).fill(1), den: Array(5000).fill(1) } });
    expect(res.status).toBe(400);
    expect(Date.now() - t0).toBeLessThan(1000);
  });

  it('answers malformed JSON with 400', async () => {
    const res = await agent.post('/api/v1/discretize').set('X-CSRF-Token', csrf).set('Content-Type', 'application/json').send('{"compensator":');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('Malformed JSON body');
  });
});
