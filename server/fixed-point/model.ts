/**
 * Bit-exact model of the generated C (templates/controller.c.hbs), sample by sample, in the
 * same order of operations:
 * - fixed point: BigInt arithmetic with the accumulator saturated to 2W bits at every add,
 *   roundShift as in quantize.ts, section outputs saturated to the W-bit word, the final output
 *   clamped to [outputMin, outputMax] (the state keeps the unclamped section output);
 * - float32: Math.fround after every single multiply and add, as C computes float expressions
 *   (FLT_EVAL_METHOD 0, contraction to fused multiply-add turned off in the Makefile).
 * Inputs and outputs are raw counts for fixed point and real units for float32.
 */
import type { FixedImplementation, FixedSection, FloatImplementation, Implementation, SignalName } from './quantize';

/** floor(v / 2^s + 1/2) with truncating division and remainder, as the generated C does. */
export function roundShift(v: bigint, s: number): bigint {
  if (s === 0) return v;
  const one = 1n << BigInt(s);
  let q = v / one; // BigInt division truncates toward zero, as C99's
  let r = v % one; // remainder has the sign of v, as C99's
  if (r < 0n) { q -= 1n; r += one; }
  if (r >= one / 2n) q += 1n;
  return q;
}

export interface FixedRun {
  /** Final output, raw counts, after the output limits. */
  y: number[];
  /** Each section's output (integers of the word; the last one is y·2^G) per sample: nodes[k][n]. */
  nodes: number[][];
  /** Samples where an accumulator add saturated, or a section output saturated to the word. */
  accSaturations: number;
  wordSaturations: number;
}

export function runFixed(impl: FixedImplementation, uRaw: readonly number[]): FixedRun {
  const W = impl.wordLength;
  const accMax = (1n << BigInt(2 * W - 1)) - 1n, accMin = -(1n << BigInt(2 * W - 1));
  const wMax = (1n << BigInt(W - 1)) - 1n, wMin = -(1n << BigInt(W - 1));
  const lo = BigInt(impl.outputMin), hi = BigInt(impl.outputMax);
  let accSat = 0, wordSat = 0;
  const satAdd = (a: bigint, b: bigint) => {
    const s = a + b;
    if (s > accMax) { accSat++; return accMax; }
    if (s < accMin) { accSat++; return accMin; }
    return s;
  };
  const state = impl.sections.map(() => ({ x1: 0n, x2: 0n, y1: 0n, y2: 0n }));
  const prepared = impl.sections.map((sec: FixedSection) => ({
    sec,
    groups: sec.groups.map((g) => ({ shift: g.shift, terms: g.terms.map((t) => ({ c: BigInt(t.coef), sig: t.signal as SignalName, sub: t.subtract })) })),
    n1: BigInt(sec.nominal[0]), n2: BigInt(sec.nominal[1]),
  }));
  const y: number[] = [];
  const nodes: number[][] = impl.sections.map(() => []);
  for (const u of uRaw) {
    let x = BigInt(u);
    prepared.forEach((p, k) => {
      const st = state[k];
      const sig: Record<SignalName, bigint> = {
        x0: x, x1: st.x1, x2: st.x2, y1: st.y1, y2: st.y2,
        dx: x - st.x1, ddx: x - 2n * st.x1 + st.x2,
      };
      const accs = p.groups.map((g) => {
        let acc = 0n;
        for (const t of g.terms) { const prod = t.c * sig[t.sig]; acc = satAdd(acc, t.sub ? -prod : prod); }
        return acc;
      });
      let acc = accs[0];
      if (p.groups.length === 2) acc = satAdd(acc, roundShift(accs[1], p.groups[1].shift - p.groups[0].shift));
      let v = roundShift(acc, p.groups[0].shift);
      if (p.sec.nominal[0] !== 0) v = satAdd(satAdd(v, p.n1 * st.y1), p.n2 * st.y2);
      let out = v;
      if (out > wMax) { out = wMax; wordSat++; } else if (out < wMin) { out = wMin; wordSat++; }
      st.x2 = st.x1; st.x1 = x; st.y2 = st.y1; st.y1 = out;
      nodes[k].push(Number(out));
      x = out;
    });
    const o = roundShift(x, impl.outputShift);
    y.push(Number(o < lo ? lo : o > hi ? hi : o));
  }
  return { y, nodes, accSaturations: accSat, wordSaturations: wordSat };
}

export interface FloatRun { y: number[]; nodes: number[][] }

/** Transposed direct form II per section, float32 at every operation. */
export function runFloat(impl: FloatImplementation, u: readonly number[]): FloatRun {
  const f = Math.fround;
  const st = impl.sections.map(() => [0, 0]);
  const lo = f(impl.outputMin), hi = f(impl.outputMax);
  const y: number[] = [];
  const nodes: number[][] = impl.sections.map(() => []);
  for (const u0 of u) {
    let x = f(u0);
    impl.sections.forEach((sec, k) => {
      const s = st[k];
      const [b0, b1, b2] = sec.bf, [a1, a2] = sec.af;
      // C: out = b0 * x + s[0]; s[0] = (b1 * x - a1 * out) + s[1]; s[1] = b2 * x - a2 * out;
      const out = f(f(b0 * x) + s[0]);
      if (sec.order === 2) {
        s[0] = f(f(f(b1 * x) - f(a1 * out)) + s[1]);
        s[1] = f(f(b2 * x) - f(a2 * out));
      } else {
        s[0] = f(f(b1 * x) - f(a1 * out));
      }
      nodes[k].push(out);
      x = out;
    });
    y.push(x < lo ? lo : x > hi ? hi : x);
  }
  return { y, nodes };
}

export function runImplementation(impl: Implementation, u: readonly number[]): number[] {
  return impl.kind === 'fixed' ? runFixed(impl, u).y : runFloat(impl, u).y;
}

/** Ideal double-precision difference equation y = (num/den) u, num/den ascending z⁻¹, den[0] = 1. */
export function filterIdeal(num: readonly number[], den: readonly number[], u: readonly number[]): number[] {
  const n = Math.max(num.length, den.length);
  const xs: number[] = new Array(n).fill(0), ys: number[] = new Array(n).fill(0);
  const out: number[] = [];
  for (const v of u) {
    xs.unshift(v); xs.pop();
    let acc = 0;
    for (let i = 0; i < num.length; i++) acc += num[i] * xs[i];
    for (let i = 1; i < den.length; i++) acc -= den[i] * ys[i - 1];
    acc /= den[0];
    ys.unshift(acc); ys.pop();
    out.push(acc);
  }
  return out;
}
