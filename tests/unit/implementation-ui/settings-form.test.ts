/** The implementation form's pure helpers: text ↔ settings, field errors, requests and specs. */
import { implementationSettingsSchema, wordRange } from '../../../schemas/implementation';
import { implementRequestSchema } from '../../../schemas/implementation-api';
import { designSpecSchema, type DesignSpec } from '../../../schemas/design';
import {
  buildSettings,
  defaultForm,
  errorsFromPaths,
  formFromSettings,
  implementRequestFor,
  parseRealNumber,
  prefixFromName,
  sameSettings,
  savedSettings,
  specWithSettings,
  withWordLength,
  type SettingsForm,
} from '../../../components/implementation/settings-form';

const form: SettingsForm = {
  wordLength: '16', inputScale: '3.3/4096', outputScale: '0.001', limitMin: '0', limitMax: '1000', prefix: 'tilt_lead', structure: 'direct-form-1',
};

const spec: DesignSpec = designSpecSchema.parse({
  compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 },
  sampleRateHz: 250,
  method: 'prewarp',
  prewarpHz: 1.2,
});

describe('parseRealNumber', () => {
  test.each([
    ['0.001', 0.001], ['1e-3', 0.001], [' 2 ', 2], ['-5', -5], ['−5', -5], ['.5', 0.5], ['3.3/4096', 3.3 / 4096], ['1 / 1000', 0.001],
  ])('%s → %d', (text, value) => expect(parseRealNumber(text)).toBe(value));
  test.each(['', 'abc', '1/0', '1/2/3', '0x10', '1,5', '/4', 'Infinity'])('%s → NaN', (text) => expect(parseRealNumber(text)).toBeNaN());
});

describe('prefixFromName', () => {
  test.each([
    ['Camera mount — tilt axis lead', 'camera_mount_tilt_axis_lead'],
    ['Feed pump — pressure PI-lead', 'feed_pump_pressure_pi_lead'],
    ['2 kHz pitch', 'c_2_khz_pitch'],
    ['Ünïcödé lead', 'unicode_lead'],
    ['—', 'controller'],
    ['int', 'int_ctrl'],
  ])('%s → %s', (name, prefix) => {
    expect(prefixFromName(name)).toBe(prefix);
    expect(implementationSettingsSchema.shape.prefix.safeParse(prefix).success).toBe(true);
  });
  test('long names are cut to 31 characters without a trailing underscore', () => {
    const p = prefixFromName('A very long design name for the second axis of the camera mount');
    expect(p.length).toBeLessThanOrEqual(31);
    expect(p.endsWith('_')).toBe(false);
  });
});

describe('buildSettings', () => {
  test('a valid form gives the settings with the ratio evaluated', () => {
    const { settings, errors } = buildSettings(form);
    expect(errors).toEqual({});
    expect(settings).toEqual({ wordLength: 16, inputScale: 3.3 / 4096, outputScale: 0.001, outputLimits: { min: 0, max: 1000 }, prefix: 'tilt_lead', structure: 'direct-form-1' });
  });

  test('each field gets the shared schema’s message', () => {
    const bad = { ...form, inputScale: 'volts', outputScale: '0', prefix: 'int' };
    const { settings, errors } = buildSettings(bad);
    expect(settings).toBeNull();
    const parsed = implementationSettingsSchema.safeParse({
      wordLength: 16, inputScale: NaN, outputScale: 0, outputLimits: { min: 0, max: 1000 }, prefix: 'int', structure: 'direct-form-1',
    });
    if (parsed.success) throw new Error('the schema accepted bad settings');
    const msg = (path: string) => parsed.error.issues.find((i) => i.path.join('.') === path)!.message;
    expect(errors.inputScale).toBe(msg('inputScale'));
    expect(errors.outputScale).toBe(msg('outputScale'));
    expect(errors.prefix).toBe(msg('prefix'));
    expect(errors.limitMin).toBeUndefined();
    expect(errors.limitMax).toBeUndefined();
  });

  test('limits are raw counts: whole numbers (fixed point), any real number (float32)', () => {
    expect(buildSettings({ ...form, limitMin: '10.5' }).errors).toEqual({ limitMin: 'Output limits are raw counts: whole numbers' });
    expect(buildSettings({ ...form, limitMin: 'low' }).errors.limitMin).toBe('Lower output limit must be a number');
    expect(buildSettings({ ...form, wordLength: 'float32', structure: 'transposed-direct-form-2', limitMin: '-0.5', limitMax: '0.5' }).errors).toEqual({});
  });

  test('reversed limits mark the upper limit; limits outside the word are refused', () => {
    expect(buildSettings({ ...form, limitMin: '500', limitMax: '100' }).errors.limitMax).toMatch(/greater than the lower/);
    expect(buildSettings({ ...form, limitMax: '40000' }).errors.limitMax).toMatch(/16-bit word/);
    expect(buildSettings({ ...form, wordLength: '32', limitMax: '40000' }).errors).toEqual({});
  });
});

