import { z } from 'zod';

export const ROLES = ['owner', 'engineer', 'reviewer', 'viewer'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const loginRequestSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').max(254).email('Enter a valid e-mail address'),
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginRequest = z.infer<typeof loginRequestSchema>;

export const userSchema = z.object({ id: z.number().int(), email: z.string(), name: z.string() });
export type User = z.infer<typeof userSchema>;

export const workspaceSchema = z.object({ id: z.number().int(), slug: z.string(), name: z.string() });
export type Workspace = z.infer<typeof workspaceSchema>;

export const membershipSchema = z.object({ workspace: workspaceSchema, role: roleSchema });
export type Membership = z.infer<typeof membershipSchema>;

/** Answer of POST /api/v1/auth/login and GET /api/v1/auth/me. */
export const sessionInfoSchema = z.object({
  user: userSchema,
  memberships: z.array(membershipSchema),
  csrfToken: z.string().describe('send back as the X-CSRF-Token header on every non-GET request made with the cookie'),
});
export type SessionInfo = z.infer<typeof sessionInfoSchema>;

/** POST /api/v1/auth/password: the signed-in user replaces their password (e.g. the one shown once). */
export const changePasswordRequestSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password').max(200),
  newPassword: z.string().min(12, 'Use at least 12 characters').max(200, 'Use at most 200 characters'),
});
export type ChangePasswordRequest = z.infer<typeof changePasswordRequestSchema>;
