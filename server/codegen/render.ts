/**
 * Template data and rendering of the C bundle files. Every comment in the generated files is
 * rendered from the same data as the code it describes (formats, shifts, coefficient order).
 */
import fs from 'node:fs';
import path from 'node:path';
import Handlebars from 'handlebars';
import type { MethodName } from '../dsp/types';
import type { FixedImplementation, FloatImplementation, Implementation, SignalName, TermGroup } from '../fixed-point/quantize';
import { qFormat, type Vectors } from '../fixed-point';
import type { Complex } from '../dsp/types';

export const GENERATOR_VERSION = '1.0.0';

const METHOD_LABELS: Record<MethodName, string> = {
  tustin: 'Tustin (bilinear)',
  prewarp: 'Tustin with frequency prewarping',
  matched: 'matched pole–zero',
  zoh: 'zero-order hold (step invariant)',
  'backward-euler': 'backward Euler',
};

const TEMPLATE_DIR = path.join(__dirname, '..', '..', 'templates');
const compiled = new Map<string, HandlebarsTemplateDelegate>();
function template(name: string): HandlebarsTemplateDelegate {
  let t = compiled.get(name);
  if (!t) {
    t = Handlebars.compile(fs.readFileSync(path.join(TEMPLATE_DIR, name), 'utf8'), { noEscape: true, strict: true });
    compiled.set(name, t);
  }
  return t;
}

/** Shortest round-trip decimal of a double (exact decimal for the manifest and tables). */
const num = (v: number) => (Object.is(v, -0) ? '0' : String(v));
/** 9 significant digits: a float32 value parses back to itself. */
export const floatLiteral = (v: number) => `${Math.fround(v).toPrecision(9)}f`;
const rootText = (r: Complex) => (Math.abs(r.im) < 1e-15 ? r.re.toPrecision(8) : `${r.re.toPrecision(8)} ${r.im < 0 ? '−' : '+'} ${Math.abs(r.im).toPrecision(8)}j`);

/** C integer literal that is valid for the most negative value of a word too. */
export function intLiteral(v: number, wordLength: number): string {
  if (v === -(2 ** (wordLength - 1))) return `(-${2 ** (wordLength - 1) - 1} - 1)`;
  return String(v);
}

const SIGNAL_C: Record<SignalName, string> = { x0: 'x', x1: 'x1', x2: 'x2', y1: 'y1', y2: 'y2', dx: 'dx', ddx: 'ddx' };
const SIGNAL_TEXT: Record<SignalName, string> = { x0: 'x[n]', x1: 'x[n-1]', x2: 'x[n-2]', y1: 'y[n-1]', y2: 'y[n-2]', dx: '(x[n] - x[n-1])', ddx: '(x[n] - 2x[n-1] + x[n-2])' };

export interface BundleContext {
  designName: string;
  versionNumber: number;
  method: MethodName;
  sampleRateHz: number;
  prefix: string;
  inputScale: number;
  outputScale: number;
  gainFold: number;
}

function groupLabel(g: TermGroup, W: number) {
  return `${g.terms.map((t) => t.name).join(', ')} in ${qFormat(W, g.shift)} (F = ${g.shift})`;
}

