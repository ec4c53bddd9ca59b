import { z } from 'zod';
import { roleSchema } from './auth';

export const memberSchema = z.object({
  userId: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
});
export type Member = z.infer<typeof memberSchema>;

export const memberAnswerSchema = z.object({ member: memberSchema });

export const memberListSchema = z.object({ members: z.array(memberSchema) });

export const addMemberRequestSchema = z.object({
  email: z.string().trim().min(1, 'Enter an e-mail address').max(254).email('Enter a valid e-mail address'),
  name: z.string().trim().max(120).optional(),
  role: roleSchema,
});
export type AddMemberRequest = z.infer<typeof addMemberRequestSchema>;

/** When the e-mail had no account yet, a password is generated and shown once. */
export const addMemberResponseSchema = z.object({
  member: memberSchema,
  initialPassword: z.string().optional().describe('present only when a new account was created; shown once'),
});

export const changeRoleRequestSchema = z.object({ role: roleSchema });
export type ChangeRoleRequest = z.infer<typeof changeRoleRequestSchema>;
