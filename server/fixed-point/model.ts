/**
 * Bit-exact model of the generated C (templates/controller.c.hbs), sample by sample, in the
 * same order of operations:
 * - fixed point: exact integer arithmetic (BigInt for 32-bit words, Number for 16-bit) with the accumulator saturated to 2W bits at every add,
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
  /** Number of accumulator adds that saturated, and of section outputs saturated to the word. */
  accSaturations: number;
  wordSaturations: number;
}

/** Integer arithmetic the model runs on: BigInt (exact for 64-bit accumulators) or Number (exact below 2^53, used for 16-bit words). */
interface IntOps<T> {
  of(v: number): T;
  toNumber(v: T): number;
  add(a: T, b: T): T;
  sub(a: T, b: T): T;
  mul(a: T, b: T): T;
  roundShift(v: T, s: number): T;
  /** [−2^(bits−1), 2^(bits−1) − 1] */
  range(bits: number): [T, T];
}
const BIG: IntOps<bigint> = {
  of: (v) => BigInt(v), toNumber: (v) => Number(v),
  add: (a, b) => a + b, sub: (a, b) => a - b, mul: (a, b) => a * b, roundShift,
  range: (bits) => [-(1n << BigInt(bits - 1)), (1n << BigInt(bits - 1)) - 1n],
};
/** Same roundShift with Numbers: Math.trunc and % behave as C99's / and % on exact integers. */
const NUM: IntOps<number> = {
  of: (v) => v, toNumber: (v) => v,
  add: (a, b) => a + b, sub: (a, b) => a - b, mul: (a, b) => a * b,
  roundShift: (v, s) => {
    if (s === 0) return v;
    const one = 2 ** s;
    let q = Math.trunc(v / one), r = v % one;
    if (r < 0) { q -= 1; r += one; }
    if (r >= one / 2) q += 1;
    return q + 0; // + 0 turns −0 into 0
  },
  range: (bits) => [-(2 ** (bits - 1)), 2 ** (bits - 1) - 1],
};

export function runFixed(impl: FixedImplementation, uRaw: readonly number[]): FixedRun {
  // 16-bit words: products < 2^30 and saturated sums < 2^31, all exact as doubles.
  return impl.wordLength === 16 ? runFixedWith(NUM, impl, uRaw) : runFixedWith(BIG, impl, uRaw);
}

function runFixedWith<T>(o: IntOps<T>, impl: FixedImplementation, uRaw: readonly number[]): FixedRun {
  const W = impl.wordLength;
  const [accMin, accMax] = o.range(2 * W);
  const wMax = o.of(2 ** (W - 1) - 1), wMin = o.of(-(2 ** (W - 1)));
  const lo = o.of(impl.outputMin), hi = o.of(impl.outputMax);
  const zero = o.of(0), two = o.of(2);
  let accSat = 0, wordSat = 0;
  const satAdd = (a: T, b: T) => {
    const s = o.add(a, b);
    if (s > accMax) { accSat++; return accMax; }
    if (s < accMin) { accSat++; return accMin; }
    return s;
  };
  const state = impl.sections.map(() => ({ x1: zero, x2: zero, y1: zero, y2: zero }));
  const prepared = impl.sections.map((sec: FixedSection) => ({
    sec,
    groups: sec.groups.map((g) => ({ shift: g.shift, terms: g.terms.map((t) => ({ c: o.of(t.coef), sig: t.signal as SignalName, sub: t.subtract })) })),
    n1: o.of(sec.nominal[0]), n2: o.of(sec.nominal[1]), offset: sec.nominal[0] !== 0,
  }));
  const y: number[] = [];
  const nodes: number[][] = impl.sections.map(() => []);
  for (const u of uRaw) {
    let x = o.of(u);
    prepared.forEach((p, k) => {
      const st = state[k];
      const sig: Record<SignalName, T> = {
        x0: x, x1: st.x1, x2: st.x2, y1: st.y1, y2: st.y2,
        dx: o.sub(x, st.x1), ddx: o.add(o.sub(x, o.mul(two, st.x1)), st.x2),
      };
      const accs = p.groups.map((g) => {
        let acc = zero;
        for (const t of g.terms) { const prod = o.mul(t.c, sig[t.sig]); acc = satAdd(acc, t.sub ? o.sub(zero, prod) : prod); }
        return acc;
      });
      let acc = accs[0];
      if (p.groups.length === 2) acc = satAdd(acc, o.roundShift(accs[1], p.groups[1].shift - p.groups[0].shift));
      let v = o.roundShift(acc, p.groups[0].shift);
      if (p.offset) v = satAdd(satAdd(v, o.mul(p.n1, st.y1)), o.mul(p.n2, st.y2));
      let out = v;
      if (out > wMax) { out = wMax; wordSat++; } else if (out < wMin) { out = wMin; wordSat++; }
      st.x2 = st.x1; st.x1 = x; st.y2 = st.y1; st.y1 = out;
      nodes[k].push(o.toNumber(out));
      x = out;
    });
    const out = o.roundShift(x, impl.outputShift);
    y.push(o.toNumber(out < lo ? lo : out > hi ? hi : out));
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