function fixedData(impl: FixedImplementation) {
  const W = impl.wordLength;
  const acc = W === 16 ? 'int32_t' : 'int64_t';
  const word = W === 16 ? 'int16_t' : 'int32_t';
  const sections = impl.sections.map((s, k) => {
    const terms = s.groups.flatMap((g, gi) => g.terms.map((t) => ({ ...t, gi })));
    const values = terms.map((t) => intLiteral(t.coef, W)).join(', ');
    const idx = (name: string) => terms.findIndex((t) => t.name === name);
    const expr = (t: { name: string; signal: SignalName; subtract: boolean }) => {
      const prod = `(${acc})k_sec${k + 1}[${idx(t.name)}] * (${acc})${SIGNAL_C[t.signal]}`;
      return t.subtract ? `-(${prod})` : prod;
    };
    const used = new Set(terms.map((t) => t.signal));
    const offset = s.nominal[0] !== 0;
    if (offset) { used.add('y1'); if (s.order === 2) used.add('y2'); }
    if (used.has('ddx')) { used.add('x1'); used.add('x2'); }
    if (used.has('dx')) used.add('x1');
    const locals: string[] = [];
    if (used.has('x1')) locals.push(`${word} x1 = st->x[${k}][0]`);
    if (used.has('x2')) locals.push(`${word} x2 = st->x[${k}][1]`);
    if (used.has('y1')) locals.push(`${word} y1 = st->y[${k}][0]`);
    if (used.has('y2')) locals.push(`${word} y2 = st->y[${k}][1]`);
    if (used.has('dx')) locals.push(`${acc} dx = (${acc})x - (${acc})x1`);
    if (used.has('ddx')) locals.push(`${acc} ddx = (${acc})x - 2 * (${acc})x1 + (${acc})x2`);
    const lo = s.groups[0], hi = s.groups[1];
    const nominalTerms: string[] = !offset ? [] : s.order === 1 ? [`(${acc})y1`] : [`2 * (${acc})y1`, `-(${acc})y2`];
    const formatComment = s.groups.map((g) => groupLabel(g, W)).join('; ');
    return {
      index: k + 1,
      zeroIndex: k,
      order: s.order,
      orderLabel: s.order === 1 ? 'first order' : 'second order',
      count: terms.length,
      values,
      tableComment: `${terms.map((t) => t.name).join(', ')} (${s.groups.map((g) => `${g.terms.map((t) => t.name).join(', ')}: ${qFormat(W, g.shift)}`).join('; ')})`,
      formatComment,
      locals,
      loTerms: lo.terms.map(expr),
      hiTerms: hi ? hi.terms.map(expr) : [],
      twoGroups: !!hi,
      hiShift: hi ? hi.shift - lo.shift : 0,
      loShift: lo.shift,
      nominalTerms,
      terms,
    };
  });
  const rel = (s: (typeof impl.sections)[number]) =>
    s.nominal[0] === 0
      ? `y[n] = ${s.order === 1 ? 'b0 x[n] + b1 x[n-1] - a1 y[n-1]' : 'b0 x[n] + b1 x[n-1] + b2 x[n-2] - a1 y[n-1] - a2 y[n-2]'}`
      : `y[n] = ${s.order === 1 ? 'y[n-1]' : '2 y[n-1] - y[n-2]'} + ${s.groups.flatMap((g) => g.terms).map((t) => `${t.subtract ? '- ' : ''}${t.name} ${SIGNAL_TEXT[t.signal]}`).join(' + ').replace(/\+ - /g, '- ')}`;
  const arithmetic = [
    `Structure: ${impl.structure === 'offset-form-1' ? 'offset form (direct form I with the feedback stored as offsets from poles at z = 1)' : 'direct form I'}, one accumulator per coefficient group.`,
    `Sign convention: each section is H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2); the a`,
    `coefficients keep the sign of the denominator and their products are subtracted.`,
    ...(impl.structure === 'offset-form-1'
      ? ['Offset form: first order a1 = -1 + d1; second order a1 = -2 + d1, a2 = 1 + d2;',
         'beta0 = b0 + b1 (+ b2), beta1 = -b1 (first order) or -(b1 + 2 b2), beta2 = b2.']
      : []),
    `Words: ${W}-bit (${word}) inputs, outputs and state; ${2 * W}-bit (${acc}) accumulator.`,
    'Each stored coefficient is round(c * 2^F) (to nearest, ties away from zero), F its group\'s',
    'fractional bits; a product coefficient * word sits in the accumulator in units of 2^-F.',
    ...impl.sections.flatMap((s, k) => [
      `Section ${k + 1} (${s.order === 1 ? 'first' : 'second'} order): ${rel(s)}`,
      `  coefficients k_sec${k + 1}[] = { ${sections[k].terms.map((t) => t.name).join(', ')} }; ${s.groups.map((g) => groupLabel(g, W)).join('; ')}`,
      s.groups.length === 2
        ? `  acc = sum of the F = ${s.groups[0].shift} group + round_shift(sum of the F = ${s.groups[1].shift} group, ${s.groups[1].shift - s.groups[0].shift}); y = sat_word(round_shift(acc, ${s.groups[0].shift})${s.nominal[0] ? ' + nominal feedback' : ''})`
        : `  y = sat_word(round_shift(acc, ${s.groups[0].shift})${s.nominal[0] ? ' + nominal feedback' : ''})`,
    ]),
    'State order: x[k][0] = x_k[n-1], x[k][1] = x_k[n-2], y[k][0] = y_k[n-1], y[k][1] = y_k[n-2].',
    `Output fraction bits: the cascade computes y * 2^${impl.outputShift}; the output is round_shift(y, ${impl.outputShift}).`,
    `Saturation: every accumulator add saturates to ${2 * W} bits; every section output saturates to`,
    `the ${W}-bit word before it is stored; the output is clamped to [${impl.outputMin}, ${impl.outputMax}] counts`,
    '(the state keeps the unclamped value: add anti-windup in the caller if the actuator saturates).',
    'round_shift(v, s) = floor(v / 2^s + 1/2), written with C99 division and remainder.',
  ];
  return {
    fixed: true,
    wordBits: W,
    accBits: 2 * W,
    wordType: word,
    accType: acc,
    sampleType: word,
    accMaxText: W === 16 ? 'INT32_MAX' : 'INT64_MAX',
    accMinText: W === 16 ? 'INT32_MIN' : 'INT64_MIN',
    wordMaxText: W === 16 ? 'INT16_MAX' : 'INT32_MAX',
    wordMinText: W === 16 ? 'INT16_MIN' : 'INT32_MIN',
    outputMinText: intLiteral(impl.outputMin, W),
    outputMaxText: intLiteral(impl.outputMax, W),
    outputShift: impl.outputShift,
    anyTwoGroups: sections.some((s) => s.twoGroups),
    sections,
    arithmetic,
    saturationText: `every accumulator add saturates to ${2 * W} bits; each section output saturates to the ${W}-bit word; the output is clamped to [${impl.outputMin}, ${impl.outputMax}] counts (the state keeps the unclamped value, so add anti-windup in the caller where the actuator saturates).`,
    coefficientRows: impl.sections.flatMap((s, k) => s.groups.flatMap((g) => g.terms.map((t) => ({ section: k + 1, name: t.name, exact: num(t.exact), stored: `${t.coef} / 2^${g.shift}`, format: qFormat(W, g.shift) })))),
  };
}

