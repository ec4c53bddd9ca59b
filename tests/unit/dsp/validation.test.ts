/** Bad input of the compute API contract (DESIGN.md, issue 3 item 4): issues with dotted paths. */
import { discretizeRequestSchema } from '../../../schemas/discretize';
import { runDiscretize } from '../../../server/dsp/run';
import { DspInputError } from '../../../server/dsp/errors';

const good = { compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 }, sampleRateHz: 250 };

/** Dotted paths of the issues, as the route reports them. */
function paths(body: unknown): string[] {
  const r = discretizeRequestSchema.safeParse(body);
  if (r.success) return [];
  return r.error.issues.map((i) => i.path.join('.'));
}
function messages(body: unknown): string {
  const r = discretizeRequestSchema.safeParse(body);
  return r.success ? '' : r.error.issues.map((i) => i.message).join(' | ');
}
const withComp = (compensator: unknown, extra: object = {}) => ({ ...good, compensator, ...extra });

describe('request validation', () => {
  it('accepts the contract example', () => {
    const ex = { ...good, methods: ['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler'], prewarpHz: 1.2, plant: { form: 'tf', num: [8], den: [1, 5, 0] } };
    expect(paths(ex)).toEqual([]);
    const parsed = discretizeRequestSchema.parse(good);
    expect(parsed.methods).toEqual(['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler']);
    expect(parsed.delaySamples).toBe(0);
    expect(parsed.responsePoints).toBe(200);
  });

  it.each([
    ['NaN gain', withComp({ form: 'zpk', zeros: [-3], poles: [-18], gain: NaN }), 'compensator.gain'],
    ['Infinity root', withComp({ form: 'zpk', zeros: [Infinity], poles: [-18], gain: 1 }), 'compensator.zeros.0'],
    ['non-finite im', withComp({ form: 'zpk', zeros: [], poles: [{ re: -1, im: -Infinity }, { re: -1, im: Infinity }], gain: 1 }), 'compensator.poles.0'],
    ['string root', withComp({ form: 'zpk', zeros: ['-3'], poles: [-18], gain: 1 }), 'compensator.zeros.0'],
    ['boolean gain', withComp({ form: 'zpk', zeros: [-3], poles: [-18], gain: true }), 'compensator.gain'],
    ['string sample rate', { ...good, sampleRateHz: '250' }, 'sampleRateHz'],
    ['NaN sample rate', { ...good, sampleRateHz: NaN }, 'sampleRateHz'],
    ['zero sample rate', { ...good, sampleRateHz: 0 }, 'sampleRateHz'],
    ['negative sample rate', { ...good, sampleRateHz: -5 }, 'sampleRateHz'],
    ['absurd sample rate', { ...good, sampleRateHz: 2e7 }, 'sampleRateHz'],
    ['unpaired complex root', withComp({ form: 'zpk', zeros: [], poles: [{ re: -1, im: 2 }, -4], gain: 1 }), 'compensator.poles.0'],
    ['mismatched pair', withComp({ form: 'zpk', zeros: [], poles: [{ re: -1, im: 2 }, { re: -1.5, im: -2 }], gain: 1 }), 'compensator.poles.0'],
    ['unknown method', { ...good, methods: ['tustin', 'bilinear'] }, 'methods.1'],
    ['duplicate method', { ...good, methods: ['zoh', 'zoh'] }, 'methods'],
    ['empty methods', { ...good, methods: [] }, 'methods'],
    ['unknown form', withComp({ form: 'ss', a: [[1]] }), 'compensator.form'],
    ['missing form', withComp({ zeros: [], poles: [-1], gain: 1 }), 'compensator.form'],
    ['improper zpk', withComp({ form: 'zpk', zeros: [-1, -2], poles: [-3], gain: 1 }), 'compensator.zeros'],
    ['improper tf', withComp({ form: 'tf', num: [1, 2, 3], den: [1, 4] }), 'compensator.num'],
    ['order > 10 zpk', withComp({ form: 'zpk', zeros: [], poles: new Array(11).fill(-1), gain: 1 }), 'compensator.poles'],
    ['order > 10 tf', withComp({ form: 'tf', num: [1], den: new Array(12).fill(1) }), 'compensator.den'],
    ['den leading 0', withComp({ form: 'tf', num: [1], den: [0, 1, 2] }), 'compensator.den.0'],
    ['empty den', withComp({ form: 'tf', num: [1], den: [] }), 'compensator.den'],
    ['zero numerator', withComp({ form: 'tf', num: [0, 0], den: [1, 2] }), 'compensator.num'],
    ['gain 0', withComp({ form: 'zpk', zeros: [], poles: [-1], gain: 0 }), 'compensator.gain'],
    ['root beyond Nyquist', withComp({ form: 'zpk', zeros: [-3], poles: [-800], gain: 1 }), 'compensator.poles.0'],
    ['complex root at Nyquist', withComp({ form: 'zpk', zeros: [{ re: 0, im: 250 * Math.PI }, { re: 0, im: -250 * Math.PI }], poles: [-1, -2], gain: 1 }), 'compensator.zeros.0'],
    ['prewarpHz at fs/2', { ...good, prewarpHz: 125 }, 'prewarpHz'],
    ['prewarpHz negative', { ...good, prewarpHz: -1 }, 'prewarpHz'],
    ['prewarp undefined (tf form)', withComp({ form: 'tf', num: [1, 3], den: [1, 18] }, { methods: ['prewarp'] }), 'prewarpHz'],
    ['prewarp undefined (first pole at 0)', withComp({ form: 'zpk', zeros: [-1], poles: [0, -10], gain: 2 }, { methods: ['prewarp'] }), 'prewarpHz'],
    ['matched with integrator, no ω₀', withComp({ form: 'tf', num: [1, 3], den: [1, 0] }, { methods: ['matched'] }), 'prewarpHz'],
    ['delaySamples 2', { ...good, delaySamples: 2 }, 'delaySamples'],
    ['responsePoints too many', { ...good, responsePoints: 5000 }, 'responsePoints'],
    ['responsePoints fractional', { ...good, responsePoints: 20.5 }, 'responsePoints'],
    ['bandHz above Nyquist', { ...good, bandHz: 200 }, 'bandHz'],
    ['bad plant', { ...good, plant: { form: 'tf', num: [1, 2, 3], den: [1, 2] } }, 'plant.num'],
    ['unknown key', { ...good, prewarpHZ: 3 }, ''],
  ])('%s', (_label, body, path) => {
    expect(paths(body)).toContain(path);
  });

  it('names the root and the lowest usable sample rate when a root is beyond Nyquist', () => {
    const msg = messages(withComp({ form: 'zpk', zeros: [-3], poles: [-800], gain: 1 }));
    expect(msg).toContain('s = -800');
    // lowest usable rate |s|/π = 254.648 Hz
    expect(msg).toContain('254.648');
  });

  it('rejects non-object bodies', () => {
    for (const body of [null, 3, 'x', [], {}]) expect(discretizeRequestSchema.safeParse(body).success).toBe(false);
  });

  it('stays fast on a hostile body (a huge array is refused by its length)', () => {
    const big = withComp({ form: 'zpk', zeros: [], poles: new Array(200000).fill(-1), gain: 1 });
    const t0 = performance.now();
    expect(paths(big)).toContain('compensator.poles');
    expect(performance.now() - t0).toBeLessThan(500);
  });

  it('refuses a tf-form root beyond Nyquist after factoring (DspInputError naming the field)', () => {
    const req = discretizeRequestSchema.parse(withComp({ form: 'tf', num: [1, 3], den: [1, 1000] }, { methods: ['tustin'] }));
    expect(() => runDiscretize(req)).toThrow(DspInputError);
    try {
      runDiscretize(req);
    } catch (e) {
      const err = e as DspInputError;
      expect(err.issues[0].path).toBe('compensator.den');
      expect(err.issues[0].message).toContain('318.31'); // 1000/π Hz
    }
  });
});
