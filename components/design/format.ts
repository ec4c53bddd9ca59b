/**
 * Text echoes of transfer functions, so the user sees what was understood
 * (coefficient order and sign are the classic source of wrong filters).
 *
 * H(s) in descending powers of s: [25, 75] → "25s + 75".
 * H(z) in ascending powers of z⁻¹ (difference-equation form): num [b0, b1], den [1, a1] →
 * "(b0 + b1·z⁻¹) / (1 + a1·z⁻¹)" and y[k] = b0·u[k] + b1·u[k−1] − a1·y[k−1].
 */

const SUPERSCRIPT: Record<string, string> = { '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻' };
const sup = (n: number) => String(n).split('').map((c) => SUPERSCRIPT[c] ?? c).join('');

/** Number for an echo: up to `digits` significant digits, no trailing zeros, true minus sign. */
export function fmt(v: number, digits = 6): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const a = Math.abs(v);
  const text = a >= 1e6 || a < 1e-4 ? a.toExponential(digits - 1).replace(/\.?0+e/, 'e') : String(Number(a.toPrecision(digits)));
  return (v < 0 ? '−' : '') + text;
}

function joinTerms(terms: Array<{ coef: number; power: string }>, digits: number): string {
  const shown = terms.filter((t) => t.coef !== 0);
  if (shown.length === 0) return '0';
  return shown
    .map((t, i) => {
      const a = Math.abs(t.coef);
      const body = t.power === '' ? fmt(a, digits) : a === 1 ? t.power : `${fmt(a, digits)}${t.power.startsWith('z') ? '·' : ''}${t.power}`;
      if (i === 0) return (t.coef < 0 ? '−' : '') + body;
      return `${t.coef < 0 ? ' − ' : ' + '}${body}`;
    })
    .join('');
}

/** Polynomial in descending powers of s: [1, 5, 0] → "s² + 5s". */
export function polyS(descending: readonly number[], digits = 6): string {
  const n = descending.length - 1;
  return joinTerms(
    descending.map((coef, i) => {
      const p = n - i;
      return { coef, power: p === 0 ? '' : p === 1 ? 's' : `s${sup(p)}` };
    }),
    digits,
  );
}

/** Polynomial in ascending powers of z⁻¹: [1, −0.5] → "1 − 0.5·z⁻¹". */
export function polyZinv(ascending: readonly number[], digits = 6): string {
  return joinTerms(
    ascending.map((coef, i) => ({ coef, power: i === 0 ? '' : i === 1 ? 'z⁻¹' : `z${sup(-i)}` })),
    digits,
  );
}

/** One factor of a zpk echo: (s + 3) for the root −3, (s² + 2s + 5) for the pair −1 ± 2j, s for 0. */
function factor(re: number, im: number, variable: string, digits: number): string {
  if (im === 0) {
    if (re === 0) return variable;
    return `(${variable} ${re < 0 ? '+' : '−'} ${fmt(Math.abs(re), digits)})`;
  }
  // (x − (a + jb))(x − (a − jb)) = x² − 2a·x + (a² + b²)
  const b1 = -2 * re;
  const b0 = re * re + im * im;
  const mid = b1 === 0 ? '' : ` ${b1 < 0 ? '−' : '+'} ${fmt(Math.abs(b1), digits)}${variable}`;
  return `(${variable}²${mid} + ${fmt(b0, digits)})`;
}

function factors(roots: ReadonlyArray<{ re: number; im: number }>, variable: string, digits: number): string {
  const parts: string[] = [];
  for (const r of roots) {
    if (r.im < 0) continue; // written with its conjugate
    parts.push(factor(r.re, r.im, variable, digits));
  }
  return parts.join('');
}

/** Factored echo K·Π(x − zᵢ)/Π(x − pᵢ), e.g. "25 (s + 3) / (s + 18)". */
export function zpkText(gain: number, zeros: ReadonlyArray<{ re: number; im: number }>, poles: ReadonlyArray<{ re: number; im: number }>, variable = 's', digits = 6): string {
  const num = factors(zeros, variable, digits);
  const den = factors(poles, variable, digits);
  const k = fmt(gain, digits);
  return `${k}${num ? ` ${num}` : ''}${den ? ` / ${den}` : ''}`;
}

/** Difference equation of num/den (den[0] = 1): y[k] = b0·u[k] + b1·u[k−1] − a1·y[k−1]. */
export function differenceEquation(num: readonly number[], den: readonly number[], digits = 6): string {
  const lag = (i: number) => (i === 0 ? 'k' : `k−${i}`);
  const terms: Array<{ coef: number; power: string }> = [];
  num.forEach((b, i) => terms.push({ coef: b, power: `·u[${lag(i)}]` }));
  den.slice(1).forEach((a, j) => terms.push({ coef: -a, power: `·y[${lag(j + 1)}]` }));
  const shown = terms.filter((t) => t.coef !== 0);
  if (shown.length === 0) return 'y[k] = 0';
  const body = shown
    .map((t, i) => {
      const a = fmt(Math.abs(t.coef), digits);
      if (i === 0) return `${t.coef < 0 ? '−' : ''}${a}${t.power}`;
      return `${t.coef < 0 ? ' − ' : ' + '}${a}${t.power}`;
    })
    .join('');
  return `y[k] = ${body}`;
}
