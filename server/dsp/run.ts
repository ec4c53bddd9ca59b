import {
  defaultPrewarpRadPerSec,
  hasRootAtOrigin,
  type DiscretizeRequest,
  type DiscretizeResponse,
  type DspWarning,
  type LoopResult,
  type MethodResult,
  type StepResponse,
} from '../../schemas/discretize';
import { MAX_ROOT_MAGNITUDE, type CompensatorInput } from '../../schemas/compensator';
import { abs, cx } from './complex';
import { DspInputError } from './errors';
import {
  branchTurns,
  circleAngle,
  closedLoopPoles,
  continuousDcGain,
  continuousResponse,
  continuousStep,
  crossingGrid,
  discreteDcGain,
  discreteResponse,
  discreteStability,
  discreteStep,
  evaluator,
  findCrossings,
  closedLoopBandwidthRad,
  logGrid,
  pairRoots,
  phaseDegAt,
  PHASE_SLACK_DEG,
  pickMargins,
  responseAt,
  rootInfo,
  uniformStep,
  unitCircleGrid,
  zToS,
  type CrossingGrid,
  type Evaluator,
  type Response,
  type UnitCircleGrid,
} from './analysis';
import { inputToZpk, zpkToTfDescending } from './lti';
import { discretizeZpk, zohDiscretize, type DiscreteResult } from './methods';
import { polyMul, trimLeading } from './poly';
import type { Complex, MethodName, Zpk } from './types';

/**
 * The whole compute API answer for a parsed request (DESIGN.md "The compute API").
 * Throws DspInputError for bad input the schema cannot see (a tf-form root beyond
 * Nyquist, an ill-posed loop); never anything else for a request the schema accepted.
 */
export function runDiscretize(req: DiscretizeRequest): DiscretizeResponse {
  try {
    const res = run(req);
    const bad = firstNonFinite(res);
    if (bad !== null) {
      throw new DspInputError('this design overflows double precision; rescale it', [
        { path: '', message: `the answer would hold a non-finite number (at ${bad}); rescale the gains or the time unit` },
      ]);
    }
    return res;
  } catch (e) {
    if (e instanceof DspInputError) throw e;
    // Guard of the contract "never 5xx": an unforeseen numerical failure is reported as
    // bad input naming the whole request rather than escaping as a server error.
    throw new DspInputError('this design could not be analysed; check the compensator and the plant', [
      { path: '', message: e instanceof Error ? e.message : String(e) },
    ]);
  }
}

/** Path of the first NaN/±∞ in the answer, or null (a JSON answer cannot carry them). */
function firstNonFinite(res: DiscretizeResponse): string | null {
  // The long number arrays (grid, responses, steps) are checked by a tight loop; the
  // generic walk covers everything else and skips exactly those arrays.
  const bulk = bulkArrays(res);
  let bad = false;
  for (let i = 0; i < bulk.length && !bad; i++) bad = !finiteArray(bulk[i]);
  if (!bad) bad = hasNonFinite(res, new Set<unknown>(bulk));
  return bad ? pathOfNonFinite(res, 'answer') : null;
}

/** The answer's long arrays of numbers. */
function bulkArrays(res: DiscretizeResponse): number[][] {
  const out: number[][] = [res.frequencyHz, res.continuous.response.magnitudeDb, res.continuous.response.phaseDeg];
  if (res.continuousLoop) out.push(res.continuousLoop.step.timeSec, res.continuousLoop.step.output);
  for (const name in res.methods) {
    const m = res.methods[name as MethodName];
    if (!m) continue;
    out.push(m.response.magnitudeDb, m.response.phaseDeg);
    if (m.loop) out.push(m.loop.step.timeSec, m.loop.step.output);
  }
  return out;
}

function finiteArray(v: readonly number[]): boolean {
  // each sum stays 0 unless some v[i] is NaN or ±∞ (two sums: independent additions pipeline)
  let even = 0;
  let odd = 0;
  const n = v.length;
  let i = 0;
  for (; i + 1 < n; i += 2) {
    even += v[i] - v[i];
    odd += v[i + 1] - v[i + 1];
  }
  if (i < n) even += v[i] - v[i];
  return even === 0 && odd === 0;
}

