import { buildSpec, discretizeRequestFor, editorStateFromSpec, errorsFromIssues, newEditorState, type EditorState } from '../../../components/design/spec';
import { equalAspectDomains } from '../../../components/plots/scales';
import { bestOf } from '../../../components/design/drift';

const lead = (): EditorState => ({ ...newEditorState(), entry: { form: 'lead', gain: '25', zero: '3', pole: '18' }, sampleRateHz: '250' });

describe('editor → saved spec', () => {
  it('builds a spec with the tolerance defaults and the entry form', () => {
    const { spec, errors } = buildSpec(lead());
    expect(errors).toEqual({});
    expect(spec).toMatchObject({
      compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 },
      entry: { form: 'lead', gain: 25, zero: 3, pole: 18 },
      sampleRateHz: 250,
      method: 'tustin',
      tolerances: { poleDriftPct: 5, dcGainDriftPct: 1, magErrorDb: 1, phaseErrorDeg: 5 },
    });
    expect(spec).not.toHaveProperty('plant');
  });
  it('puts schema errors on the editor fields (prewarp above Nyquist, empty rate, bad plant)', () => {
    expect(buildSpec({ ...lead(), prewarpHz: '200' }).errors.prewarpHz).toMatch(/Nyquist/);
    expect(buildSpec({ ...lead(), sampleRateHz: '' }).errors.sampleRateHz).toBeDefined();
    const withPlant = buildSpec({ ...lead(), plantOn: true, plant: { form: 'tf', num: '1, 2, 3', den: '1, 5' } });
    expect(withPlant.spec).toBeUndefined();
    expect(withPlant.errors['plant.num']).toMatch(/improper/);
  });
  it('keeps what the editor does not show (implementation) and reopens the same spec', () => {
    const impl = { wordLength: 16 as const, inputScale: 1, outputScale: 1, outputLimits: { min: -1000, max: 1000 }, prefix: 'tilt' };
    const { spec } = buildSpec({ ...lead(), plantOn: true, plant: { form: 'tf', num: '8', den: '1, 5, 0' }, delaySamples: 1 }, { implementation: impl });
    expect(spec!.implementation).toEqual(impl);
    const again = buildSpec(editorStateFromSpec(spec!), { implementation: spec!.implementation });
    expect(again.spec).toEqual(spec);
  });
});

describe('server issue paths → editor fields', () => {
  it('maps compute and save paths, expanded zpk roots included', () => {
    const state: EditorState = { ...lead(), entry: { form: 'zpk', gain: '1', zeros: [], poles: [{ re: '-1', im: '2' }, { re: '-900', im: '' }] } };
    const { errors, general } = errorsFromIssues(state, [
      { path: 'compensator.poles.2', message: 'beyond Nyquist' },
      { path: 'spec.sampleRateHz', message: 'too low' },
      { path: 'plant.den', message: 'bad' },
      { path: '', message: 'whole request' },
    ]);
    expect(errors).toEqual({ 'compensator.poles.1': 'beyond Nyquist', sampleRateHz: 'too low', 'plant.den': 'bad' });
    expect(general).toEqual(['whole request']);
  });
});

describe('compute request', () => {
  it('asks for all five methods when the default prewarp frequency exists', () => {
    const { body, skipped } = discretizeRequestFor(buildSpec(lead()).spec!);
    expect(body.methods).toEqual(['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler']);
    expect(skipped).toEqual([]);
    expect(body).not.toHaveProperty('plant');
  });
  it('leaves out prewarp (and matched, with a pole at s = 0) when ω₀ has no default, saying why', () => {
    const pi = buildSpec({ ...lead(), entry: { form: 'tf', num: '2, 6', den: '1, 0' } }).spec!;
    const { body, skipped } = discretizeRequestFor(pi);
    expect(body.methods).toEqual(['tustin', 'zoh', 'backward-euler']);
    expect(skipped.map((s) => s.method)).toEqual(['prewarp', 'matched']);
    const given = discretizeRequestFor({ ...pi, prewarpHz: 2 });
    expect(given.body.methods).toHaveLength(5);
  });
});

describe('pole–zero map framing', () => {
  it('keeps one unit of Re as long as one unit of Im and holds the unit circle', () => {
    const d = equalAspectDomains([{ re: 0.9, im: 0.05 }], 'z', 400, 300);
    expect((d.re[1] - d.re[0]) / 400).toBeCloseTo((d.im[1] - d.im[0]) / 300, 12);
    expect(d.re[0]).toBeLessThanOrEqual(-1);
    expect(d.re[1]).toBeGreaterThanOrEqual(1);
    expect(d.im[0]).toBeLessThanOrEqual(-1);
  });
  it('zooms to the roots on request', () => {
    const d = equalAspectDomains([{ re: 0.95, im: 0.02 }, { re: 0.99, im: -0.02 }], 'z', 400, 300, true);
    expect(d.re[0]).toBeGreaterThan(0.5);
    expect(d.re[1]).toBeLessThan(1.2);
  });
});

describe('ties in the drift table', () => {
  it('treats rounding noise below 1e-6 as a tie', () => {
    expect(bestOf({ tustin: { text: '', score: 0 }, zoh: { text: '', score: 1.04e-9 }, matched: { text: '', score: 0.3 } })).toEqual(['tustin', 'zoh']);
  });
});
