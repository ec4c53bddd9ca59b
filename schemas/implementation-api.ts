import { z } from 'zod';
import { discretizeRequestSchema, methodNameSchema } from './discretize';
import { STRUCTURES, implementationSettingsSchema, toleranceSchema } from './implementation';

/**
 * The implementation API: the stateless preview `POST /api/v1/implement` and the stored code
 * bundle of a design version (…/designs/:designId/versions/:number/bundle …). Request and
 * answer shapes only; imports only zod and other schemas (the client bundles it).
 *
 * Routes (DESIGN.md "The code bundle"):
 * - `POST /api/v1/implement` {compensator, sampleRateHz, method, prewarpHz?, settings, tolerances?}
 *   → 200 {analysis, files}; any signed-in member (or an API token); stateless.
 * - `POST /api/v1/workspaces/:workspaceId/designs/:designId/versions/:number/bundle` → 201 (made
 *   now) or 200 (already stored; idempotent) {bundle}; owners and engineers; 400 with the issue
 *   path `spec.implementation` when the version has no implementation settings.
 * - `GET …/versions/:number/bundle` → {bundle} or 404; `GET …/versions/:number/bundle/files` →
 *   {files}; `GET …/versions/:number/bundle.zip` → the zip (application/zip, attachment
 *   `<prefix>-v<N>.zip`); every member, viewers included.
 *
 * JSON has no Infinity or NaN: `JSON.stringify` writes them as null, so every figure of the
 * analysis that can be infinite or undefined is `number | null` here, described per field.
 */

// ---------------------------------------------------------------- request

const discretizeShape = discretizeRequestSchema.shape;

export const implementRequestSchema = z
  .strictObject({
    compensator: discretizeShape.compensator,
    sampleRateHz: discretizeShape.sampleRateHz,
    method: methodNameSchema.describe('the discretization method to implement'),
    prewarpHz: discretizeShape.prewarpHz,
    settings: implementationSettingsSchema.describe('word length, scaling, output limits, C prefix, structure'),
    tolerances: toleranceSchema
      .optional()
      .describe('quantized against ideal discrete controller; used for warnings and word-length advice (defaults apply per field)'),
  })
  .superRefine((req, ctx) => {
    // The same checks as the compute API for this one method (roots below Nyquist, prewarp
    // frequency in (0, fs/2) or defined): run its schema rather than repeat its rules. Only
    // once the compensator itself is valid, so its own issues are not reported twice.
    if (!discretizeShape.compensator.safeParse(req.compensator).success) return;
    const check = discretizeRequestSchema.safeParse({
      compensator: req.compensator,
      sampleRateHz: req.sampleRateHz,
      methods: [req.method],
      ...(req.prewarpHz === undefined ? {} : { prewarpHz: req.prewarpHz }),
    });
    if (!check.success) {
      for (const issue of check.error.issues) {
        if (issue.code === 'custom') ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
      }
    }
  });
/** The request body as sent (optional fields may be missing). */
export type ImplementRequestBody = z.input<typeof implementRequestSchema>;
/** The parsed request (defaults filled in). */
export type ImplementRequest = z.output<typeof implementRequestSchema>;

// ---------------------------------------------------------------- answer

/** A number that is null on the wire when it is infinite or undefined. */
const maybe = (d: string) => z.number().nullable().describe(d);

export const severitySchema = z
  .enum(['info', 'caution', 'problem'])
  .describe('info: worth knowing; caution: check it; problem: the implementation misses the design');
export type Severity = z.infer<typeof severitySchema>;

export const implementationWarningSchema = z.object({
  code: z.string().describe('stable machine-readable code, e.g. "dc-gain-drift", "offset-form-helps"'),
  severity: severitySchema,
  message: z.string(),
});
export type ImplementationWarning = z.infer<typeof implementationWarningSchema>;

export const coefficientRowSchema = z.object({
  section: z.number().int().describe('1-based section index'),
  name: z.string().describe('coefficient name, e.g. "b0", "a1", or "d1" (offset form: a1 = −1 + d1)'),
  exact: z.number().describe('ideal value (double precision), with the scaling folded in'),
  quantized: z.number().describe('value the implementation holds: integer / 2^F (fixed point) or the float32 value'),
  integer: z.number().int().nullable().describe('integer stored in the C (fixed point); null for float32'),
  fractionalBits: z.number().int().nullable().describe('fractional bits F of its format (fixed point); null for float32'),
  error: z.number().describe('quantized − exact'),
  significantBits: z.number().int().describe('bits of the stored integer magnitude (fixed point), 24 for float32; 0 for a coefficient lost to 0'),
});
export type CoefficientRowWire = z.infer<typeof coefficientRowSchema>;

export const zPointSchema = z
  .object({ re: z.number(), im: z.number() })
  .describe('a z-plane point {re, im}');

export const rootDriftSchema = z.object({
  section: z.number().int().describe('1-based section the root belongs to'),
  ideal: zPointSchema.describe('root of the ideal (double-precision) section'),
  quantized: z
    .object({ re: z.number().nullable(), im: z.number().nullable() })
    .describe('the matching root after quantization; both parts null when quantization lost it (moved to infinity)'),
  driftZ: maybe('|z_q − z| in the z-plane; null when the root was lost'),
  driftPct: maybe('100·|ln z_q − ln z| / |ln z|, percent of the equivalent |s|; null for roots at z = 0, a lost root, or an infinite drift'),
});
export type RootDriftWire = z.infer<typeof rootDriftSchema>;