/** Fast scan (no paths built): true when a NaN or ±∞ sits anywhere in v outside the arrays in `skip`. */
function hasNonFinite(v: unknown, skip: Set<unknown>): boolean {
  if (typeof v === 'number') return v - v !== 0;
  if (v === null || typeof v !== 'object') return false;
  if (Array.isArray(v)) {
    if (skip.has(v)) return false;
    for (let i = 0; i < v.length; i++) {
      const x = v[i];
      if (typeof x === 'number') {
        if (x - x !== 0) return true; // NaN and ±∞ give NaN
      } else if (x !== null && typeof x === 'object' && hasNonFinite(x, skip)) return true;
    }
    return false;
  }
  const o = v as Record<string, unknown>;
  for (const k in o) {
    const x = o[k];
    if (typeof x === 'number') {
      if (x - x !== 0) return true;
    } else if (x !== null && typeof x === 'object' && hasNonFinite(x, skip)) return true;
  }
  return false;
}

function pathOfNonFinite(v: unknown, path: string): string | null {
  if (typeof v === 'number') return Number.isFinite(v) ? null : path;
  if (v === null || typeof v !== 'object') return null;
  for (const [k, x] of Object.entries(v)) {
    const r = pathOfNonFinite(x, `${path}.${k}`);
    if (r) return r;
  }
  return null;
}

/** Continuous model: zpk plus descending polynomials (the entered ones for tf form). */
interface Continuous {
  zpk: Zpk;
  num: number[];
  den: number[];
}

function continuousModel(input: CompensatorInput, field: 'compensator' | 'plant'): Continuous {
  let zpk: Zpk;
  try {
    zpk = inputToZpk(input);
  } catch {
    throw new DspInputError(`the ${field} polynomials cannot be factored`, [
      { path: `${field}.den`, message: 'the coefficients span too wide a range; rescale the polynomial (e.g. time in ms, frequency in krad/s)' },
    ]);
  }
  for (const [key, roots] of [['num', zpk.zeros], ['den', zpk.poles]] as const) {
    if (roots.some((r) => !(abs(r) <= MAX_ROOT_MAGNITUDE))) {
      throw new DspInputError(`a ${field} root lies beyond ${MAX_ROOT_MAGNITUDE} rad/s`, [
        { path: `${field}.${key}`, message: `every root must lie within ${MAX_ROOT_MAGNITUDE} rad/s; rescale the polynomial` },
      ]);
    }
  }
  if (input.form === 'tf') {
    const lead = input.den[0];
    return { zpk, num: trimLeading(input.num).map((v) => v / lead), den: input.den.map((v) => v / lead) };
  }
  return { zpk, ...zpkToTfDescending(zpk) };
}

const BYINDEX: Record<MethodName, boolean> = { tustin: true, prewarp: true, 'backward-euler': true, matched: true, zoh: false };

