/**
 * Plotted phases against tests/fixtures/phase-unwrap.json, written by the committed script
 * tests/fixtures/generate_phase_fixtures.py: the response by scipy.signal (freqs_zpk,
 * freqz_zpk, freqz; discrete models by bilinear_zpk, cont2discrete and the matched rule)
 * on a dense path, unwrapped by numpy.unwrap and read at the grid points. A phase is
 * compared up to one constant multiple of 360° (its starting branch), and may not step by
 * more than 180° between grid points except where a root lies on the contour.
 */
import data from '../../fixtures/phase-unwrap.json';
import { continuousResponse, discreteResponse } from '../../../server/dsp/analysis';
import { runDiscretize } from '../../../server/dsp/run';
import { discretizeRequestSchema, type DiscretizeRequestBody } from '../../../schemas/discretize';
import type { Complex } from '../../../server/dsp/types';

type Method = 'tustin' | 'prewarp' | 'matched' | 'zoh' | 'backward-euler';
type ApiCase = {
  name: string;
  request: DiscretizeRequestBody;
  frequencyHz: number[];
  continuousPhaseDeg: number[];
  methods: Record<Method, { phaseDeg: number[]; maxPhaseErrorDeg: number }>;
};
type DirectCase = { name: string; plane: 's' | 'z'; zeros: Complex[]; poles: Complex[]; gain: number; sampleRateHz?: number; frequencyHz: number[]; phaseDeg: number[]; onContour: number[] };
const api = (data as unknown as { api: ApiCase[] }).api;
const direct = (data as unknown as { direct: DirectCase[] }).direct;
const METHODS: Method[] = ['tustin', 'prewarp', 'matched', 'zoh', 'backward-euler'];

/** Phases agree with the reference to 1e-6° after one whole-turn offset, which may change only in the intervals listed (a root on the contour there), by one turn each. */
function expectSameUpToTurns(ours: number[], ref: number[], contourIntervals: number[] = []) {
  expect(ours).toHaveLength(ref.length);
  let k = Math.round((ours[0] - ref[0]) / 360);
  let worst = { dev: 0, at: 0 }; // at: the grid point, shown when the check fails
  for (let i = 0; i < ref.length; i++) {
    if (i > 0 && contourIntervals.includes(i - 1)) {
      const k2 = Math.round((ours[i] - ref[i]) / 360);
      expect(Math.abs(k2 - k)).toBeLessThanOrEqual(1);
      k = k2;
    }
    const dev = Math.abs(ours[i] - ref[i] - 360 * k);
    if (!(dev <= worst.dev)) worst = { dev, at: i };
  }
  expect(worst.dev).toBeLessThanOrEqual(1e-6);
}

/** The largest step between neighbouring grid points, outside the listed intervals. */
function largestStep(p: number[], except: number[] = []): number {
  let m = 0;
  for (let i = 1; i < p.length; i++) if (!except.includes(i - 1)) m = Math.max(m, Math.abs(p[i] - p[i - 1]));
  return m;
}

describe('compute API phase plots against scipy + numpy.unwrap', () => {
  it.each(api.map((c) => [c.name, c] as const))('%s: every plotted phase as numpy.unwrap gives it, and the largest phase error in the band', (_name, c) => {
    const res = runDiscretize(discretizeRequestSchema.parse(c.request));
    // the grid of the reference (logGrid as the generator writes it out)
    const gridDev = Math.max(...res.frequencyHz.map((f, i) => Math.abs(f - c.frequencyHz[i]) / f));
    expect(gridDev).toBeLessThanOrEqual(1e-13);
    expectSameUpToTurns(res.continuous.response.phaseDeg, c.continuousPhaseDeg);
    expect(largestStep(res.continuous.response.phaseDeg)).toBeLessThan(180);
    for (const m of METHODS) {
      const ours = res.methods[m]!.response.phaseDeg;
      expectSameUpToTurns(ours, c.methods[m].phaseDeg);
      expect(largestStep(ours)).toBeLessThan(180);
      // of the unwrapped curves, the discrete one shifted by 360°k to start beside the continuous one (DESIGN.md)
      expect(Math.abs(res.methods[m]!.maxPhaseErrorDeg - c.methods[m].maxPhaseErrorDeg)).toBeLessThanOrEqual(1e-6);
    }
  });
});

describe('responses of given roots against scipy + numpy.unwrap', () => {
  it.each(direct.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const zpk = { zeros: c.zeros, poles: c.poles, gain: c.gain };
    const omegas = c.frequencyHz.map((f) => 2 * Math.PI * f);
    const ours = c.plane === 's' ? continuousResponse(zpk, omegas).phaseDeg : discreteResponse(zpk, omegas, 1 / c.sampleRateHz!).phaseDeg;
    expectSameUpToTurns(ours, c.phaseDeg, c.onContour);
    expect(largestStep(ours, c.onContour)).toBeLessThan(180);
    // a root on the contour: a step of 180° (either way) plus the smooth change across the interval
    for (const i of c.onContour) expect(Math.abs(Math.abs(ours[i + 1] - ours[i]) - 180)).toBeLessThan(5);
  });
});

describe('a root within rounding of the contour', () => {
  it('steps the same way in the continuous and the discrete phase: poles at 1e-200 ± 8.72j answer as poles at ±8.72j (a perturbation far below rounding cannot move a response)', () => {
    // The poles sit on the jω axis, their Tustin images on the unit circle (|z| = 1 up to
    // rounding). Taken at their exact sides (right of the axis; on or inside the circle) the
    // two phases would step 180° in opposite directions there and differ by 360° beyond.
    const body = (re: number): DiscretizeRequestBody => ({
      compensator: { form: 'zpk', zeros: [-3, { re: -4, im: 30 }, { re: -4, im: -30 }], poles: [{ re, im: 8.72 }, { re, im: -8.72 }, -50], gain: 5 },
      sampleRateHz: 100, prewarpHz: 1, bandHz: 49.9, methods: ['tustin', 'matched', 'zoh'],
    });
    const onAxis = runDiscretize(discretizeRequestSchema.parse(body(0)));
    const nearAxis = runDiscretize(discretizeRequestSchema.parse(body(1e-200)));
    const dev = (a: number[], b: number[]) => Math.max(...a.map((v, i) => Math.abs(v - b[i])));
    expect(dev(nearAxis.continuous.response.phaseDeg, onAxis.continuous.response.phaseDeg)).toBeLessThan(1e-9);
    // the step at the poles (≈ 1.39 Hz) is the only one above 180° (the zeros −4 ± 30j map inside
    // the circle, whose principal angle jumped by 360° near 91 Hz before)
    const at = nearAxis.frequencyHz.findIndex((f) => f > 8.72 / (2 * Math.PI)) - 1;
    expect(largestStep(nearAxis.continuous.response.phaseDeg, [at])).toBeLessThan(180);
    for (const m of ['tustin', 'matched', 'zoh'] as const) {
      expect(dev(nearAxis.methods[m]!.response.phaseDeg, onAxis.methods[m]!.response.phaseDeg)).toBeLessThan(1e-9);
      expect(Math.abs(nearAxis.methods[m]!.maxPhaseErrorDeg - onAxis.methods[m]!.maxPhaseErrorDeg)).toBeLessThan(1e-9);
      expect(largestStep(nearAxis.methods[m]!.response.phaseDeg, [at])).toBeLessThan(180);
      expect(nearAxis.methods[m]!.maxPhaseErrorDeg).toBeLessThan(180);
    }
  });
});
