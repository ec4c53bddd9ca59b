/**
 * The wire schemas of schemas/implementation-api.ts against the real fixed-point analysis:
 * whatever analyzeImplementation returns, sent through JSON (Infinity and NaN become null),
 * must parse, and the JSON Schema the OpenAPI document needs must be producible.
 */
import { z } from 'zod';
import { discretizeZpk, inputToZpk } from '../../../server/dsp';
import { analyzeImplementation } from '../../../server/fixed-point';
import { implementationSettingsSchema, type ImplementationSettingsInput } from '../../../schemas/implementation';
import {
  bundleFilesSchema,
  bundleInfoSchema,
  bundleResponseSchema,
  implementRequestSchema,
  implementResponseSchema,
  implementationAnalysisSchema,
} from '../../../schemas/implementation-api';
import type { CompensatorInput } from '../../../schemas/compensator';

const lead: CompensatorInput = { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 };
const doubleLead: CompensatorInput = { form: 'zpk', zeros: [-3, -5], poles: [-40, -60], gain: 30 };
const piLead: CompensatorInput = { form: 'zpk', zeros: [-2, -8], poles: [0, -50], gain: 12 };

const base: ImplementationSettingsInput = {
  wordLength: 16, inputScale: 3.3 / 4096, outputScale: 1 / 1000, outputLimits: { min: -1000, max: 1000 }, prefix: 'tilt_lead',
};

const cases: { name: string; c: CompensatorInput; fs: number; s: ImplementationSettingsInput }[] = [
  { name: 'lead 16-bit', c: lead, fs: 250, s: base },
  { name: 'lead 16-bit at a high rate (poles near z = 1)', c: lead, fs: 50_000, s: base },
  { name: 'double lead 32-bit offset form', c: doubleLead, fs: 2000, s: { ...base, wordLength: 32, structure: 'offset-form-1' } },
  { name: 'PI-lead 16-bit (a pole at z = 1)', c: piLead, fs: 1000, s: base },
  { name: 'lead float32', c: lead, fs: 250, s: { ...base, wordLength: 'float32', outputLimits: { min: -1, max: 1 } } },
];

describe.each(cases)('$name', ({ c, fs, s }) => {
  const settings = implementationSettingsSchema.parse(s);
  const discrete = discretizeZpk(inputToZpk(c), 'tustin', fs);
  const analysis = analyzeImplementation(discrete, settings);
  const wire: unknown = JSON.parse(JSON.stringify(analysis));

  test('the analysis, through JSON, parses with the wire schema', () => {
    const parsed = implementationAnalysisSchema.safeParse(wire);
    if (!parsed.success) throw new Error(JSON.stringify(parsed.error.issues.slice(0, 5)));
    expect(parsed.data.coefficients.length).toBe(analysis.coefficients.length);
    expect(parsed.data.poles.length).toBe(analysis.poles.length);
    expect(parsed.data.advice.candidates.length).toBe(analysis.advice.candidates.length);
  });

  test('the request for it is accepted', () => {
    expect(implementRequestSchema.safeParse({ compensator: c, sampleRateHz: fs, method: 'tustin', settings: s }).success).toBe(true);
  });
});

test('the wire schema rejects a shape the client could not show', () => {
  const settings = implementationSettingsSchema.parse(base);
  const analysis = JSON.parse(JSON.stringify(analyzeImplementation(discretizeZpk(inputToZpk(lead), 'tustin', 250), settings)));
  delete analysis.advice;
  expect(implementationAnalysisSchema.safeParse(analysis).success).toBe(false);
  analysis.advice = { recommended: null, candidates: [], offsetForm: null };
  analysis.warnings = [{ code: 'x', severity: 'fatal', message: 'm' }];
  expect(implementationAnalysisSchema.safeParse(analysis).success).toBe(false);
});

test('request checks of the compute API apply to the one method (roots below Nyquist, prewarp frequency)', () => {
  const r1 = implementRequestSchema.safeParse({ compensator: { form: 'zpk', zeros: [-3], poles: [-1800], gain: 25 }, sampleRateHz: 250, method: 'tustin', settings: base });
  expect(r1.success ? [] : r1.error.issues.map((i) => i.path.join('.'))).toEqual(['compensator.poles.0']);
  const r2 = implementRequestSchema.safeParse({ compensator: lead, sampleRateHz: 250, method: 'tustin', prewarpHz: 200, settings: base });
  expect(r2.success ? [] : r2.error.issues.map((i) => i.path.join('.'))).toEqual(['prewarpHz']);
  const r3 = implementRequestSchema.safeParse({ compensator: lead, sampleRateHz: 250, method: 'tustin', settings: { ...base, prefix: 'int' } });
  expect(r3.success ? [] : r3.error.issues.map((i) => i.path.join('.'))).toEqual(['settings.prefix']);
  // an unpaired complex root is reported once, by the compensator schema
  const r4 = implementRequestSchema.safeParse({ compensator: { form: 'zpk', zeros: [{ re: -3, im: 1 }], poles: [-18], gain: 25 }, sampleRateHz: 250, method: 'tustin', settings: base });
  expect(r4.success ? [] : r4.error.issues.map((i) => i.path.join('.'))).toEqual(['compensator.zeros.0']);
});

test('bundle metadata: a lower-case hex SHA-256 and a positive version number', () => {
  const good = { sha256: 'a'.repeat(64), fileName: 'tilt_lead-v3.zip', sizeBytes: 12_345, generatorVersion: '0.1.0', createdAt: '2025-01-01T00:00:00.000Z', versionNumber: 3 };
  expect(bundleResponseSchema.safeParse({ bundle: good }).success).toBe(true);
  expect(bundleInfoSchema.safeParse({ ...good, sha256: 'A'.repeat(64) }).success).toBe(false);
  expect(bundleInfoSchema.safeParse({ ...good, sha256: 'a'.repeat(63) }).success).toBe(false);
  expect(bundleInfoSchema.safeParse({ ...good, versionNumber: 0 }).success).toBe(false);
  expect(bundleFilesSchema.safeParse({ files: [{ path: 'README.md', content: '#' }] }).success).toBe(true);
});

test('every schema converts to JSON Schema for the OpenAPI document', () => {
  for (const s of [implementRequestSchema, implementResponseSchema, bundleResponseSchema, bundleFilesSchema]) {
    expect(() => z.toJSONSchema(s, { io: 'input' })).not.toThrow();
    expect(() => z.toJSONSchema(s)).not.toThrow();
  }
});
