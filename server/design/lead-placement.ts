import type { CompensatorInput } from '../../schemas/compensator';
import { MAX_LEAD_ANGLE_DEG, type LeadPlacementRequest, type LeadPlacementResponse } from '../../schemas/lead-placement';
import { evalZpk, inputToZpk, polyFromRoots, polyMul, polyRoots, polyval, type Complex } from '../dsp';
import { polyAdd } from '../dsp/poly';
import { DspInputError } from '../dsp/errors';

/**
 * Lead placement by the root-locus conditions. Pure: no HTTP, no database.
 *
 * Loop: negative unity feedback around C(s)·G(s), C(s) = K(s + z)/(s + p) with z, p > 0
 * (DESIGN.md: zeros [−z], poles [−p]). A point s_d lies on the closed-loop locus when
 *   angle condition      ∠C(s_d) + ∠G(s_d) = ±180° (mod 360°),
 *   magnitude condition  |C(s_d)|·|G(s_d)| = 1.
 * The target pole is s_d = −ζωn + jωd, ωd = ωn√(1 − ζ²) (rad/s), in the upper half plane;
 * its conjugate follows because the loop is real.
 *
 * Angle deficiency: φ = 180° − ∠G(s_d), reduced into (−180°, 180°]. With
 * ψz = ∠(s_d + z) and ψp = ∠(s_d + p) (both in (0°, 180°) for real z, p and ωd > 0),
 * ∠C(s_d) = ψz − ψp, so the lead must satisfy ψz − ψp = φ; φ > 0 needs z < p (a lead).
 *
 * Where a point −x of the negative real axis is seen from s_d: ∠(s_d + x) = ψ means
 * tan ψ = ωd/(x − ζωn), i.e. x = ζωn + ωd·cot ψ. By the law of sines in the triangle
 * 0, s_d, −x (angle β = arccos ζ = 180° − θ at the origin, ψ at −x): x = ωn·sin(θ − ψ)/sin ψ.
 */

/**
 * A refusal naming the request fields it is about ("zeta", "wn", "zero", "plant"): bad input
 * the request schema cannot see, answered 400 like every compute input error.
 */
export class PlacementInputError extends DspInputError {
  constructor(message: string, issues: { path: string; message: string }[]) {
    super(message, issues);
    this.name = 'PlacementInputError';
  }
}

const DEG = 180 / Math.PI;
/** |φ| below this (degrees) counts as "already on the locus". */
const ON_LOCUS_DEG = 1e-6;
/** Rule of practice: other closed-loop poles and zeros count as far when their real part is this many times further left. */
const SEPARATION = 5;

/** Angle in degrees reduced into (−180°, 180°]. */
export function wrapDeg(a: number): number {
  let r = a % 360;
  if (r <= -180) r += 360;
  if (r > 180) r -= 360;
  return r;
}

/** G(s) at a complex point: product form for zpk, Horner of the polynomials for tf (no root finding). */
function plantAt(plant: CompensatorInput, s: Complex): Complex {
  if (plant.form === 'zpk') return evalZpk(inputToZpk(plant), s);
  const n = polyval(plant.num, s);
  const d = polyval(plant.den, s);
  const dd = d.re * d.re + d.im * d.im;
  return { re: (n.re * d.re + n.im * d.im) / dd, im: (n.im * d.re - n.re * d.im) / dd };
}

/** Plant polynomials in descending powers of s (tf as given; zpk expanded from its roots). */
function plantPolys(plant: CompensatorInput): { num: number[]; den: number[] } {
  if (plant.form === 'tf') return { num: plant.num, den: plant.den };
  const z = inputToZpk(plant);
  return { num: polyFromRoots(z.zeros).map((c) => c * z.gain), den: polyFromRoots(z.poles) };
}

/** Target pole s_d = −ζωn + jωn√(1 − ζ²) (rad/s). */
export function desiredPole(zeta: number, wn: number): Complex {
  return { re: -zeta * wn, im: wn * Math.sqrt(1 - zeta * zeta) };
}

/**
 * Bisector construction. θ = ∠s_d from the positive real axis (90° < θ < 180°).
 * At s_d draw the horizontal ray to the left (direction 180°) and the ray to the origin
 * (direction −β, β = 180° − θ). The angle between them, measured through the lower half
 * plane, is 180° − β = θ; its bisector points in the direction −β − θ/2. The rays at
 * ±φ/2 about the bisector meet the negative real axis at the zero (the ray nearer the
 * origin) and the pole. The point −x where a ray from s_d in direction δ (−180° < δ < 0°)
 * meets the axis sees s_d at ψ = δ + 180°. The zero's ray is δz = −β − θ/2 + φ/2, so
 *   ψz = 180° − β − θ/2 + φ/2 = (θ + φ)/2,   ψp = (θ − φ)/2,
 * and ψz − ψp = φ: the angle condition holds by construction. With x = ωn·sin(θ − ψ)/sin ψ:
 *   z = ωn·sin((θ − φ)/2)/sin((θ + φ)/2),   p = ωn·sin((θ + φ)/2)/sin((θ − φ)/2),
 * so z·p = ωn² (zero and pole symmetric about ωn on a log scale). For fixed φ, z/p as a
 * function of ψz is symmetric about ψz = (θ + φ)/2 (swap ψ ↔ θ + φ − ψ), which is its
 * stationary point and maximum: the bisector gives the largest z/p, i.e. the smallest
 * rise of high-frequency gain p/z for the angle supplied. Both are positive when φ < θ,
 * always so for φ < 90° < θ.
 */
