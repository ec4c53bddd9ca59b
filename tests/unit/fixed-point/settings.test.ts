import { implementationSettingsSchema } from '../../../schemas/implementation';

const good = { wordLength: 16, inputScale: 3.3 / 4096, outputScale: 0.01, outputLimits: { min: -10000, max: 10000 }, prefix: 'gimbal_pitch' };
const issues = (v: unknown) => {
  const r = implementationSettingsSchema.safeParse(v);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
};

describe('implementation settings schema', () => {
  it('accepts good settings for each word length', () => {
    expect(issues(good)).toEqual([]);
    expect(issues({ ...good, wordLength: 32, outputLimits: { min: -100000, max: 100000 }, structure: 'offset-form-1' })).toEqual([]);
    expect(issues({ ...good, wordLength: 'float32', outputLimits: { min: -1.5, max: 1.5 } })).toEqual([]);
  });
  it.each([
    [{ prefix: 'int' }, 'prefix', /keyword/],
    [{ prefix: '9lives' }, 'prefix', /identifier/],
    [{ prefix: 'a'.repeat(32) }, 'prefix', /31/],
    [{ wordLength: 12 }, 'wordLength', /16, 32/],
    [{ outputLimits: { min: 500, max: -500 } }, 'outputLimits.max', /greater/],
    [{ outputLimits: { min: -40000, max: 100 } }, 'outputLimits.min', /16-bit/],
    [{ outputLimits: { min: -10.5, max: 100 } }, 'outputLimits.min', /whole/],
    [{ outputScale: 0 }, 'outputScale', /greater than 0/],
    [{ inputScale: Number.POSITIVE_INFINITY }, 'inputScale', /.+/],
    [{ inputScale: '0.1' }, 'inputScale', /number/],
    [{ structure: 'transposed-direct-form-2' }, 'structure', /float32/],
    [{ wordLength: 'float32', structure: 'direct-form-1' }, 'structure', /transposed/],
  ])('rejects %j at %s', (patch, path, message) => {
    const got = issues({ ...good, ...patch });
    const hit = got.find((i) => i.path === path);
    expect(hit).toBeDefined();
    expect(hit!.message).toMatch(message);
  });
});
