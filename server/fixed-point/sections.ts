/**
 * Splitting a discrete zpk into a cascade of first- and second-order sections.
 *
 * Conventions (DESIGN.md): zpk value K·Π(z − zᵢ)/Π(z − pᵢ), zeros at ∞ omitted. A section's
 * coefficients are in difference-equation form, ascending powers of z⁻¹:
 *   H_k(z) = (b0 + b1 z⁻¹ + b2 z⁻²) / (1 + a1 z⁻¹ + a2 z⁻²),  b = [b0, b1, b2], a = [a1, a2]
 * (first-order sections have b2 = a2 = 0). Example: 0.5(z − 0.2)/(z − 0.9) is
 *   { order: 1, b: [0.5, -0.1, 0], a: [-0.9, 0] }.
 *
 * Rules:
 * - Real poles get first-order sections, complex pole pairs second-order ones (a real pole
 *   keeps its own section so that a pole near z = 1 is not mixed with a faster one); where only
 *   a complex zero pair is left for real poles, two real poles share a second-order section.
 * - Pairing: poles are taken from the one closest to the unit circle outwards; each takes the
 *   zeros nearest to it (common practice, the "nearest" pairing of the usual zpk → sections
 *   conversions).
 * - Order: sections with poles closest to the unit circle last (common practice: the
 *   high-gain, slow sections come last so that earlier nodes carry little gain).
 * - Gain: every section but the last is scaled so that the peak magnitude from the input to its
 *   output over the frequency grid is a chosen node gain (L∞ scaling, common practice); the last
 *   one carries the rest of the gain.
 */
import type { Complex, Zpk } from '../dsp/types';

export interface SectionSpec {
  order: 1 | 2;
  zeros: Complex[];
  poles: Complex[];
  /** Exact numerator, ascending powers of z⁻¹, length 3. */
  b: [number, number, number];
  /** Exact denominator without the leading 1: [a1, a2]. */
  a: [number, number];
}

const IM_TOL = 1e-12;
const isReal = (c: Complex) => Math.abs(c.im) <= IM_TOL * Math.max(1, Math.abs(c.re));
const dist = (p: Complex, q: Complex) => Math.hypot(p.re - q.re, p.im - q.im);

interface Group { roots: Complex[]; real: boolean }

/** Groups roots into real singles and conjugate pairs (the upper one kept, conjugated). */
function groupRoots(roots: Complex[]): Group[] {
  const out: Group[] = [];
  const upper = roots.filter((r) => !isReal(r) && r.im > 0);
  for (const r of roots) if (isReal(r)) out.push({ roots: [{ re: r.re, im: 0 }], real: true });
  for (const u of upper) out.push({ roots: [u, { re: u.re, im: -u.im }], real: false });
  return out;
}

/** Monic polynomial in z⁻¹ from ≤ 2 roots: Π(1 − rᵢ z⁻¹), returned as [c1, c2]. */
function monicFromRoots(roots: Complex[]): [number, number] {
  if (roots.length === 0) return [0, 0];
  if (roots.length === 1) return [-roots[0].re, 0];
  const [p, q] = roots;
  // (1 − p z⁻¹)(1 − q z⁻¹) = 1 − (p + q) z⁻¹ + p q z⁻²; the imaginary parts cancel for a pair.
  return [-(p.re + q.re), p.re * q.re - p.im * q.im];
}

/** Frequency grid for L∞ scaling, rad/sample, excluding 0 so that a pole at z = 1 stays finite. */
export const SCALING_GRID: number[] = Array.from({ length: 257 }, (_, i) => (Math.PI * (i + 1)) / 257);

/** |H(e^{jω})| of a section given b (length 3) and a = [a1, a2]. */
export function sectionMagnitude(b: readonly number[], a: readonly number[], w: number): number {
  const c1 = Math.cos(w), s1 = -Math.sin(w), c2 = Math.cos(2 * w), s2 = -Math.sin(2 * w);
  const nr = b[0] + b[1] * c1 + b[2] * c2, ni = b[1] * s1 + b[2] * s2;
  const dr = 1 + a[0] * c1 + a[1] * c2, di = a[0] * s1 + a[1] * s2;
  return Math.hypot(nr, ni) / Math.hypot(dr, di);
}

/**
 * Cascade of sections whose product is extraGain · H(z) (for fixed point extraGain is the
 * input/output scale ratio). Every inner node (the output of each section but the last) is
 * scaled so that the peak gain over the grid from the cascade input to it is `nodePeakGain`.
 */