export const implementationMetricsSchema = z.object({
  poleDriftPct: maybe('largest pole drift, percent of the equivalent |s| (0 when every pole is kept exactly); null when infinite'),
  dcGainIdeal: maybe('ideal DC gain, real output units per real input unit; null when infinite'),
  dcGainQuantized: maybe('quantized DC gain, same units; null when infinite'),
  dcGainDriftPct: maybe('DC-gain drift, percent; null when the DC gain or its drift is infinite'),
  responseErrorDb: maybe('largest |20·log10|H_q/H|| up to 0.95·Nyquist, dB; null when infinite'),
  stableIdeal: z.boolean(),
  stableQuantized: z.boolean(),
});
export type ImplementationMetrics = z.infer<typeof implementationMetricsSchema>;

export const nodeHeadroomSchema = z.object({
  section: z.number().int(),
  l1FromInput: maybe('L1 norm of the impulse response from the input to this section’s output (raw units); null when infinite'),
  worstCase: maybe('worst-case |node| for a full-scale input, raw counts; null when unbounded (a pole on or near the unit circle)'),
  accumulatorWorstCase: maybe('worst-case accumulator magnitude of this section'),
  accumulatorLimit: z.number().describe('the accumulator’s limit, 2^(2W−1) − 1'),
});
export type NodeHeadroomWire = z.infer<typeof nodeHeadroomSchema>;

const wordLengthSchema = implementationSettingsSchema.shape.wordLength;
const structureSchema = z.enum(STRUCTURES);

export const sectionFormatSchema = z.object({
  index: z.number().int().describe('1-based'),
  order: z.union([z.literal(1), z.literal(2)]),
  formats: z.array(z.string()).describe('Q formats of its coefficient groups, e.g. ["Q2.13"], or ["Q-9.24", "Q1.14"] for the offset form; ["float32"]'),
  shifts: z.array(z.number().int()).describe('right shift of each group (its fractional bits); empty for float32'),
});

export const wordLengthCandidateSchema = z.object({
  wordLength: wordLengthSchema,
  structure: structureSchema,
  meetsTolerances: z.boolean(),
  metrics: implementationMetricsSchema,
  formats: z.array(z.array(z.string())).describe('per section, the Q formats of its coefficient groups'),
});
export type WordLengthCandidate = z.infer<typeof wordLengthCandidateSchema>;

/** Mirror of `ImplementationAnalysis` (server/fixed-point/index.ts) as it travels in JSON. */
export const implementationAnalysisSchema = z.object({
  wordLength: wordLengthSchema,
  structure: structureSchema.describe('the structure used (the given one, or the default of the word length)'),
  gainFold: z.number().describe('factor folded into the coefficients: input scale / output scale (fixed point), 1 (float32)'),
  sections: z.array(sectionFormatSchema),
  coefficients: z.array(coefficientRowSchema),
  poles: z.array(rootDriftSchema),
  zeros: z.array(rootDriftSchema),
  metrics: implementationMetricsSchema,
  headroom: z.array(nodeHeadroomSchema).describe('fixed point only; empty for float32'),
  warnings: z.array(implementationWarningSchema),
  tolerances: z.object({ poleDriftPct: z.number(), dcGainDriftPct: z.number(), responseErrorDb: z.number() }).describe('the tolerances applied'),
  advice: z.object({
    recommended: z
      .object({ wordLength: wordLengthSchema, structure: structureSchema })
      .nullable()
      .describe('smallest word length (then structure) meeting every tolerance; null when none does'),
    candidates: z.array(wordLengthCandidateSchema).describe('16-bit and 32-bit direct form I and offset form, then float32'),
    offsetForm: z
      .object({
        wordLength: z.union([z.literal(16), z.literal(32)]),
        directForm: implementationMetricsSchema,
        offsetForm: implementationMetricsSchema,
      })
      .nullable()
      .describe('offset form against direct form I at this word length, when it helps; null otherwise'),
  }),
});
export type ImplementationAnalysisWire = z.infer<typeof implementationAnalysisSchema>;

export const bundleFileSchema = z.object({
  path: z.string().describe('path inside the bundle’s top folder <prefix>-v<N>/, e.g. "include/pitch_lead.h"'),
  content: z.string().describe('the file’s text (UTF-8)'),
});
export type BundleFile = z.infer<typeof bundleFileSchema>;

/** Answer of `POST /api/v1/implement`. */
export const implementResponseSchema = z.object({
  analysis: implementationAnalysisSchema,
  files: z.array(bundleFileSchema).describe('the rendered bundle files, in zip entry order (an unsaved preview: version number 0)'),
});
export type ImplementResponse = z.infer<typeof implementResponseSchema>;

// ---------------------------------------------------------------- stored bundle

export const bundleInfoSchema = z.object({
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'SHA-256 in lower-case hex').describe('SHA-256 of the zip bytes, lower-case hex'),
  fileName: z.string().describe('download name, <prefix>-v<N>.zip'),
  sizeBytes: z.number().int().nonnegative().describe('size of the zip, bytes'),
  generatorVersion: z.string().describe('version of the Samplewright generator that made it'),
  createdAt: z.string().describe('ISO 8601 date-time'),
  versionNumber: z.number().int().positive().describe('the design version it was made from'),
});
export type BundleInfo = z.infer<typeof bundleInfoSchema>;

/** Answer of `POST …/versions/:number/bundle` (201 or 200) and `GET …/versions/:number/bundle`. */
export const bundleResponseSchema = z.object({ bundle: bundleInfoSchema });
export type BundleResponse = z.infer<typeof bundleResponseSchema>;

/** Answer of `GET …/versions/:number/bundle/files`. */
export const bundleFilesSchema = z.object({ files: z.array(bundleFileSchema) });
export type BundleFiles = z.infer<typeof bundleFilesSchema>;