function run(req: DiscretizeRequest): DiscretizeResponse {
  const fs = req.sampleRateHz;
  const T = 1 / fs;
  const nyqHz = fs / 2;
  const nyqRad = Math.PI * fs;
  const warnings: DspWarning[] = [];
  const comp = continuousModel(req.compensator, 'compensator');

  // tf-form roots are known only now: the Nyquist rule of DESIGN.md again.
  if (req.compensator.form === 'tf') {
    const bad: { path: string; message: string }[] = [];
    for (const [key, roots] of [['num', comp.zpk.zeros], ['den', comp.zpk.poles]] as const) {
      for (const r of roots) {
        const m = abs(r);
        if (m >= nyqRad) {
          bad.push({
            path: `compensator.${key}`,
            message: `the ${key === 'num' ? 'zero' : 'pole'} s = ${fmtC(r)} rad/s (|s| = ${m.toPrecision(6)}) is at or beyond Nyquist (π·fs = ${nyqRad.toPrecision(6)} rad/s); use a sample rate above ${(m / Math.PI).toPrecision(6)} Hz`,
          });
        }
      }
    }
    if (bad.length) throw new DspInputError('a compensator root lies at or beyond Nyquist', bad);
  }

  const w0 = req.prewarpHz !== undefined ? 2 * Math.PI * req.prewarpHz : defaultPrewarpRadPerSec(req.compensator);
  const rootAtOrigin = hasRootAtOrigin(req.compensator);

  // ---- warnings: rules of practice
  // Common practice: keep compensator corners below fs/10 so warping and sampling
  // delay stay small (corners up to fs/2 are accepted; at or beyond it is refused).
  const corners = [...comp.zpk.zeros, ...comp.zpk.poles].map((r) => abs(r) / (2 * Math.PI));
  const topCorner = Math.max(0, ...corners);
  if (topCorner > fs / 10) {
    warnings.push({
      code: 'corner-near-rate',
      message: `the compensator's highest corner, ${fmt(topCorner)} Hz, is above fs/10 = ${fmt(fs / 10)} Hz; common practice keeps corners below a tenth of the sample rate (use ≥ ${fmt(10 * topCorner)} Hz)`,
    });
  }
  if (req.prewarpHz !== undefined && !req.methods.includes('prewarp') && !(req.methods.includes('matched') && rootAtOrigin)) {
    warnings.push({
      code: 'prewarp-unused',
      message: 'prewarpHz is used only by the prewarp method (and by matched when the DC gain is 0 or infinite); none of the chosen methods uses it here',
    });
  }
  if (req.delaySamples === 1 && !req.plant) {
    warnings.push({ code: 'delay-unused', message: 'delaySamples applies to the loop with a plant; no plant was given, so it is not used' });
  }

  // ---- frequency grid (Hz), log-spaced up to Nyquist
  const positive = corners.filter((c) => c > 0);
  const lowHz = Math.max(nyqHz * 1e-7, Math.min(nyqHz / 1e3, ...(positive.length ? [Math.min(...positive) / 20] : [])));
  const frequencyHz = logGrid(lowHz, nyqHz, req.responsePoints);
  const omegas = frequencyHz.map((f) => 2 * Math.PI * f);
  const bandHz = req.bandHz ?? nyqHz / 4;
  const contEval = evaluator(comp.zpk);
  const contResp = continuousResponse(contEval, omegas, T);
  // e^{jωT} on the grid, shared by every method's response
  const circle = unitCircleGrid(omegas, T);
  // the continuous compensator at the band edge, shared by every method's band errors; its
  // phase on the branch of the plotted one (whole turns counted from grid point 0; 1/T is
  // the scale of a root on the jω axis, as continuousResponse takes it)
  const wBand = 2 * Math.PI * bandHz;
  const contTurns0 = branchTurns(contEval, 0, omegas[0], false, 1 / T);
  const contAtBand = { db: responseAt(contEval, cx(0, wBand)).db, deg: phaseDegAt(contEval, 0, wBand, false, contTurns0, 1 / T) };

  // ---- plant and continuous loop
  let plantOut: DiscretizeResponse['plant'];
  let continuousLoop: LoopResult | undefined;
  let plantD: DiscreteResult | undefined;
  let plantC: Continuous | undefined;
  let contLoopPoles: Complex[] = [];
  let stepSamples = 0;
  let fullSamples = 0;
  if (req.plant) {
    plantC = continuousModel(req.plant, 'plant');
    plantD = zohDiscretize(plantC.zpk, T);
    plantOut = {
      zeros: plantC.zpk.zeros,
      poles: plantC.zpk.poles,
      gain: plantC.zpk.gain,
      discrete: { num: plantD.tf.num, den: plantD.tf.den, zeros: plantD.zpk.zeros, poles: plantD.zpk.poles, gain: plantD.zpk.gain },
    };
    const lNum = polyMul(comp.num, plantC.num);
    const lDen = polyMul(comp.den, plantC.den);
    const cl = closedLoopPoles(lNum, lDen);
    if (!(Math.abs(cl.lead) > 1e-12 * Math.max(1, Math.abs(lDen[0])))) throw illPosed();
    contLoopPoles = cl.poles;
    const loopZpk: Zpk = { zeros: [...comp.zpk.zeros, ...plantC.zpk.zeros], poles: [...comp.zpk.poles, ...plantC.zpk.poles], gain: comp.zpk.gain * plantC.zpk.gain };
    const clZpk: Zpk = { zeros: loopZpk.zeros, poles: cl.poles, gain: loopZpk.gain / cl.lead };
    const stable = cl.poles.every((p) => p.re < 0);
    // grid of the continuous loop: well beyond every root and beyond Nyquist
    const rootsAll = [...loopZpk.zeros, ...loopZpk.poles, ...cl.poles].map(abs).filter((m) => m > 0);
    const wLo = Math.min(omegas[0], ...rootsAll.map((m) => m / 100));
    const wHi = Math.max(10 * nyqRad, ...rootsAll.map((m) => m * 100));
    const le = evaluator(loopZpk);
    const crossings = findCrossings(le, crossingGrid(wLo, wHi, 300, null));
    const horizon = stepHorizon(cl.poles, T);
    const nc = Math.min(1000, 4 * horizon.steps);
    const h = (horizon.steps * T) / nc;
    const y = stable ? continuousStep(clZpk, h, nc) : [];
    const fv = stable ? continuousDcGain(clZpk) : null;
    // figures of the whole simulation; the window shown is known only from its settling time
    const full = uniformStep(y, y.length, h, fv, 0, MAX_STEP_POINTS);
    // Window shown and simulated for the sampled loops: 2× the continuous settling time
    // (longer when a sampled loop has not settled in it).
    const settle = full.settlingTimeSec;
    stepSamples = settle !== null ? Math.max(20, Math.min(horizon.steps, Math.ceil((2 * settle) / T))) : horizon.steps;
    fullSamples = horizon.steps;
    const shown = Math.min(y.length, Math.floor((stepSamples * T) / h + 1e-9) + 1);
    const shownStep = uniformStep(y, 0, h, fv, shown, MAX_STEP_POINTS);
    shownStep.overshootPercent = full.overshootPercent;
    shownStep.riseTimeSec = full.riseTimeSec;
    shownStep.settlingTimeSec = full.settlingTimeSec;
    continuousLoop = {
      closedLoopPoles: cl.poles.map((p) => rootInfo(null, p, p)),
      stable,
      margins: pickMargins(crossings),
      step: shownStep,
    };
    // Common practice: sample 10–30× the closed-loop bandwidth; warn below 10×.
    const bw = closedLoopBandwidthRad(le, wLo, wHi);
    if (bw !== null && fs < (10 * bw) / (2 * Math.PI)) {
      warnings.push({
        code: 'rate-low-for-bandwidth',
        message: `the sample rate is ${fmt(fs / (bw / (2 * Math.PI)))}× the continuous closed-loop bandwidth (${fmt(bw / (2 * Math.PI))} Hz); common practice samples 10–30× the closed-loop bandwidth (use ≥ ${fmt((10 * bw) / (2 * Math.PI))} Hz)`,
      });
    }
  }

  // ---- methods
  const methods: DiscretizeResponse['methods'] = {};
  // crossover grid of the sampled loops: the same for every method
  const loopGrid = plantD ? crossingGrid(Math.min(omegas[0], Math.PI / T / 1e4), Math.PI / T, 200, T) : null;
  for (const method of req.methods) {
    const d = discretizeZpk(comp.zpk, method, fs, w0 !== null ? { prewarpRadPerSec: w0 } : {});
    const usesW0 = method === 'prewarp' || (method === 'matched' && rootAtOrigin);
    const zeroOrigin = pairRoots(d.zpk.zeros, comp.zpk.zeros, T, BYINDEX[method]);
    const poleOrigin = pairRoots(d.zpk.poles, comp.zpk.poles, T, true);
    const de = evaluator(d.zpk);
    const resp = discreteResponse(de, circle, T, contResp);
    const errs = bandErrors(contAtBand, contEval, contTurns0, de, T, frequencyHz, omegas, circle, bandHz, contResp, resp, resp.shiftDeg);
    const stab = discreteStability(d.zpk.poles);
    const result: MethodResult = {
      method,
      num: d.tf.num,
      den: d.tf.den,
      gain: d.zpk.gain,
      zeros: d.zpk.zeros,
      poles: d.zpk.poles,
      zeroInfo: d.zpk.zeros.map((z, i) => rootInfo(z, zToS(z, T), zeroOrigin[i])),
      poleInfo: d.zpk.poles.map((p, i) => rootInfo(p, zToS(p, T), poleOrigin[i])),
      dcGain: d.dcGain,
      stable: stab.stable,
      marginal: stab.marginal,
      prewarpRadPerSec: usesW0 ? w0 : null,
      response: { magnitudeDb: resp.magnitudeDb, phaseDeg: resp.phaseDeg },
      ...errs,
    };
    if (plantD && plantC && continuousLoop && loopGrid) {
      const loop = discreteLoop(method, d, plantD, req.delaySamples, T, contLoopPoles, loopGrid, stepSamples, fullSamples);
      result.closedLoopPoles = loop.closedLoopPoles.map((p) => p.z as Complex);
      result.loop = loop;
      if (continuousLoop.stable && !loop.stable) {
        warnings.push({ code: 'loop-unstable-after-sampling', message: `${method}: the sampled loop is not stable although the continuous loop is` });
      }
    }
    methods[method] = result;
  }

  return {
    sampleRateHz: fs,
    periodSec: T,
    nyquistHz: nyqHz,
    bandHz,
    prewarpHz: w0 !== null ? w0 / (2 * Math.PI) : null,
    delaySamples: req.delaySamples,
    frequencyHz,
    continuous: {
      zeros: comp.zpk.zeros,
      poles: comp.zpk.poles,
      gain: comp.zpk.gain,
      numDescending: comp.num,
      denDescending: comp.den,
      zeroInfo: comp.zpk.zeros.map((z) => rootInfo(null, z, z)),
      poleInfo: comp.zpk.poles.map((p) => rootInfo(null, p, p)),
      dcGain: continuousDcGain(comp.zpk),
      response: contResp,
    },
    methods,
    ...(plantOut ? { plant: plantOut } : {}),
    ...(continuousLoop ? { continuousLoop } : {}),
    warnings,
  };
}

