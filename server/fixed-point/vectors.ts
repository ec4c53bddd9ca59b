/**
 * Test-vector input sequence of a bundle, one continuous run from the reset state:
 *   impulse (64) · step (128) · rest (32) · sines at fs/100, fs/20, fs/5 (128 each) ·
 *   pseudo-random ±A (128, 16-bit LFSR) · rest (32, zero input: limit cycles show here) ·
 *   limit segment +A_sat then −A_sat (64 each), sized to drive the output into its limits.
 * Amplitudes are raw input counts for fixed point (whole numbers), real units for float32.
 */

export interface VectorPlan {
  /** Amplitude of the ordinary segments; chosen so the ideal output stays inside the limits. */
  amplitude: number;
  /** Amplitude of the limit segment. */
  limitAmplitude: number;
  /** Largest input magnitude allowed (the input word for fixed point). */
  inputMax: number;
  integer: boolean;
}

export interface Segment { name: string; start: number; length: number }

/**
 * Fibonacci LFSR on 16 bits with taps 16, 14, 13, 11 (x¹⁶ + x¹⁴ + x¹³ + x¹¹ + 1, a maximal-length
 * polynomial; from memory of the common LFSR tap tables), seed 0xACE1.
 */
export function lfsrBits(count: number, seed = 0xace1): number[] {
  let r = seed & 0xffff;
  const out: number[] = [];
  for (let i = 0; i < count; i++) {
    const bit = ((r >> 0) ^ (r >> 2) ^ (r >> 3) ^ (r >> 5)) & 1;
    r = (r >> 1) | (bit << 15);
    out.push(r & 1);
  }
  return out;
}

export function buildInput(plan: VectorPlan): { u: number[]; segments: Segment[] } {
  const u: number[] = [];
  const segments: Segment[] = [];
  const q = (v: number) => {
    const c = Math.max(-plan.inputMax, Math.min(plan.inputMax, v));
    return plan.integer ? Math.round(c) : Math.fround(c);
  };
  const seg = (name: string, values: number[]) => { segments.push({ name, start: u.length, length: values.length }); u.push(...values.map(q)); };
  const A = plan.amplitude;
  seg('impulse', Array.from({ length: 64 }, (_, n) => (n === 0 ? A : 0)));
  seg('step', new Array(128).fill(A));
  seg('rest', new Array(32).fill(0));
  for (const ratio of [100, 20, 5]) {
    seg(`sine fs/${ratio}`, Array.from({ length: 128 }, (_, n) => A * Math.sin((2 * Math.PI * n) / ratio)));
  }
  seg('pseudo-random', lfsrBits(128).map((b) => (b ? A : -A)));
  seg('rest', new Array(32).fill(0));
  seg('limits', Array.from({ length: 128 }, (_, n) => (n < 64 ? plan.limitAmplitude : -plan.limitAmplitude)));
  return { u, segments };
}
