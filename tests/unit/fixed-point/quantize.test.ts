import fc from 'fast-check';
import { chooseShift, roundHalfAway, quantizeFixedSection, quantizedCoefficients, significantBits } from '../../../server/fixed-point/quantize';
import { roundShift } from '../../../server/fixed-point/model';
import { lfsrBits } from '../../../server/fixed-point/vectors';

describe('Q format quantization (independent check)', () => {
  // From memory of the Q format definition: a Q0.15 (Q15) word holds value = integer / 2^15,
  // integers −32768 … 32767. So 0.5 → 16384, −0.25 → −8192, 2^−15 → 1, 0.999969482421875 → 32767.
  it('stores known Q15 values', () => {
    const q15 = (v: number) => roundHalfAway(v * 2 ** 15);
    expect([0.5, -0.25, 2 ** -15, 0.999969482421875, -1].map(q15)).toEqual([16384, -8192, 1, 32767, -32768]);
    expect(chooseShift(16, [{ exact: 0.5, signal: 'x0' }])).toBe(15); // 0.5 is Q15's 16384
    // −0.25 alone: Q−1.16 holds it as −16384; Q−2.17 would need −32768, outside ±32767.
    expect(chooseShift(16, [{ exact: -0.25, signal: 'x0' }])).toBe(16);
  });
  it('chooses the format from the largest coefficient of the group', () => {
    // 1.0 does not fit Q0.15 (32768 > 32767), so Q1.14: 16384. −1.8 in Q1.14: round(−29491.2) = −29491.
    expect(chooseShift(16, [{ exact: 1, signal: 'x0' }, { exact: 0.01, signal: 'x0' }])).toBe(14);
    expect(chooseShift(16, [{ exact: -1.8, signal: 'y1' }])).toBe(14);
    expect(roundHalfAway(-1.8 * 2 ** 14)).toBe(-29491);
    // Coefficients on Δx lose one bit of range: 0.6 fits Q0.15 alone but only Q0.14 on Δx.
    expect(chooseShift(16, [{ exact: 0.6, signal: 'x0' }])).toBe(15);
    expect(chooseShift(16, [{ exact: 0.6, signal: 'dx' }])).toBe(14);
    // A coefficient too large for the word even without fractional bits.
    expect(chooseShift(16, [{ exact: 40000, signal: 'x0' }])).toBeNull();
  });
  it('rounds to nearest with ties away from zero', () => {
    expect(roundHalfAway(2.5)).toBe(3);
    expect(roundHalfAway(-2.5)).toBe(-3);
    expect(roundHalfAway(-2.4)).toBe(-2);
  });
  it('counts significant bits', () => {
    expect([0, 1, 2, 3, 255, 256, -32767].map(significantBits)).toEqual([0, 1, 2, 2, 8, 9, 15]);
  });
  it('offset form recovers b and a from its coefficients (identity of the basis change)', () => {
    const spec = { order: 2 as const, zeros: [], poles: [], b: [0.3, -0.55, 0.26] as [number, number, number], a: [-1.97, 0.9702] as [number, number] };
    const sec = quantizeFixedSection(spec, 32, 'offset-form-1');
    const q = quantizedCoefficients(sec);
    q.b.forEach((v, i) => expect(v).toBeCloseTo(spec.b[i], 8));
    q.a.forEach((v, i) => expect(v).toBeCloseTo(spec.a[i], 8));
    // d1 = a1 + 2 = 0.03 gets more fractional bits than a1 = −1.97 would (Q1.30).
    const d1 = sec.groups.flatMap((g) => g.terms.map((t) => ({ ...t, shift: g.shift }))).find((t) => t.name === 'd1')!;
    expect(d1.shift).toBeGreaterThan(30);
  });
});

describe('roundShift', () => {
  it('known values: floor(v / 2^s + 1/2)', () => {
    expect(roundShift(5n, 1)).toBe(3n); // 2.5 → 3
    expect(roundShift(-5n, 1)).toBe(-2n); // −2.5 → −2 (ties toward +∞)
    expect(roundShift(-6n, 2)).toBe(-1n); // −1.5 → −1
    expect(roundShift(7n, 2)).toBe(2n); // 1.75 → 2
    expect(roundShift(-7n, 2)).toBe(-2n); // −1.75 → −2
    expect(roundShift(-(1n << 63n), 62)).toBe(-2n);
  });
  it('equals floor(v / 2^s + 1/2) for any safe integer', () => {
    fc.assert(fc.property(fc.integer({ min: -(2 ** 40), max: 2 ** 40 }), fc.integer({ min: 0, max: 20 }), (v, s) => {
      expect(Number(roundShift(BigInt(v), s))).toBe(Math.floor(v / 2 ** s + 0.5));
    }));
  });
});

describe('pseudo-random sequence', () => {
  it('the 16-bit LFSR has the maximal period 65535 (taps 16, 14, 13, 11)', () => {
    let r = 0xace1, n = 0;
    do { const bit = (r ^ (r >> 2) ^ (r >> 3) ^ (r >> 5)) & 1; r = (r >> 1) | (bit << 15); n++; } while (r !== 0xace1 && n < 70000);
    expect(n).toBe(65535);
    const bits = lfsrBits(128);
    expect(bits.filter((b) => b === 1).length).toBeGreaterThan(40);
    expect(bits.filter((b) => b === 0).length).toBeGreaterThan(40);
  });
});