export function bisectorLead(sd: Complex, phiRad: number): { zero: number; pole: number } {
  const wn = Math.hypot(sd.re, sd.im);
  const theta = Math.atan2(sd.im, sd.re);
  const psiZ = (theta + phiRad) / 2;
  const psiP = (theta - phiRad) / 2;
  return { zero: (wn * Math.sin(theta - psiZ)) / Math.sin(psiZ), pole: (wn * Math.sin(theta - psiP)) / Math.sin(psiP) };
}

/**
 * Zero fixed at −zero: ψz = ∠(s_d + zero), ψp = ψz − φ, pole = ζωn + ωd·cot ψp
 * (the point of the negative real axis that sees s_d at ψp). Null when ψp ≤ 0: the zero
 * lies too far left to supply φ with any finite pole.
 */
export function zeroAtLead(sd: Complex, phiRad: number, zero: number): { zero: number; pole: number } | null {
  const psiZ = Math.atan2(sd.im, sd.re + zero);
  const psiP = psiZ - phiRad;
  if (!(psiP > 0)) return null;
  return { zero, pole: -sd.re + sd.im / Math.tan(psiP) };
}

/**
 * The lead, its gain and the checks for a plant and a target (request already validated by
 * leadPlacementRequestSchema). Throws PlacementInputError for targets a single lead cannot reach.
 */
export function placeLead(req: LeadPlacementRequest): LeadPlacementResponse {
  const sd = desiredPole(req.zeta, req.wn);
  const target = `s_d = ${fmt(sd.re)} ± j${fmt(sd.im)} rad/s`;
  const g = plantAt(req.plant, sd);
  const gMag = Math.hypot(g.re, g.im);
  if (!Number.isFinite(gMag) || gMag === 0) {
    const why = gMag === 0 ? 'a zero' : 'a pole';
    throw new PlacementInputError(`The target ${target} is ${why} of the plant; choose another target`, [
      { path: 'zeta', message: `the target pole is ${why} of the plant` },
      { path: 'wn', message: `the target pole is ${why} of the plant` },
    ]);
  }
  const plantAngleDeg = Math.atan2(g.im, g.re) * DEG;
  const phiDeg = wrapDeg(180 - plantAngleDeg);

  if (Math.abs(phiDeg) <= ON_LOCUS_DEG) {
    const k = 1 / gMag;
    const msg = `No lead needed: the plant's locus already passes through ${target}; a gain alone does it, K = ${fmt(k)}`;
    throw new PlacementInputError(msg, [
      { path: 'zeta', message: msg },
      { path: 'wn', message: msg },
    ]);
  }
  if (phiDeg < 0) {
    const msg = `The target ${target} needs ${fmt(-phiDeg)}° of phase lag (or ${fmt(360 + phiDeg)}° of lead); one lead adds less than ${MAX_LEAD_ANGLE_DEG}° and cannot bring the locus there. Choose another target (often a lower ωn)`;
    throw new PlacementInputError(msg, [
      { path: 'zeta', message: msg },
      { path: 'wn', message: msg },
    ]);
  }
  if (phiDeg >= MAX_LEAD_ANGLE_DEG) {
    const msg = `The target ${target} needs ${fmt(phiDeg)}° of phase lead; one lead supplies less than ${MAX_LEAD_ANGLE_DEG}°. ${phiDeg < 2 * MAX_LEAD_ANGLE_DEG ? `Use two leads in series (about ${fmt(phiDeg / 2)}° each) or` : 'Choose'} a target with a lower ωn or a lower ζ`;
    throw new PlacementInputError(msg, [
      { path: 'zeta', message: msg },
      { path: 'wn', message: msg },
    ]);
  }

  const phi = phiDeg / DEG;
  let lead: { zero: number; pole: number };
  if (req.rule === 'zero-at') {
    const zero = req.zero as number; // the schema requires it for this rule
    const found = zeroAtLead(sd, phi, zero);
    if (!found || !Number.isFinite(found.pole) || found.pole > 1e12) {
      const most = Math.atan2(sd.im, sd.re + zero) * DEG;
      throw new PlacementInputError(`A zero at −${fmt(zero)} rad/s supplies at most ${fmt(most)}° at ${target}, less than the ${fmt(phiDeg)}° needed`, [
        { path: 'zero', message: `too far left: a zero at −${fmt(zero)} can supply at most ${fmt(most)}° of the ${fmt(phiDeg)}° needed; move it right (a smaller value)` },
      ]);
    }
    lead = found;
  } else {
    lead = bisectorLead(sd, phi);
  }

  // magnitude condition: K·|s_d + z|/|s_d + p|·|G(s_d)| = 1
  const cUnit = Math.hypot(sd.re + lead.zero, sd.im) / Math.hypot(sd.re + lead.pole, sd.im);
  const gain = 1 / (cUnit * gMag);

  // independent check: C(s_d)·G(s_d) evaluated afresh
  const loop = evalZpk({ zeros: [{ re: -lead.zero, im: 0 }], poles: [{ re: -lead.pole, im: 0 }], gain }, sd);
  const cg = { re: loop.re * g.re - loop.im * g.im, im: loop.re * g.im + loop.im * g.re };

  // closed loop: den(CG) + num(CG), descending powers of s
  const pp = plantPolys(req.plant);
  const numL = polyMul(pp.num, [gain, gain * lead.zero]);
  const denL = polyMul(pp.den, [1, lead.pole]);
  const closedLoopPoles = polyRoots(polyAdd(denL, numL));
  const loopZeros = [{ re: -lead.zero, im: 0 }, ...inputToZpk(req.plant).zeros];

  const { dominantOk, notes } = dominance(sd, closedLoopPoles, loopZeros);
  return {
    rule: req.rule,
    zero: lead.zero,
    pole: lead.pole,
    gain,
    angleDeficiencyDeg: phiDeg,
    sDesired: sd,
    check: { angleDeg: Math.atan2(cg.im, cg.re) * DEG, magnitude: Math.hypot(cg.re, cg.im) },
    closedLoopPoles,
    dominantOk,
    dominanceNotes: notes,
  };
}