function floatData(impl: FloatImplementation) {
  const sections = impl.sections.map((s, k) => {
    const names = s.order === 1 ? ['b0', 'b1', 'a1'] : ['b0', 'b1', 'b2', 'a1', 'a2'];
    const vals = s.order === 1 ? [s.bf[0], s.bf[1], s.af[0]] : [...s.bf, ...s.af];
    const c = (n: string) => `k_sec${k + 1}[${names.indexOf(n)}]`;
    const lines = s.order === 1
      ? [`y = ${c('b0')} * x + st->s[${k}][0];`, `st->s[${k}][0] = ${c('b1')} * x - ${c('a1')} * y;`]
      : [`y = ${c('b0')} * x + st->s[${k}][0];`, `st->s[${k}][0] = (${c('b1')} * x - ${c('a1')} * y) + st->s[${k}][1];`, `st->s[${k}][1] = ${c('b2')} * x - ${c('a2')} * y;`];
    return {
      index: k + 1, order: s.order, orderLabel: s.order === 1 ? 'first order' : 'second order',
      count: names.length, values: vals.map(floatLiteral).join(', '), tableComment: `${names.join(', ')} (float32)`, lines, names, vals,
    };
  });
  const arithmetic = [
    'Structure: transposed direct form II per section, float32 (IEEE 754 single precision).',
    'Sign convention: each section is H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2); the a',
    'coefficients keep the sign of the denominator and their products are subtracted:',
    '  y = b0 x + s0;  s0 = (b1 x - a1 y) + s1;  s1 = b2 x - a2 y   (first order: s0 = b1 x - a1 y)',
    'Coefficient order: k_secK[] = { b0, b1, b2, a1, a2 } ({ b0, b1, a1 } for first order).',
    'State order: s[k][0] = s0, s[k][1] = s1 of section k.',
    'Every operation rounds to float32: build with -ffp-contract=off (no fused multiply-add).',
    `Saturation: the output is clamped to [${impl.outputMin}, ${impl.outputMax}] (the state is not clamped).`,
  ];
  return {
    fixed: false,
    wordType: 'float', sampleType: 'float', accType: 'float', wordBits: 32, accBits: 32,
    outputMinText: floatLiteral(impl.outputMin), outputMaxText: floatLiteral(impl.outputMax),
    sections, arithmetic, anyTwoGroups: false, outputShift: 0,
    saturationText: `the output is clamped to [${impl.outputMin}, ${impl.outputMax}] (the state keeps the unclamped value, so add anti-windup in the caller where the actuator saturates).`,
    coefficientRows: sections.flatMap((s) => s.names.map((n, i) => ({ section: s.index, name: n, exact: num(impl.sections[s.index - 1][n.startsWith('b') ? 'b' : 'a'][n.startsWith('b') ? Number(n[1]) : Number(n[1]) - 1]), stored: floatLiteral(s.vals[i]), format: 'float32' }))),
  };
}

