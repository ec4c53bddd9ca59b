import { differenceEquation, fmt, polyS, polyZinv, zpkText } from '../../../components/design/format';

describe('H(s) echo, descending powers of s', () => {
  it('writes [1, 5, 0] as s² + 5s and keeps signs', () => {
    expect(polyS([1, 5, 0])).toBe('s² + 5s');
    expect(polyS([25, 75])).toBe('25s + 75');
    expect(polyS([-2, 0, -4])).toBe('−2s² − 4');
    expect(polyS([8])).toBe('8');
  });
  it('writes factors with the root sign flipped: root −3 is (s + 3), root 4 is (s − 4)', () => {
    expect(zpkText(25, [{ re: -3, im: 0 }], [{ re: -18, im: 0 }])).toBe('25 (s + 3) / (s + 18)');
    expect(zpkText(1, [{ re: 4, im: 0 }], [{ re: 0, im: 0 }])).toBe('1 (s − 4) / s');
  });
  it('writes a conjugate pair a ± jb as x² − 2a·x + (a² + b²)', () => {
    // (s + 1 − 2j)(s + 1 + 2j) = s² + 2s + 5
    expect(zpkText(2, [], [{ re: -1, im: 2 }, { re: -1, im: -2 }])).toBe('2 / (s² + 2s + 5)');
    expect(zpkText(1, [{ re: 0, im: 3 }, { re: 0, im: -3 }], [{ re: -1, im: 0 }])).toBe('1 (s² + 9) / (s + 1)');
  });
});

describe('H(z) echo, ascending powers of z⁻¹', () => {
  it('writes num/den coefficients against their powers of z⁻¹', () => {
    expect(polyZinv([1, -0.8])).toBe('1 − 0.8·z⁻¹');
    expect(polyZinv([0, 0.25, 0.125])).toBe('0.25·z⁻¹ + 0.125·z⁻²');
  });
  it('negates the feedback terms in the difference equation: A(z⁻¹)Y = B(z⁻¹)U', () => {
    // den = [1, −0.8] ⇒ y[k] − 0.8·y[k−1] = … ⇒ y[k] = … + 0.8·y[k−1]
    expect(differenceEquation([0.5, 0.25], [1, -0.8])).toBe('y[k] = 0.5·u[k] + 0.25·u[k−1] + 0.8·y[k−1]');
    expect(differenceEquation([0, 0.3], [1, 0.4, -0.1])).toBe('y[k] = 0.3·u[k−1] − 0.4·y[k−1] + 0.1·y[k−2]');
  });
  it('formats tiny and huge coefficients in exponent form', () => {
    expect(fmt(1.23456789e-7)).toBe('1.23457e-7');
    expect(fmt(-2.5e8)).toBe('−2.5e+8');
  });
});