/** The continuous loop with the plant is ill-posed: 1 + C(s = ∞)·P(s = ∞) = 0. */
function illPosed(): DspInputError {
  return new DspInputError('the loop is ill-posed: 1 + C(∞)·P(∞) = 0', [
    { path: 'plant', message: 'the closed loop has no proper transfer function with this plant (1 + C·P vanishes at infinite frequency)' },
  ]);
}

/**
 * A sampled loop is ill-posed where the continuous one is not: 1 + C_d(z = ∞)·P_d(z = ∞) = 0
 * with C_d by `method` and P_d by ZOH (C_d(∞) is C at the s the method sends z = ∞ to, e.g.
 * C(2/T) for Tustin; without the delay only, which makes the loop strictly proper).
 */
function sampledIllPosed(method: MethodName): DspInputError {
  return new DspInputError(`the sampled loop of ${method} is ill-posed: 1 + C_d(z = ∞)·P_d(z = ∞) = 0`, [
    {
      path: 'plant',
      message: `with ${method}, the sampled closed loop has no proper transfer function with this plant (1 + C_d·P_d vanishes at z = ∞; C_d by ${method}, P_d by ZOH); a one-sample computation delay (delaySamples: 1) avoids it`,
    },
  ]);
}

/**
 * Largest |Δ dB| and |Δ deg| on grid points up to bandHz and at bandHz itself
 * (`rc`: the continuous response there, its phase by phaseDegAt). The phase errors are
 * those of the root-by-root phases (phaseDegAt: the principal root sums plus the whole
 * turns of the plotted branch, counted from grid point 0; `contTurns0` those of the
 * continuous grid point 0): the plotted phases may differ from them by PHASE_SLACK_DEG,
 * so a plotted error by twice that, and the grid points whose plotted error is within four
 * times that of the largest are evaluated again root by root (`cont`, `disc`: the
 * evaluators; the continuous point of grid point i is jω_i, the discrete one circle[i]).
 * Every other point's error is then below the largest, which with its first point is taken
 * among them: the same values as from the root-by-root phases at every point.
 */