export interface RenderedFiles { readme: string; header: string; source: string; test: string; makefile: string; csv: string }

export function renderFiles(ctx: BundleContext, impl: Implementation, vectors: Vectors): RenderedFiles {
  const d = impl.kind === 'fixed' ? fixedData(impl) : floatData(impl);
  const overview = impl.sections.map((s, k) => {
    const fmt = impl.kind === 'fixed' ? `; ${impl.sections[k].groups.map((g) => groupLabel(g, impl.wordLength)).join('; ')}` : '';
    return `Section ${k + 1}: ${s.order === 1 ? 'first' : 'second'} order, poles ${s.poles.map(rootText).join(', ') || 'none'}, zeros ${s.zeros.map(rootText).join(', ') || 'none'}${fmt}.`;
  });
  const lines = (vals: number[]) => {
    const lit = (v: number) => (impl.kind === 'fixed' ? intLiteral(v, impl.wordLength) : floatLiteral(v));
    const out: string[] = [];
    for (let i = 0; i < vals.length; i += 8) out.push(vals.slice(i, i + 8).map(lit).join(', ') + (i + 8 < vals.length ? ',' : ''));
    return out;
  };
  const data = {
    ...d,
    prefix: ctx.prefix,
    upper: ctx.prefix.toUpperCase(),
    guard: `${ctx.prefix.toUpperCase()}_H`,
    designName: ctx.designName.replace(/\*\//g, '* /'),
    version: ctx.versionNumber,
    generatorVersion: GENERATOR_VERSION,
    methodLabel: METHOD_LABELS[ctx.method],
    sampleRateHz: num(ctx.sampleRateHz),
    periodText: num(1 / ctx.sampleRateHz),
    sectionCount: impl.sections.length,
    structureLabel: impl.structure === 'offset-form-1' ? 'offset form' : impl.structure === 'direct-form-1' ? 'direct form I' : 'transposed direct form II',
    implementationLabel: impl.kind === 'fixed'
      ? `${impl.wordLength}-bit fixed point, ${2 * impl.wordLength}-bit accumulator, ${impl.structure === 'offset-form-1' ? 'offset form' : 'direct form I'}`
      : 'float32, transposed direct form II',
    overview,
    inputScaleText: num(ctx.inputScale),
    outputScaleText: num(ctx.outputScale),
    gainFoldText: num(ctx.gainFold),
    outputMin: num(impl.outputMin),
    outputMax: num(impl.outputMax),
    sampleCount: vectors.rows.length,
    segmentsText: vectors.segments.map((s) => `${s.name} (n = ${s.start}…${s.start + s.length - 1})`).join(', '),
    boundText: vectors.bound.toPrecision(4),
    limitsReached: vectors.limitsReached,
    uLines: lines(vectors.rows.map((r) => r.uRaw)),
    yLines: lines(vectors.rows.map((r) => r.yRaw)),
  };
  const real = (v: number) => (impl.kind === 'fixed' ? num(Number(v.toPrecision(12))) : Math.fround(v).toPrecision(9));
  const raw = (v: number) => (impl.kind === 'fixed' ? String(v) : Math.fround(v).toPrecision(9));
  const csv = ['n,u_raw,y_raw,u,y', ...vectors.rows.map((r) => `${r.n},${raw(r.uRaw)},${raw(r.yRaw)},${real(r.u)},${real(r.y)}`)].join('\n') + '\n';
  return {
    readme: template('README.md.hbs')(data),
    header: template('controller.h.hbs')(data),
    source: template('controller.c.hbs')(data),
    test: template('test.c.hbs')(data),
    makefile: template('Makefile.hbs')(data),
    csv,
  };
}
