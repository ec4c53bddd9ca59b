import { z } from 'zod';
import { compensatorSchema } from './compensator';
import { implementationSettingsSchema } from './implementation';
import { MAX_SAMPLE_RATE_HZ, methodNameSchema } from './discretize';

/**
 * Saved designs: the spec stored in every version, and the payloads of
 * /api/v1/workspaces/:workspaceId/designs (list, create, detail, versions, save, rename/archive).
 *
 * Units: roots and corner frequencies in rad/s, time constants in s, rates in Hz (DESIGN.md).
 * Imports only zod and other schemas: the server validates with it, the editor forms parse with it.
 */

/** Version status. Only 'draft' is written for now; review and release add the others. */
export const VERSION_STATUSES = ['draft', 'in-review', 'approved', 'changes-requested'] as const;
export const versionStatusSchema = z.enum(VERSION_STATUSES);
export type VersionStatus = z.infer<typeof versionStatusSchema>;

const positive = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, `${what} must be a finite number`)
    .refine((v) => v > 0, `${what} must be greater than 0`);

const nonzeroGain = z
  .number({ error: 'gain must be a number' })
  .refine(Number.isFinite, 'gain must be a finite number')
  .refine((v) => v !== 0, 'gain must not be 0');

/**
 * How the user entered the compensator, so the editor reopens in the same form. The
 * compensator itself is always stored as well (it is what gets computed); this is a hint.
 * - lead: K(s + zero)/(s + pole), zero and pole in rad/s (lead when zero < pole, lag when zero > pole)
 * - time-constant: K(tauZero·s + 1)/(tauPole·s + 1), time constants in s
 * - zpk / tf: the general forms; the values are in `compensator`
 * - op-amp: the two-op-amp lead/lag network (input R1‖C1, feedback R2‖C2, then an inverting
 *   stage R4/R3), values in ohms and farads; H(s) = (R4·C1)/(R3·C2) · (s + 1/(R1C1))/(s + 1/(R2C2))
 */
export const entrySchema = z.discriminatedUnion('form', [
  z.strictObject({
    form: z.literal('lead'),
    gain: nonzeroGain.describe('K of K(s + zero)/(s + pole): the root-locus gain'),
    zero: positive('zero').describe('rad/s; the zero lies at s = −zero'),
    pole: positive('pole').describe('rad/s; the pole lies at s = −pole'),
  }),
  z.strictObject({
    form: z.literal('time-constant'),
    gain: nonzeroGain.describe('K of K(tauZero·s + 1)/(tauPole·s + 1): the DC gain'),
    tauZero: positive('tauZero').describe('s'),
    tauPole: positive('tauPole').describe('s'),
  }),
  z.strictObject({ form: z.literal('zpk') }),
  z.strictObject({ form: z.literal('tf') }),
  z.strictObject({
    form: z.literal('op-amp'),
    r1: positive('r1').describe('ohms; input resistor, in parallel with C1'),
    c1: positive('c1').describe('farads; input capacitor'),
    r2: positive('r2').describe('ohms; feedback resistor of the first stage, in parallel with C2'),
    c2: positive('c2').describe('farads; feedback capacitor of the first stage'),
    r3: positive('r3').describe('ohms; input resistor of the inverting second stage'),
    r4: positive('r4').describe('ohms; feedback resistor of the inverting second stage'),
  }),
]);
export type DesignEntry = z.infer<typeof entrySchema>;

/** Drift the reviewer accepts; the editor marks figures beyond them. */
export const DEFAULT_TOLERANCES = { poleDriftPct: 5, dcGainDriftPct: 1, magErrorDb: 1, phaseErrorDeg: 5 } as const;

export const tolerancesSchema = z.strictObject({
  poleDriftPct: positive('pole drift tolerance').default(DEFAULT_TOLERANCES.poleDriftPct).describe('%, of |s| of each pole'),
  dcGainDriftPct: positive('DC gain tolerance').default(DEFAULT_TOLERANCES.dcGainDriftPct).describe('%'),
  magErrorDb: positive('magnitude tolerance').default(DEFAULT_TOLERANCES.magErrorDb).describe('dB, largest in band'),
  phaseErrorDeg: positive('phase tolerance').default(DEFAULT_TOLERANCES.phaseErrorDeg).describe('degrees, largest in band'),
});
export type Tolerances = z.infer<typeof tolerancesSchema>;