function bandErrors(
  rc: { db: number; deg: number },
  cont: Evaluator,
  contTurns0: number,
  disc: Evaluator,
  T: number,
  fHz: number[],
  omegas: number[],
  circle: UnitCircleGrid,
  bandHz: number,
  c: Response,
  d: Response,
  shiftDeg: number,
) {
  let magV = 0;
  let magF = Math.min(bandHz, fHz[0]);
  let phV = 0;
  let phF = magF;
  const cm = c.magnitudeDb;
  const cp = c.phaseDeg;
  const dm = d.magnitudeDb;
  const dp = d.phaseDeg;
  let inBand = 0;
  let plotted = 0;
  for (let i = 0; i < fHz.length && fHz[i] <= bandHz; i++) {
    const em = Math.abs(dm[i] - cm[i]);
    if (em > magV) {
      magV = em;
      magF = fHz[i];
    }
    const ep = Math.abs(dp[i] - cp[i]);
    if (ep > plotted) plotted = ep;
    inBand = i + 1;
  }
  // each plotted error is within 2·PHASE_SLACK_DEG of the exact one (both phases may differ)
  const nearMax = plotted - 4 * PHASE_SLACK_DEG;
  const discTurns0 = fHz.length ? branchTurns(disc, circle.re[0], circle.im[0], true) : 0;
  for (let i = 0; i < inBand; i++) {
    if (!(Math.abs(dp[i] - cp[i]) >= nearMax)) continue;
    let dDeg = phaseDegAt(disc, circle.re[i], circle.im[i], true, discTurns0);
    if (shiftDeg !== 0) dDeg += shiftDeg;
    const ep = Math.abs(dDeg - phaseDegAt(cont, 0, omegas[i], false, contTurns0, 1 / T));
    if (ep > phV) {
      phV = ep;
      phF = fHz[i];
    }
  }
  const wt = circleAngle(2 * Math.PI * bandHz, T);
  const xr = Math.cos(wt);
  const xi = Math.sin(wt);
  const rdDb = responseAt(disc, cx(xr, xi)).db;
  const rdDeg = phaseDegAt(disc, xr, xi, true, discTurns0);
  const em = Math.abs(rdDb - rc.db);
  const ep = Math.abs(rdDeg + shiftDeg - rc.deg);
  if (em > magV) {
    magV = em;
    magF = bandHz;
  }
  if (ep > phV) {
    phV = ep;
    phF = bandHz;
  }
  return { maxMagnitudeErrorDb: magV, maxMagnitudeErrorAtHz: magF, maxPhaseErrorDeg: phV, maxPhaseErrorAtHz: phF };
}

