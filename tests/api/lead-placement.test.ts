import request from 'supertest';
import { makeTestApp, signIn } from '../helpers/test-server';

let t: Awaited<ReturnType<typeof makeTestApp>>;
let agent: Awaited<ReturnType<typeof signIn>>['agent'];
let csrf: string;
beforeAll(async () => {
  t = await makeTestApp();
  ({ agent, csrf } = await signIn(t.app, 'engineer@example.com'));
});
afterAll(async () => {
  await t.cleanup();
});

// our worked example (hand derivation in tests/unit/lead-placement/lead-placement.test.ts):
// G = 6/(s(s + 3)), ζ = 0.6, ωn = 5 → s_d = −3 + j4, bisector z = 25/7, p = 7, K = 14/3
const example = { plant: { form: 'tf', num: [6], den: [1, 3, 0] }, zeta: 0.6, wn: 5 };
const post = (body: unknown) => agent.post('/api/v1/lead-placement').set('X-CSRF-Token', csrf).send(body as object);

describe('POST /api/v1/lead-placement', () => {
  it('needs a signed-in session', async () => {
    const res = await request(t.app).post('/api/v1/lead-placement').send(example).expect(401);
    expect(res.body.error.message).toEqual(expect.any(String));
  });

  it('places the lead of the worked example and checks both conditions', async () => {
    const res = await post(example).expect(200);
    const b = res.body;
    expect(b.rule).toBe('bisector');
    expect(b.zero).toBeCloseTo(25 / 7, 10);
    expect(b.pole).toBeCloseTo(7, 10);
    expect(b.gain).toBeCloseTo(14 / 3, 10);
    expect(b.sDesired).toEqual({ re: expect.closeTo(-3, 12), im: expect.closeTo(4, 12) });
    expect(b.angleDeficiencyDeg).toBeCloseTo((Math.atan(3 / 4) * 180) / Math.PI, 9);
    expect(Math.abs(Math.abs(b.check.angleDeg) - 180)).toBeLessThan(1e-9);
    expect(Math.abs(b.check.magnitude - 1)).toBeLessThan(1e-9);
    expect(b.closedLoopPoles).toHaveLength(3);
    expect(b.dominantOk).toBe(true);
    expect(b.dominanceNotes).toEqual(expect.any(Array));
  });

  it("rule 'zero-at' with the zero under the plant pole: p = 6, K = 25/6 (hand derivation in the unit test)", async () => {
    const res = await post({ ...example, rule: 'zero-at', zero: 3 }).expect(200);
    expect(res.body.pole).toBeCloseTo(6, 10);
    expect(res.body.gain).toBeCloseTo(25 / 6, 10);
  });

  const bad: [string, unknown, string[]][] = [
    ['ζ = 1.2', { ...example, zeta: 1.2 }, ['zeta']],
    ['ωn = 0', { ...example, wn: 0 }, ['wn']],
    ['ζ as a string', { ...example, zeta: '0.6' }, ['zeta']],
    ['ωn as a string', { ...example, wn: 'fast' }, ['wn']],
    ['an unknown rule', { ...example, rule: 'halfway' }, ['rule']],
    ["'zero-at' without the zero", { ...example, rule: 'zero-at' }, ['zero']],
    ['a bad plant', { ...example, plant: { form: 'tf', num: [1, 2, 3], den: [1, 5] } }, ['plant.num']],
    ['an unknown field', { ...example, damping: 0.6 }, ['(body)']],
    // G = 1/s³ at ζ = 0.35: φ = 180° + 3·110.49° − 360° = 151.5° (beyond one lead)
    ['an angle beyond one lead', { plant: { form: 'tf', num: [1], den: [1, 0, 0, 0] }, zeta: 0.35, wn: 1 }, ['zeta', 'wn']],
    // worked example: a zero at −30 is seen from s_d at atan2(4, 27) = 8.4°, less than φ = 36.87°
    ['a fixed zero too far left', { ...example, rule: 'zero-at', zero: 30 }, ['zero']],
  ];
  it.each(bad)('answers %s with 400 naming the field', async (_what, body, paths) => {
    const res = await post(body).expect(400);
    expect(res.body.error.message).toEqual(expect.any(String));
    const got = (res.body.error.issues as { path: string }[]).map((i) => i.path);
    for (const p of paths) expect(got).toContain(p);
  });

  it('answers a target already on the locus with 400 and the gain that does it alone', async () => {
    // G = 5/(s(s + 2)): the locus is vertical at Re s = −1; ζωn = 1, ωn = 2 → K = ωn²/5 = 0.8
    const res = await post({ plant: { form: 'zpk', zeros: [], poles: [0, -2], gain: 5 }, zeta: 0.5, wn: 2 }).expect(400);
    expect(res.body.error.message).toMatch(/No lead needed.*K = 0\.8\b/);
  });

  it('is listed in the OpenAPI document', async () => {
    const res = await agent.get('/api/v1/openapi.json').expect(200);
    expect(res.body.paths['/api/v1/lead-placement'].post.requestBody).toBeDefined();
  });
});