/** The spec saved in every design version. */
export const designSpecSchema = z
  .strictObject({
    compensator: compensatorSchema,
    entry: entrySchema.optional(),
    plant: compensatorSchema.optional().describe('continuous plant; discretized by ZOH in the loop analysis'),
    sampleRateHz: positive('sample rate').refine((v) => v <= MAX_SAMPLE_RATE_HZ, `sample rate must not exceed ${MAX_SAMPLE_RATE_HZ} Hz`).describe('Hz'),
    method: methodNameSchema.describe('the method chosen for the implementation'),
    prewarpHz: positive('prewarp frequency').optional().describe('Hz, in (0, fs/2)'),
    delaySamples: z.union([z.literal(0), z.literal(1)], { error: 'computation delay is 0 or 1 sample' }).optional(),
    bandHz: positive('band').optional().describe('Hz, in (0, fs/2]; default a quarter of Nyquist'),
    tolerances: tolerancesSchema.default({ ...DEFAULT_TOLERANCES }),
    implementation: implementationSettingsSchema.optional().describe('fixed-point (or float32) implementation: word length, scaling, limits, C prefix, structure'),
  })
  .superRefine((spec, ctx) => {
    const nyquist = spec.sampleRateHz / 2;
    if (spec.prewarpHz !== undefined && spec.prewarpHz >= nyquist) {
      ctx.addIssue({ code: 'custom', path: ['prewarpHz'], message: `prewarp frequency must be below Nyquist (${nyquist} Hz)` });
    }
    if (spec.bandHz !== undefined && spec.bandHz > nyquist) {
      ctx.addIssue({ code: 'custom', path: ['bandHz'], message: `band must not exceed Nyquist (${nyquist} Hz)` });
    }
    if (spec.entry) {
      const wants = spec.entry.form === 'tf' ? 'tf' : 'zpk';
      if (spec.compensator.form !== wants) {
        ctx.addIssue({ code: 'custom', path: ['entry', 'form'], message: `entry form "${spec.entry.form}" needs a ${wants} compensator` });
      }
    }
  });
/** The spec as parsed (defaults applied). */
export type DesignSpec = z.infer<typeof designSpecSchema>;
/** The spec as sent (tolerances may be left out). */
export type DesignSpecInput = z.input<typeof designSpecSchema>;

export const designNameSchema = z
  .string({ error: 'name must be text' })
  .trim()
  .min(1, 'Enter a name')
  .max(120, 'Use at most 120 characters');

/** POST /api/v1/workspaces/:workspaceId/designs */
export const createDesignRequestSchema = z.strictObject({ name: designNameSchema, spec: designSpecSchema });
export type CreateDesignRequest = z.input<typeof createDesignRequestSchema>;

/** PATCH /api/v1/workspaces/:workspaceId/designs/:designId — rename, archive, unarchive */
export const updateDesignRequestSchema = z
  .strictObject({ name: designNameSchema.optional(), archived: z.boolean().optional() })
  .refine((v) => v.name !== undefined || v.archived !== undefined, 'Send a name or archived');
export type UpdateDesignRequest = z.input<typeof updateDesignRequestSchema>;

/** PUT /api/v1/workspaces/:workspaceId/designs/:designId/spec — a new draft version only when the spec changed */
export const saveSpecRequestSchema = z.strictObject({ spec: designSpecSchema });
export type SaveSpecRequest = z.input<typeof saveSpecRequestSchema>;

/** GET …/designs?archived=true|false (default false: the active designs) */
export const listDesignsQuerySchema = z.object({ archived: z.enum(['true', 'false']).optional() });

const timestamp = z.string().describe('ISO 8601 date-time');

export const designSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  archived: z.boolean(),
  updatedAt: timestamp,
  latestVersion: z.object({ number: z.number().int(), status: versionStatusSchema, createdAt: timestamp, authorName: z.string() }),
});
export type DesignSummary = z.infer<typeof designSummarySchema>;

export const designListSchema = z.object({ designs: z.array(designSummarySchema) });

export const versionSummarySchema = z.object({
  number: z.number().int(),
  status: versionStatusSchema,
  specHash: z.string(),
  createdAt: timestamp,
  authorName: z.string(),
});
export type VersionSummary = z.infer<typeof versionSummarySchema>;

/** Answer of POST …/designs (201), GET …/designs/:designId and PATCH …/designs/:designId */
export const designDetailSchema = z.object({
  design: z.object({ id: z.number().int(), name: z.string(), archived: z.boolean(), updatedAt: timestamp }),
  versions: z.array(versionSummarySchema).describe('newest first'),
  latest: z.object({ number: z.number().int(), status: versionStatusSchema, spec: designSpecSchema }),
});
export type DesignDetail = z.infer<typeof designDetailSchema>;

/** Answer of GET …/designs/:designId/versions/:number */
export const designVersionResponseSchema = z.object({
  version: versionSummarySchema.extend({ spec: designSpecSchema }),
});
export type DesignVersion = z.infer<typeof designVersionResponseSchema>['version'];

/** Answer of PUT …/designs/:designId/spec */
export const saveSpecResponseSchema = z.object({
  created: z.boolean().describe('false when the spec equals the latest version (no new version)'),
  version: z.object({ number: z.number().int(), status: versionStatusSchema }),
});
export type SaveSpecResponse = z.infer<typeof saveSpecResponseSchema>;
