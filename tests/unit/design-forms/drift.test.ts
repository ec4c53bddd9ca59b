import type { DiscretizeResponse, MethodResult, RootInfo } from '../../../schemas/discretize';
import { DEFAULT_TOLERANCES } from '../../../schemas/design';
import { bestOf, buildDriftTable, recommendedMethod, relativeChangePercent, rootDriftPercent } from '../../../components/design/drift';

const info = (s: { re: number; im: number } | null, continuous: { re: number; im: number } | null): RootInfo => ({
  z: null,
  s,
  continuous,
  dampingRatio: null,
  naturalFreqRadPerSec: null,
  naturalFreqDriftPercent: null,
  dampingRatioDrift: null,
});

function method(name: MethodResult['method'], over: Partial<MethodResult>): MethodResult {
  return {
    method: name,
    num: [1, 0],
    den: [1, -0.5],
    gain: 1,
    zeros: [],
    poles: [],
    zeroInfo: [],
    poleInfo: [],
    dcGain: 2,
    stable: true,
    marginal: false,
    prewarpRadPerSec: null,
    response: { magnitudeDb: [], phaseDeg: [] },
    maxMagnitudeErrorDb: 0,
    maxMagnitudeErrorAtHz: 1,
    maxPhaseErrorDeg: 0,
    maxPhaseErrorAtHz: 1,
    ...over,
  };
}

function answer(methods: DiscretizeResponse['methods']): DiscretizeResponse {
  return {
    sampleRateHz: 100,
    periodSec: 0.01,
    nyquistHz: 50,
    bandHz: 12.5,
    prewarpHz: null,
    delaySamples: 0,
    frequencyHz: [],
    continuous: { zeros: [], poles: [], gain: 1, numDescending: [1], denDescending: [1, 1], zeroInfo: [], poleInfo: [], dcGain: 2, response: { magnitudeDb: [], phaseDeg: [] } },
    methods,
    warnings: [],
  };
}

describe('root drift', () => {
  it('is |s − s_c| / |s_c| in percent', () => {
    // s_c = −10, s = −9.5 + 0j: 5 %; s_c = −3 + 4j (|s_c| = 5), s = −3 + 4.5j: 10 %
    expect(rootDriftPercent(info({ re: -9.5, im: 0 }, { re: -10, im: 0 }))).toBeCloseTo(5, 12);
    expect(rootDriftPercent(info({ re: -3, im: 4.5 }, { re: -3, im: 4 }))).toBeCloseTo(10, 12);
  });
  it('handles an integrator mapped exactly (0 → 0) and roots without a continuous origin', () => {
    expect(rootDriftPercent(info({ re: 0, im: 0 }, { re: 0, im: 0 }))).toBe(0);
    expect(rootDriftPercent(info({ re: -1e-3, im: 0 }, { re: 0, im: 0 }))).toBe(Infinity);
    expect(rootDriftPercent(info({ re: -1, im: 0 }, null))).toBeNull();
    expect(rootDriftPercent(info(null, { re: -1, im: 0 }))).toBe(Infinity);
  });
  it('compares DC gains that may be infinite (null)', () => {
    expect(relativeChangePercent(2.02, 2)).toBeCloseTo(1, 10);
    expect(relativeChangePercent(null, null)).toBe(0);
    expect(relativeChangePercent(5, null)).toBe(Infinity);
  });
});

describe('best per row', () => {
  it('marks the lowest score, keeps ties, and marks nothing when all are equal', () => {
    expect(bestOf({ tustin: { text: '', score: 2 }, zoh: { text: '', score: 1 }, matched: { text: '', score: 1 } })).toEqual(['zoh', 'matched']);
    expect(bestOf({ tustin: { text: '', score: 0 }, zoh: { text: '', score: 0 } })).toEqual([]);
    expect(bestOf({ tustin: { text: '', score: null }, zoh: { text: '', score: 3 } })).toEqual([]);
  });

  const table = buildDriftTable(
    answer({
      tustin: method('tustin', { poleInfo: [info({ re: -9.9, im: 0 }, { re: -10, im: 0 })], maxMagnitudeErrorDb: 0.4, maxPhaseErrorDeg: 2 }),
      matched: method('matched', { poleInfo: [info({ re: -10, im: 0 }, { re: -10, im: 0 })], maxMagnitudeErrorDb: -1.5, maxPhaseErrorDeg: 9 }),
      'backward-euler': method('backward-euler', { poleInfo: [info({ re: -8, im: 0 }, { re: -10, im: 0 })], dcGain: 2.2, maxMagnitudeErrorDb: 3, maxPhaseErrorDeg: 20 }),
    }),
    { ...DEFAULT_TOLERANCES },
  );
  const rowOf = (key: string) => table.rows.find((r) => r.key === key)!;

  it('picks the method nearest the continuous design in each row', () => {
    expect(table.methods).toEqual(['tustin', 'matched', 'backward-euler']);
    expect(rowOf('pole-drift').best).toEqual(['matched']);
    expect(rowOf('mag-error').best).toEqual(['tustin']); // |0.4| < |−1.5| < |3|
    expect(rowOf('phase-error').best).toEqual(['tustin']);
    expect(rowOf('dc-gain').best).toEqual(['tustin', 'matched']);
    expect(rowOf('stability').best).toEqual([]);
  });
  it('flags figures beyond tolerance and recommends a method within tolerance', () => {
    expect(rowOf('pole-drift').cells['backward-euler']!.beyond).toBe(true); // 20 % > 5 %
    expect(rowOf('dc-gain').cells['backward-euler']!.text).toContain('10 %');
    expect(rowOf('mag-error').cells.matched!.beyond).toBe(true); // 1.5 dB > 1 dB
    expect(table.withinTolerance).toEqual({ tustin: true, matched: false, 'backward-euler': false });
    expect(recommendedMethod(table)).toBe('tustin');
  });
  it('adds loop rows only with a plant', () => {
    expect(table.rows.some((r) => r.key === 'phase-margin')).toBe(false);
  });
});
