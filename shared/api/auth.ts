/**
 * Payloads of /api/auth.
 */
import { z } from 'zod';
import { emailSchema, passwordSchema } from './common.js';
import { globalRoleSchema, studioRoleSchema } from './roles.js';

export const loginBodySchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginBody = z.infer<typeof loginBodySchema>;

export const membershipSummarySchema = z.object({
  studioId: z.number(),
  studioName: z.string(),
  role: studioRoleSchema,
});
export type MembershipSummary = z.infer<typeof membershipSummarySchema>;

/** The signed-in user as `GET /api/auth/me` and `POST /api/auth/login` return it. */
export const sessionUserSchema = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  globalRole: globalRoleSchema.nullable(),
  memberships: z.array(membershipSummarySchema),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** `POST /api/auth/password-reset` — always answers 202 so addresses cannot be probed. */
export const resetRequestBodySchema = z.object({ email: emailSchema });
export type ResetRequestBody = z.infer<typeof resetRequestBodySchema>;

/** `POST /api/auth/password-reset/confirm`. */
export const resetConfirmBodySchema = z.object({
  token: z.string().min(20).max(200),
  password: passwordSchema,
});
export type ResetConfirmBody = z.infer<typeof resetConfirmBodySchema>;
