import { z } from 'zod';
import { compensatorSchema } from './compensator';

/**
 * `POST /api/v1/lead-placement`: a lead C(s) = K(s + zero)/(s + pole) that puts a pair of
 * closed-loop poles at a target damping ratio ζ and natural frequency ωn, from the angle and
 * magnitude conditions of the root locus (negative unity feedback around C(s)·G(s)).
 *
 * Units: ωn, zero and pole in rad/s (DESIGN.md); angles in degrees. The lead's zero lies at
 * s = −zero and its pole at s = −pole (a lead entry of schemas/design.ts, zpk zeros [−zero],
 * poles [−pole]). Imports only zod and other schemas (the client bundles it).
 */

/** Largest phase lead asked of one lead network; beyond it the answer suggests two leads or another target. */
export const MAX_LEAD_ANGLE_DEG = 80;
/** Largest accepted ωn and fixed zero, rad/s (keeps every product of the loop inside double range). */
export const MAX_PLACEMENT_RAD_PER_SEC = 1e9;

export const PLACEMENT_RULES = ['bisector', 'zero-at'] as const;
export const placementRuleSchema = z
  .enum(PLACEMENT_RULES, { error: `rule must be one of ${PLACEMENT_RULES.join(', ')}` })
  .describe('bisector: zero and pole symmetric about the bisector of the angle at the target pole (largest zero/pole ratio); zero-at: the zero is given, the pole follows');
export type PlacementRule = z.infer<typeof placementRuleSchema>;

const finite = (what: string) => z.number({ error: `${what} must be a finite number` });
const positiveRadPerSec = (what: string) =>
  finite(what)
    .refine((v) => v > 0, `${what} must be greater than 0`)
    .refine((v) => v <= MAX_PLACEMENT_RAD_PER_SEC, `${what} must not exceed ${MAX_PLACEMENT_RAD_PER_SEC} rad/s`);

export const leadPlacementRequestSchema = z
  .strictObject({
    plant: compensatorSchema.describe('continuous plant G(s), zpk or tf (descending powers of s)'),
    zeta: finite('zeta')
      .refine((v) => v > 0 && v < 1, 'zeta (damping ratio) must lie strictly between 0 and 1 for a complex pole pair')
      .describe('target damping ratio ζ, in (0, 1)'),
    wn: positiveRadPerSec('wn').describe('target natural frequency ωn, rad/s'),
    rule: placementRuleSchema.default('bisector'),
    zero: positiveRadPerSec('zero').optional().describe("rad/s; the lead's zero at s = −zero; needed by rule 'zero-at', refused otherwise"),
  })
  .superRefine((v, ctx) => {
    if (v.rule === 'zero-at' && v.zero === undefined) {
      ctx.addIssue({ code: 'custom', path: ['zero'], message: "rule 'zero-at' needs the zero (rad/s): the lead's zero at s = −zero" });
    }
    if (v.rule === 'bisector' && v.zero !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['zero'], message: "rule 'bisector' places the zero itself; leave zero out or choose rule 'zero-at'" });
    }
  });
export type LeadPlacementRequest = z.output<typeof leadPlacementRequestSchema>;
export type LeadPlacementRequestBody = z.input<typeof leadPlacementRequestSchema>;

const complexOut = z.object({ re: z.number(), im: z.number() });

export const leadPlacementResponseSchema = z.object({
  rule: placementRuleSchema,
  zero: z.number().describe("rad/s; the lead's zero lies at s = −zero"),
  pole: z.number().describe("rad/s; the lead's pole lies at s = −pole"),
  gain: z.number().describe('K of K(s + zero)/(s + pole), the root-locus gain, from |C(s_d)G(s_d)| = 1'),
  angleDeficiencyDeg: z.number().describe('phase lead the compensator supplies at s_d: ±180° − ∠G(s_d), in (0°, 90°)'),
  sDesired: complexOut.describe('target closed-loop pole s_d = −ζωn + jωn√(1 − ζ²), rad/s'),
  check: z.object({
    angleDeg: z.number().describe('∠C(s_d)G(s_d), degrees; ±180 when the angle condition holds'),
    magnitude: z.number().describe('|C(s_d)G(s_d)|; 1 when the magnitude condition holds'),
  }),
  closedLoopPoles: z.array(complexOut).describe('every root of den(CG) + num(CG), rad/s'),
  dominantOk: z.boolean().describe('true when s_d and its conjugate are the closed-loop poles closest to the imaginary axis (poles cancelled by a closed-loop zero aside)'),
  dominanceNotes: z.array(z.string()).describe('other poles or zeros that spoil or weaken the dominance of s_d'),
});
export type LeadPlacementResponse = z.infer<typeof leadPlacementResponseSchema>;
