/**
 * Payloads of /api/admin.
 */
import { z } from 'zod';
import { globalRoleSchema, studioRoleSchema } from './roles.js';

export const adminUserSchema = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  globalRole: globalRoleSchema.nullable(),
  createdAt: z.string(),
  lastLoginAt: z.string().nullable(),
  memberships: z.array(z.object({ studioId: z.number(), studioName: z.string(), role: studioRoleSchema })),
});
export type AdminUser = z.infer<typeof adminUserSchema>;

/** `PATCH /api/admin/users/:userId`. */
export const updateUserBodySchema = z.object({ globalRole: globalRoleSchema.nullable() });

export const mailSummarySchema = z.object({
  id: z.number(),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  receivedAt: z.string(),
});
export type MailSummary = z.infer<typeof mailSummarySchema>;

export const mailMessageSchema = mailSummarySchema.extend({
  text: z.string(),
  html: z.string().nullable(),
});
export type MailMessage = z.infer<typeof mailMessageSchema>;
