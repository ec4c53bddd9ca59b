import { z } from 'zod';

/**
 * Implementation settings of a discrete controller: word length, scaling, output limits,
 * C prefix and structure. Shared by the implementation form and the server.
 *
 * Units: `inputScale` and `outputScale` are real units per LSB (e.g. an ADC's volts per
 * count, 3.3 / 4096; a PWM's duty per count, 1 / 1000). Output limits are raw output counts
 * for fixed-point builds; float32 builds work in real units, so their limits are real
 * output units. Example:
 *   { wordLength: 16, inputScale: 0.000805664, outputScale: 0.001,
 *     outputLimits: { min: 0, max: 1000 }, prefix: 'pitch_lead', structure: 'direct-form-1' }
 */

export const WORD_LENGTHS = [16, 32, 'float32'] as const;
export type WordLength = (typeof WORD_LENGTHS)[number];

/**
 * Structures of one section:
 * - `direct-form-1`: y = Σ b·x − Σ a·y in one accumulator (fixed point).
 * - `offset-form-1`: direct form I whose feedback coefficients are stored as small offsets
 *   from the values of poles at z = 1 (a1 = −1 + d1 for first order; a1 = −2 + d1,
 *   a2 = 1 + d2 for second order) in a finer format of their own; keeps poles near z = 1
 *   accurate at high sample rates (fixed point).
 * - `transposed-direct-form-2`: float32 builds.
 */
export const STRUCTURES = ['direct-form-1', 'offset-form-1', 'transposed-direct-form-2'] as const;
export type Structure = (typeof STRUCTURES)[number];

/** C89/C99/C11 keywords and common reserved words that may not be used as the prefix. */
export const C_KEYWORDS: readonly string[] = [
  'auto', 'break', 'case', 'char', 'const', 'continue', 'default', 'do', 'double', 'else', 'enum',
  'extern', 'float', 'for', 'goto', 'if', 'inline', 'int', 'long', 'register', 'restrict', 'return',
  'short', 'signed', 'sizeof', 'static', 'struct', 'switch', 'typedef', 'union', 'unsigned', 'void',
  'volatile', 'while', '_Bool', '_Complex', '_Imaginary', '_Alignas', '_Alignof', '_Atomic',
  '_Generic', '_Noreturn', '_Static_assert', '_Thread_local', 'bool', 'true', 'false', 'main',
];

/** Raw-count range of a signed word of the given length, e.g. 16 → [−32768, 32767]. */
export function wordRange(wordLength: 16 | 32): { min: number; max: number } {
  return { min: -(2 ** (wordLength - 1)), max: 2 ** (wordLength - 1) - 1 };
}

const scale = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .refine((v) => Number.isFinite(v), `${what} must be finite`)
    .refine((v) => v > 0, `${what} must be greater than 0 (real units per LSB)`);

export const implementationSettingsSchema = z
  .object({
    wordLength: z.union([z.literal(16), z.literal(32), z.literal('float32')], {
      error: 'Word length must be 16, 32 or "float32"',
    }),
    inputScale: scale('Input scale'),
    outputScale: scale('Output scale'),
    outputLimits: z.object({
      min: z.number({ error: 'Lower output limit must be a number' }).refine(Number.isFinite, 'Lower output limit must be finite'),
      max: z.number({ error: 'Upper output limit must be a number' }).refine(Number.isFinite, 'Upper output limit must be finite'),
    }),
    prefix: z
      .string({ error: 'C prefix must be a string' })
      .min(1, 'Enter a C prefix')
      .max(31, 'C prefix must be at most 31 characters')
      .regex(/^[A-Za-z_][A-Za-z0-9_]*$/, 'C prefix must be a C identifier: a letter or _ then letters, digits or _')
      .refine((v) => !C_KEYWORDS.includes(v), 'C prefix must not be a C keyword')
      .refine((v) => !/^_[A-Z_]/.test(v), 'C prefix must not start with _ and a capital or a second _ (reserved in C)'),
    structure: z.enum(STRUCTURES, { error: `Structure must be one of ${STRUCTURES.join(', ')}` }).optional(),
  })
  .superRefine((s, ctx) => {
    const { min, max } = s.outputLimits;
    if (Number.isFinite(min) && Number.isFinite(max) && !(min < max)) {
      ctx.addIssue({ code: 'custom', path: ['outputLimits', 'max'], message: 'Upper output limit must be greater than the lower limit' });
    }
    if (s.wordLength !== 'float32') {
      const w = wordRange(s.wordLength);
      for (const key of ['min', 'max'] as const) {
        const v = s.outputLimits[key];
        if (!Number.isInteger(v)) {
          ctx.addIssue({ code: 'custom', path: ['outputLimits', key], message: 'Output limits are raw counts: whole numbers' });
        } else if (v < w.min || v > w.max) {
          ctx.addIssue({ code: 'custom', path: ['outputLimits', key], message: `Output limit must lie within the ${s.wordLength}-bit word [${w.min}, ${w.max}]` });
        }
      }
      if (s.structure === 'transposed-direct-form-2') {
        ctx.addIssue({ code: 'custom', path: ['structure'], message: 'Transposed direct form II is for float32 builds; fixed point uses direct-form-1 or offset-form-1' });
      }
    } else if (s.structure !== undefined && s.structure !== 'transposed-direct-form-2') {
      ctx.addIssue({ code: 'custom', path: ['structure'], message: 'Float32 builds use transposed-direct-form-2' });
    }
  });

export type ImplementationSettingsInput = z.input<typeof implementationSettingsSchema>;
export type ImplementationSettings = z.output<typeof implementationSettingsSchema>;

/** The structure actually used: the given one, else direct-form-1 (fixed) / transposed-direct-form-2 (float32). */
export function effectiveStructure(s: Pick<ImplementationSettings, 'wordLength' | 'structure'>): Structure {
  if (s.structure) return s.structure;
  return s.wordLength === 'float32' ? 'transposed-direct-form-2' : 'direct-form-1';
}

/**
 * Tolerances of the quantized controller against the ideal discrete one; used for warnings
 * and word-length advice. Defaults are a rule of practice of our own (common practice: a
 * percent on gains and corners, a tenth of a dB on the response).
 */
export const toleranceSchema = z.object({
  /** Largest drift of an equivalent s-plane root s = ln(z)·fs, percent of |s|. */
  poleDriftPct: z.number().positive().finite().default(1),
  /** DC-gain drift, percent of the ideal DC gain (ignored where the DC gain is infinite). */
  dcGainDriftPct: z.number().positive().finite().default(1),
  /** Largest magnitude error of the frequency response up to 0.95·Nyquist, dB. */
  responseErrorDb: z.number().positive().finite().default(0.1),
});
export type Tolerances = z.output<typeof toleranceSchema>;
export const DEFAULT_TOLERANCES: Tolerances = { poleDriftPct: 1, dcGainDriftPct: 1, responseErrorDb: 0.1 };