/**
 * Whether s_d and its conjugate are the closed-loop poles nearest the imaginary axis.
 * A pole that coincides with a closed-loop zero (a cancellation, e.g. a zero placed on a
 * plant pole) does not show in the reference response and is left out of the verdict, but
 * named. Closed-loop zeros are the zeros of C·G. Rule of practice for the notes: other poles
 * and zeros are "far" when their real part lies SEPARATION times further left than s_d's.
 */
export function dominance(sd: Complex, poles: Complex[], zeros: Complex[]): { dominantOk: boolean; notes: string[] } {
  const notes: string[] = [];
  const scale = Math.hypot(sd.re, sd.im);
  // the two poles nearest s_d and its conjugate
  const taken = new Set<number>();
  for (const target of [sd, { re: sd.re, im: -sd.im }]) {
    let best = -1;
    let bestD = Infinity;
    poles.forEach((p, i) => {
      if (taken.has(i)) return;
      const d = Math.hypot(p.re - target.re, p.im - target.im);
      if (d < bestD) {
        bestD = d;
        best = i;
      }
    });
    if (best >= 0) taken.add(best);
  }
  let ok = true;
  for (const [i, p] of poles.entries()) {
    if (taken.has(i)) continue;
    const where = p.im === 0 || Math.abs(p.im) < 1e-12 * scale ? fmt(p.re) : `${fmt(p.re)} ${p.im < 0 ? '−' : '+'} j${fmt(Math.abs(p.im))}`;
    const cancelled = zeros.some((z) => Math.hypot(z.re - p.re, z.im - p.im) <= 1e-6 * Math.max(1, scale));
    if (cancelled) {
      notes.push(`The closed-loop pole at ${where} is cancelled by a zero: it does not show in the response to the reference, but it stays in the loop (disturbances excite it)`);
      continue;
    }
    if (p.re >= sd.re) {
      ok = false;
      notes.push(`A closed-loop pole at ${where} lies as close to the imaginary axis as s_d or closer: s_d is not dominant`);
    } else if (p.re > SEPARATION * sd.re) {
      notes.push(`A closed-loop pole at ${where} lies less than ${SEPARATION}× further left than s_d: its mode shows in the response (rule of practice), which then settles more slowly than ζ and ωn alone suggest`);
    }
  }
  for (const z of zeros) {
    if (poles.some((p) => Math.hypot(z.re - p.re, z.im - p.im) <= 1e-6 * Math.max(1, scale))) continue;
    if (z.re > SEPARATION * sd.re) {
      notes.push(`A closed-loop zero at ${fmt(z.re)}${z.im !== 0 ? ` ± j${fmt(Math.abs(z.im))}` : ''} lies near the dominant poles: expect more overshoot than ζ alone suggests`);
    }
  }
  return { dominantOk: ok, notes };
}

/** Number for messages: 6 significant digits, true minus sign. */
function fmt(v: number): string {
  const t = String(Number(v.toPrecision(6)));
  return t.startsWith('-') ? `−${t.slice(1)}` : t;
}
