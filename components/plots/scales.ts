import { scaleLinear, scaleLog } from 'd3-scale';

/** Pure helpers shared by the plots: domains that ignore non-finite values, tick picking. */

export interface Extent {
  min: number;
  max: number;
}

/** Smallest and largest finite value of all arrays; undefined when none is finite. */
export function finiteExtent(arrays: ReadonlyArray<ReadonlyArray<number | null | undefined>>): Extent | undefined {
  let min = Infinity;
  let max = -Infinity;
  for (const arr of arrays) {
    for (const v of arr) {
      if (v === null || v === undefined || !Number.isFinite(v)) continue;
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  return min <= max ? { min, max } : undefined;
}

/** A linear domain with a little padding; a flat or missing extent gets a span of its own. */
export function paddedDomain(extent: Extent | undefined, minSpan: number, pad = 0.06): [number, number] {
  if (!extent) return [-minSpan / 2, minSpan / 2];
  let { min, max } = extent;
  if (max - min < minSpan) {
    const mid = (min + max) / 2;
    min = mid - minSpan / 2;
    max = mid + minSpan / 2;
  }
  const p = (max - min) * pad;
  return [min - p, max + p];
}

/** Log-frequency axis: grid at every d3 tick, labels only at decades (or at d3's own pick when the range is narrow). */
export function logAxisTicks(domain: [number, number]): { grid: number[]; labelled: number[] } {
  const s = scaleLog().domain(domain);
  const grid = s.ticks();
  const decades = grid.filter((t) => Math.abs(Math.log10(t) - Math.round(Math.log10(t))) < 1e-9);
  const labelled = decades.length >= 2 ? decades : s.ticks(4);
  return { grid, labelled };
}

/** Linear ticks from d3, aiming at about one label per `pxPerTick` pixels. */
export function linearTicks(domain: [number, number], lengthPx: number, pxPerTick = 50): number[] {
  return scaleLinear().domain(domain).ticks(Math.max(2, Math.round(lengthPx / pxPerTick)));
}

/** Short number label: 1k, 2.5, 0.01, 1e-4. */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e4 || a < 1e-3) return v.toExponential(0).replace('e+', 'e');
  if (a >= 1000) return `${+(v / 1000).toPrecision(3)}k`;
  return `${+v.toPrecision(3)}`;
}

export interface Root {
  re: number;
  im: number;
}

/**
 * Equal-aspect domains that hold every root (and the unit circle in the z-plane): one unit
 * on the real axis is as long as one unit on the imaginary axis, so circles stay circles.
 */
export function equalAspectDomains(
  roots: Root[],
  plane: 'z' | 's',
  plotW: number,
  plotH: number,
  /** z-plane only: frame the roots alone instead of the whole unit circle */
  zoom = false,
): { re: [number, number]; im: [number, number] } {
  const whole = plane === 'z' && !zoom;
  const res = finiteExtent([roots.map((r) => r.re), whole ? [-1, 1] : plane === 's' ? [0] : []]) ?? { min: -1, max: 1 };
  const ims = finiteExtent([roots.map((r) => r.im), whole ? [-1, 1] : [0]]) ?? { min: -1, max: 1 };
  let spanRe = res.max - res.min;
  let spanIm = ims.max - ims.min;
  const base = Math.max(spanRe, spanIm, whole ? 2 : 1e-9) || 1;
  spanRe = Math.max(spanRe, base * 0.2) * 1.15;
  spanIm = Math.max(spanIm, base * 0.2) * 1.15;
  const perPx = Math.max(spanRe / plotW, spanIm / plotH);
  const cRe = (res.max + res.min) / 2;
  const cIm = (ims.max + ims.min) / 2;
  const halfRe = (perPx * plotW) / 2;
  const halfIm = (perPx * plotH) / 2;
  return { re: [cRe - halfRe, cRe + halfRe], im: [cIm - halfIm, cIm + halfIm] };
}

