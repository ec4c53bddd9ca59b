/** Printing of the implementation screen's figures. */
import {
  clipLines,
  coefficientLabel,
  fileTabLabel,
  formatOfCoefficient,
  improvementFactor,
  pctText,
  sizeText,
  stabilityText,
  zText,
} from '../../../components/implementation/display';

const sections = [
  { index: 1, order: 2 as const, formats: ['Q2.13'], shifts: [13] },
  { index: 2, order: 1 as const, formats: ['Q-9.24', 'Q1.14'], shifts: [24, 14] },
];

test('a coefficient’s format is the one of its group, found by its fractional bits', () => {
  expect(formatOfCoefficient(sections, { section: 1, fractionalBits: 13 })).toBe('Q2.13');
  expect(formatOfCoefficient(sections, { section: 2, fractionalBits: 24 })).toBe('Q-9.24');
  expect(formatOfCoefficient(sections, { section: 2, fractionalBits: 14 })).toBe('Q1.14');
  expect(formatOfCoefficient(sections, { section: 2, fractionalBits: 15 })).toBe('—');
  expect(formatOfCoefficient(sections, { section: 3, fractionalBits: 13 })).toBe('—');
  expect(formatOfCoefficient([{ index: 1, order: 1, formats: ['float32'], shifts: [] }], { section: 1, fractionalBits: null })).toBe('float32');
});

test('coefficient names', () => {
  expect(coefficientLabel('beta0')).toBe('β0');
  expect(coefficientLabel('a1')).toBe('a1');
});

test('percentages: null is infinite or not applicable, as asked', () => {
  expect(pctText(null)).toBe('∞');
  expect(pctText(null, 'n/a')).toBe('n/a');
  expect(pctText(0)).toBe('0 %');
  expect(pctText(0.012345)).toBe('0.0123 %');
});

test('improvement factor of the offset form', () => {
  expect(improvementFactor(3.2, 0.08)).toBe('40×');
  expect(improvementFactor(12, 0.001)).toBe('12,000×');
  expect(improvementFactor(1, 0)).toBe('exact');
  expect(improvementFactor(1, 2)).toBeNull();
  expect(improvementFactor(null, 2)).toBeNull();
});

test('z-plane roots', () => {
  expect(zText(0.5, 0)).toBe('0.5');
  expect(zText(0.9, -0.1)).toBe('0.9 − 0.1j');
  expect(zText(null, null)).toBe('lost (at ∞)');
});

test('clipLines counts lines without the final newline', () => {
  expect(clipLines('a\nb\nc\n', 2)).toEqual({ lines: ['a', 'b'], total: 3, clipped: true });
  expect(clipLines('a\r\nb', 5)).toEqual({ lines: ['a', 'b'], total: 2, clipped: false });
});

test('sizes and tab labels', () => {
  expect(sizeText(512)).toBe('512 B');
  expect(sizeText(12_345)).toBe('12.3 kB');
  expect(fileTabLabel('include/tilt.h')).toBe('tilt.h');
  expect(fileTabLabel('Makefile')).toBe('Makefile');
});

describe('stabilityText', () => {
  const p = (ideal: [number, number], q: [number | null, number | null]) => ({ ideal: { re: ideal[0], im: ideal[1] }, quantized: { re: q[0], im: q[1] } });
  test('inside stays inside', () => expect(stabilityText([p([0.9, 0], [0.9001, 0])])).toBe('stable after quantization'));
  test('an integrator at z = 1 is on the circle as designed, not unstable', () =>
    expect(stabilityText([p([0.88, 0], [0.88, 0]), p([1, 0], [1, 0])])).toBe('a pole stays on the unit circle (an integrator), as designed'));
  test('a pole pushed outside is called unstable', () =>
    expect(stabilityText([p([0.99999, 0], [1.00002, 0])])).toMatch(/^UNSTABLE after quantization/));
  test('a pole pushed onto the circle', () => expect(stabilityText([p([0.99999, 0], [1, 0])])).toBe('a pole moved onto the unit circle after quantization'));
  test('a lost root counts as outside', () => expect(stabilityText([p([0.5, 0], [null, null])])).toMatch(/^UNSTABLE/));
});
