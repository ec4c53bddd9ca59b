import { createHash } from 'node:crypto';
import { buildBundle, ZIP_DATE } from '../../../server/codegen';
import { DESIGNS, VARIANTS, discreteOf, settingsFor } from '../fixed-point/designs';

const sha = (s: string | Buffer) => createHash('sha256').update(s).digest('hex');
const input = (versionNumber = 3, variant = VARIANTS[0]) => ({
  designName: 'Gimbal pitch lead', versionNumber, method: 'tustin' as const, sampleRateHz: DESIGNS[0].sampleRateHz,
  compensatorAsEntered: DESIGNS[0].entered, discrete: discreteOf(DESIGNS[0]), settings: settingsFor(variant, 'gimbal_pitch'),
});

describe('code bundle', () => {
  it('has exactly the layout of the bundle contract', async () => {
    const b = await buildBundle(input());
    expect(b.fileName).toBe('gimbal_pitch-v3.zip');
    expect(b.files.map((f) => f.path)).toEqual([
      'README.md', 'manifest.json', 'include/gimbal_pitch.h', 'src/gimbal_pitch.c', 'test/test_gimbal_pitch.c', 'test/vectors.csv', 'Makefile',
    ]);
    const csv = b.files.find((f) => f.path === 'test/vectors.csv')!.content;
    expect(csv.split('\n')[0]).toBe('n,u_raw,y_raw,u,y');
    const mk = b.files.find((f) => f.path === 'Makefile')!.content;
    expect(mk).toContain('-std=c99 -Wall -Wextra -Wpedantic -Wconversion -Werror');
    expect(mk).toMatch(/^test:/m);
    // Entries in the zip: one top folder, fixed order (local file headers start with PK\x03\x04).
    const names: string[] = [];
    for (let i = 0; i + 30 < b.zip.length; i++) {
      if (b.zip.readUInt32LE(i) === 0x04034b50) {
        const n = b.zip.readUInt16LE(i + 26), e = b.zip.readUInt16LE(i + 28);
        names.push(b.zip.subarray(i + 30, i + 30 + n).toString('utf8'));
        i += 29 + n + e;
      }
    }
    expect(names).toEqual(b.files.map((f) => `gimbal_pitch-v3/${f.path}`));
    expect(ZIP_DATE.toISOString()).toBe('2020-01-01T00:00:00.000Z');
  });

  it('records the SHA-256 of every other file and the contract fields in the manifest', async () => {
    const b = await buildBundle(input());
    const m = JSON.parse(b.files.find((f) => f.path === 'manifest.json')!.content);
    for (const f of b.files) if (f.path !== 'manifest.json') expect(m.files[f.path]).toBe(sha(f.content));
    expect(Object.keys(m.files)).toHaveLength(6);
    expect(m.design).toEqual({ name: 'Gimbal pitch lead', version: 3 });
    expect(m.method).toBe('tustin');
    expect(m.sampleRateHz).toBe(500);
    expect(m.compensator).toEqual(DESIGNS[0].entered);
    expect(m.discrete.num).toEqual(discreteOf(DESIGNS[0]).tf.num);
    expect(m.implementation.wordLength).toBe(16);
    expect(m.implementation.inputScale).toBeCloseTo(3.3 / 4096, 15);
    expect(m.implementation.outputLimits).toEqual({ min: -10000, max: 10000 });
    expect(m.implementation.sections[0].groups[0].terms[0]).toEqual(expect.objectContaining({ name: 'b0', integer: expect.any(Number) }));
    expect(m.generator.version).toMatch(/^\d+\.\d+\.\d+$/);
  });

  it('gives byte-identical zips for the same input and different ones otherwise', async () => {
    const a = await buildBundle(input());
    const b = await buildBundle(input());
    expect(b.zip.equals(a.zip)).toBe(true);
    expect(b.sha256).toBe(a.sha256);
    expect(a.sha256).toBe(sha(a.zip));
    const c = await buildBundle(input(4));
    expect(c.sha256).not.toBe(a.sha256);
    const d = await buildBundle(input(3, VARIANTS[2]));
    expect(d.sha256).not.toBe(a.sha256);
  });

  it('puts the cautions and provenance in the header and README, and no floating point in fixed builds', async () => {
    const b = await buildBundle(input());
    const h = b.files.find((f) => f.path === 'include/gimbal_pitch.h')!.content;
    const readme = b.files.find((f) => f.path === 'README.md')!.content;
    const src = b.files.find((f) => f.path === 'src/gimbal_pitch.c')!.content;
    for (const raw of [h, readme]) {
      const text = raw.replace(/\n \*/g, ' ').replace(/\n>/g, ' ').replace(/\s+/g, ' ');
      expect(text).toMatch(/verify it on the target with current and travel limits in place/i);
      expect(text).toMatch(/not certified for safety-related use/);
      expect(text).toMatch(/functional-safety standard and the local codes and licensed engineering practice/);
      expect(text).toContain('Gimbal pitch lead');
    }
    expect(h).toContain('#ifndef GIMBAL_PITCH_H');
    expect(h).toContain('extern "C"');
    expect(h.replace(/\n \*/g, " ")).toMatch(/Tustin \(bilinear\)\s+at 500 Hz/);
    expect(src).not.toMatch(/\b(float|double)\b/);
    expect(src).toMatch(/gimbal_pitch_step\(gimbal_pitch_state \*st, int16_t u\)/);
  });

  it('refuses bad settings with a ZodError naming the field', async () => {
    await expect(buildBundle({ ...input(), settings: { ...settingsFor(VARIANTS[0], 'int') } })).rejects.toThrow(/keyword/);
  });
});
