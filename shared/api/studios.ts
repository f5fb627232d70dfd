/**
 * Payloads of /api/studios and /api/invitations.
 */
import { z } from 'zod';
import { emailSchema, passwordSchema, personNameSchema } from './common.js';
import { studioRoleSchema } from './roles.js';

export const studioSchema = z.object({
  id: z.number(),
  name: z.string(),
  description: z.string(),
  createdAt: z.string(),
  /** The caller's role here, or null (an admin who is not a member). */
  myRole: studioRoleSchema.nullable(),
  memberCount: z.number(),
});
export type Studio = z.infer<typeof studioSchema>;

/** `POST /api/studios` (admin). */
export const createStudioBodySchema = z.object({
  name: z.string().trim().min(2, 'Use at least 2 characters').max(120, 'Use at most 120 characters'),
  description: z.string().trim().max(2000, 'Use at most 2000 characters').default(''),
});
export type CreateStudioBody = z.input<typeof createStudioBodySchema>;

export const memberSchema = z.object({
  userId: z.number(),
  name: z.string(),
  email: z.string(),
  role: studioRoleSchema,
  joinedAt: z.string(),
});
export type Member = z.infer<typeof memberSchema>;

/** `PATCH /api/studios/:studioId/members/:userId` (instructor). */
export const updateMemberBodySchema = z.object({ role: studioRoleSchema });

/** `POST /api/studios/:studioId/invitations` (instructor). */
export const inviteBodySchema = z.object({
  email: emailSchema,
  role: studioRoleSchema,
});
export type InviteBody = z.infer<typeof inviteBodySchema>;

export const invitationStateSchema = z.enum(['pending', 'accepted', 'expired', 'revoked']);
export type InvitationState = z.infer<typeof invitationStateSchema>;

export const invitationSchema = z.object({
  id: z.number(),
  studioId: z.number(),
  email: z.string(),
  role: studioRoleSchema,
  state: invitationStateSchema,
  invitedBy: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
});
export type Invitation = z.infer<typeof invitationSchema>;

/** `GET /api/invitations/:token` (anyone holding the link). */
export const invitationPreviewSchema = z.object({
  studioName: z.string(),
  role: studioRoleSchema,
  email: z.string(),
  invitedBy: z.string(),
  expiresAt: z.string(),
  /** True when an account with this address exists: the person signs in and accepts. */
  accountExists: z.boolean(),
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

/**
 * `POST /api/invitations/:token/accept`. A new person sends name and password and gets an
 * account (and a session); an existing account must be signed in as the invited address and
 * sends `{}`.
 */
export const acceptInvitationBodySchema = z.object({
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
});
export type AcceptInvitationBody = z.infer<typeof acceptInvitationBodySchema>;