describe('withWordLength', () => {
  test('float32 takes transposed direct form II, back to fixed point takes direct form I', () => {
    const f = withWordLength({ ...form, structure: 'offset-form-1' }, 'float32');
    expect(f.structure).toBe('transposed-direct-form-2');
    expect(withWordLength(f, '16').structure).toBe('direct-form-1');
    expect(withWordLength({ ...form, structure: 'offset-form-1' }, '32').structure).toBe('offset-form-1');
  });
  test('whole-word limits follow the word; chosen limits stay', () => {
    const w16 = wordRange(16), w32 = wordRange(32);
    const whole = { ...form, limitMin: String(w16.min), limitMax: String(w16.max) };
    expect(withWordLength(whole, '32')).toMatchObject({ limitMin: String(w32.min), limitMax: String(w32.max) });
    expect(withWordLength(form, '32')).toMatchObject({ limitMin: '0', limitMax: '1000' });
  });
  test('the default form validates', () => {
    expect(buildSettings(defaultForm('Camera mount — tilt axis lead')).errors).toEqual({});
  });
});

describe('errorsFromPaths', () => {
  test('paths of the preview, the spec and the schema map to the same fields', () => {
    expect(errorsFromPaths([{ path: 'settings.prefix', message: 'a' }])).toEqual({ prefix: 'a' });
    expect(errorsFromPaths([{ path: 'spec.implementation.outputLimits.min', message: 'b' }])).toEqual({ limitMin: 'b' });
    expect(errorsFromPaths([{ path: 'outputScale', message: 'c' }, { path: 'outputScale', message: 'second' }])).toEqual({ outputScale: 'c' });
  });
  test('other paths are kept as general messages', () => {
    expect(errorsFromPaths([{ path: 'compensator.poles.0', message: 'beyond Nyquist' }, { path: 'spec.implementation', message: 'missing' }])).toEqual({
      general: ['compensator.poles.0: beyond Nyquist', 'missing'],
    });
  });
});

describe('saved settings, requests and specs', () => {
  const settings = buildSettings(form).settings!;

  test('round trip: settings → form → settings', () => {
    expect(buildSettings(formFromSettings(settings)).settings).toEqual(settings);
  });

  test('savedSettings reads valid settings and refuses others', () => {
    expect(savedSettings({ implementation: settings })).toEqual(settings);
    expect(savedSettings({ implementation: undefined })).toBeNull();
    expect(savedSettings({ implementation: { ...settings, wordLength: 12 } as unknown as typeof settings })).toBeNull();
  });

  test('sameSettings: a missing structure equals its default; any field change differs', () => {
    const { structure: _s, ...noStructure } = settings;
    expect(sameSettings(settings, noStructure)).toBe(true);
    expect(sameSettings(settings, { ...settings, outputScale: 0.002 })).toBe(false);
    expect(sameSettings(settings, { ...settings, structure: 'offset-form-1' })).toBe(false);
    expect(sameSettings(settings, { ...settings, outputLimits: { min: 0, max: 999 } })).toBe(false);
    expect(sameSettings(null, settings)).toBe(false);
    expect(sameSettings(null, null)).toBe(true);
  });

  test('the preview request carries the saved design and validates with the API schema', () => {
    const body = implementRequestFor(spec, settings);
    expect(body).toMatchObject({ compensator: spec.compensator, sampleRateHz: 250, method: 'prewarp', prewarpHz: 1.2 });
    expect(implementRequestSchema.safeParse(body).success).toBe(true);
    const { prewarpHz: _p, ...noPrewarp } = spec;
    expect('prewarpHz' in implementRequestFor({ ...noPrewarp, method: 'tustin' }, settings)).toBe(false);
  });

  test('the saved spec keeps the design and holds the settings', () => {
    const next = specWithSettings(spec, settings);
    expect(designSpecSchema.safeParse(next).success).toBe(true);
    expect(next.compensator).toEqual(spec.compensator);
    expect(savedSettings(next)).toEqual(settings);
  });
});
