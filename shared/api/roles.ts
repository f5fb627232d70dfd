/**
 * Role names. Global roles belong to a user; studio roles to a membership.
 */
import { z } from 'zod';

export const GLOBAL_ROLES = ['admin', 'technician'] as const;
export type GlobalRole = (typeof GLOBAL_ROLES)[number];
export const globalRoleSchema = z.enum(GLOBAL_ROLES);

export const STUDIO_ROLES = ['instructor', 'critic', 'participant'] as const;
export type StudioRole = (typeof STUDIO_ROLES)[number];
export const studioRoleSchema = z.enum(STUDIO_ROLES);

export const STUDIO_ROLE_LABELS: Record<StudioRole, string> = {
  instructor: 'Instructor',
  critic: 'Critic',
  participant: 'Participant',
};

export const GLOBAL_ROLE_LABELS: Record<GlobalRole, string> = {
  admin: 'Admin',
  technician: 'Technician',
};