export function toSections(zpk: Zpk, extraGain = 1, nodePeakGain = 1): SectionSpec[] {
  const poleGroups = groupRoots(zpk.poles);
  const zeroGroups = groupRoots(zpk.zeros);
  const radius = (g: Group) => Math.hypot(g.roots[0].re, g.roots[0].im);
  // Closest to the unit circle first (|1 − |p|| smallest).
  poleGroups.sort((g, h) => Math.abs(1 - radius(g)) - Math.abs(1 - radius(h)) || g.roots[0].re - h.roots[0].re);

  const built: { poles: Complex[]; zeros: Complex[] }[] = [];
  const remainingPoles = [...poleGroups];
  const remainingZeros = [...zeroGroups];
  const takeNearestZero = (p: Complex, real: boolean | null): Group | undefined => {
    let best = -1, bestD = Infinity;
    remainingZeros.forEach((z, i) => {
      if (real !== null && z.real !== real) return;
      const d = dist(p, z.roots[0]);
      if (d < bestD) { bestD = d; best = i; }
    });
    return best >= 0 ? remainingZeros.splice(best, 1)[0] : undefined;
  };
  while (remainingPoles.length) {
    const g = remainingPoles.shift()!;
    const p = g.roots[0];
    if (!g.real) {
      const zc = takeNearestZero(p, false);
      let zs: Complex[] = zc ? zc.roots : [];
      if (!zc) for (let i = 0; i < 2; i++) { const z = takeNearestZero(p, true); if (z) zs = zs.concat(z.roots); }
      built.push({ poles: g.roots, zeros: zs });
      continue;
    }
    const zr = takeNearestZero(p, true);
    if (zr) { built.push({ poles: g.roots, zeros: zr.roots }); continue; }
    const hasComplexZero = remainingZeros.some((z) => !z.real);
    const partnerIdx = remainingPoles.findIndex((q) => q.real);
    if (hasComplexZero && partnerIdx >= 0) {
      const q = remainingPoles.splice(partnerIdx, 1)[0];
      const zc = takeNearestZero(p, false)!;
      built.push({ poles: [p, q.roots[0]], zeros: zc.roots });
      continue;
    }
    built.push({ poles: g.roots, zeros: [] });
  }
  // Zeros left over (more zeros than poles cannot happen for a proper design): add them as
  // numerator-only first-order factors to the first-built sections that still have room.
  for (const z of remainingZeros) {
    for (const r of z.roots) {
      const s = built.find((b) => b.zeros.length < b.poles.length);
      if (s) s.zeros.push(r); else built.push({ poles: [], zeros: [r] });
    }
  }
  built.reverse(); // closest to the unit circle last
  if (built.length === 0) built.push({ poles: [], zeros: [] }); // a pure gain

  const specs: SectionSpec[] = built.map(({ poles, zeros }) => {
    const order = (Math.max(poles.length, zeros.length, 1) as 1 | 2);
    const a = monicFromRoots(poles);
    const m = monicFromRoots(zeros);
    // Numerator Π(z − zᵢ)/z^order in z⁻¹: a section with fewer zeros than its order gets
    // leading z⁻¹ delays, e.g. 1/(z − p) = z⁻¹/(1 − p z⁻¹) → b = [0, 1, 0].
    const delay = order - zeros.length;
    const numMonic = [1, m[0], m[1]].slice(0, zeros.length + 1);
    const b: [number, number, number] = [0, 0, 0];
    numMonic.forEach((c, i) => { b[i + delay] = c; });
    return { order, zeros, poles, b, a };
  });

  // Cumulative L∞ scaling: the peak gain from the input to each inner node is nodePeakGain.
  let rest = zpk.gain * extraGain;
  const cumulative = SCALING_GRID.map(() => 1);
  specs.forEach((s, k) => {
    if (k === specs.length - 1) {
      s.b = s.b.map((v) => v * rest) as SectionSpec['b'];
      return;
    }
    let peak = 0;
    SCALING_GRID.forEach((w, i) => {
      cumulative[i] *= sectionMagnitude(s.b, s.a, w);
      if (Number.isFinite(cumulative[i])) peak = Math.max(peak, cumulative[i]);
    });
    const c = peak > 0 ? nodePeakGain / peak : 1;
    s.b = s.b.map((v) => v * c) as SectionSpec['b'];
    for (let i = 0; i < cumulative.length; i++) cumulative[i] *= c;
    rest /= c;
  });
  return specs;
}
