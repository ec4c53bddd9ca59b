import { z } from 'zod';

/** The one JSON error shape of every failing API answer (DESIGN.md). */
export const apiErrorSchema = z.object({
  error: z.object({
    message: z.string(),
    issues: z
      .array(z.object({ path: z.string().describe('dotted field path, e.g. "compensator.poles.0"'), message: z.string() }))
      .optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;