/** Step window: ~8 time constants of the slowest continuous closed-loop pole, 20…2000 samples. */
function stepHorizon(poles: Complex[], T: number): { steps: number } {
  const decays = poles.map((p) => -p.re).filter((s) => s > 0);
  const slowest = decays.length ? Math.min(...decays) : 0;
  const seconds = slowest > 0 ? 8 / slowest : 200 * T;
  return { steps: Math.max(20, Math.min(MAX_STEP_SAMPLES, Math.ceil(seconds / T))) };
}
/** Longest simulated step (samples of T) and most points sent per step response. */
const MAX_STEP_SAMPLES = 2000;
const MAX_STEP_POINTS = 400;

/** Metrics on the full simulation; the arrays sent are thinned to ≤ MAX_STEP_POINTS (last point kept). */
function stepOut(y: number[], h: number, finalValue: number | null): StepResponse {
  return uniformStep(y, y.length, h, finalValue, y.length, MAX_STEP_POINTS);
}

/** The sampled loop: compensator `c` by `method`, plant by ZOH, optional one-sample delay. */
function discreteLoop(
  method: MethodName,
  c: DiscreteResult,
  p: DiscreteResult,
  delay: 0 | 1,
  T: number,
  contPoles: Complex[],
  grid: CrossingGrid,
  steps: number,
  maxSteps: number,
): LoopResult {
  const lNum = polyMul(c.tf.num, p.tf.num);
  const lDen = polyMul(c.tf.den, p.tf.den);
  const cl = closedLoopPoles(lNum, lDen, delay);
  if (!(Math.abs(cl.lead) > 1e-12)) throw sampledIllPosed(method);
  const loopZpk: Zpk = {
    zeros: [...c.zpk.zeros, ...p.zpk.zeros],
    poles: [...c.zpk.poles, ...p.zpk.poles, ...new Array(delay).fill(null).map(() => cx(0))],
    gain: c.zpk.gain * p.zpk.gain,
  };
  const stab = discreteStability(cl.poles);
  const origin = pairRoots(cl.poles, contPoles, T, false);
  const le = evaluator(loopZpk);
  const crossings = findCrossings(le, grid);
  const clZpk: Zpk = { zeros: loopZpk.zeros, poles: cl.poles, gain: loopZpk.gain / cl.lead };
  const dc = stab.stable ? discreteDcGain(clZpk) : null;
  let step = stepOut(stab.stable ? discreteStep(clZpk, steps) : [], T, dc);
  if (stab.stable && step.settlingTimeSec === null && maxSteps > steps) step = stepOut(discreteStep(clZpk, maxSteps), T, dc);
  return {
    closedLoopPoles: cl.poles.map((z, i) => rootInfo(z, zToS(z, T), origin[i])),
    stable: stab.stable,
    margins: pickMargins(crossings),
    step,
  };
}

const fmt = (v: number) => Number(v.toPrecision(3)).toString();
const fmtC = (r: Complex) => (r.im === 0 ? `${r.re.toPrecision(6)}` : `${r.re.toPrecision(6)}${r.im < 0 ? '−' : '+'}${Math.abs(r.im).toPrecision(6)}j`);
