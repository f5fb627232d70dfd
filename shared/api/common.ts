/**
 * Shapes every API answer shares: the error envelope and ids.
 */
import { z } from 'zod';

/** `{ error: { code, message, fields } }` — the one error shape of the API. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    /** Field path (dot-joined, e.g. `body.email`) → message, for forms. */
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;

export const idParam = z.coerce.number().int().positive();

export const emailSchema = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);

/** bcrypt reads at most 72 bytes; longer passwords would be silently truncated, so refuse them. */
export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(72, 'Use at most 72 characters')
  .refine((s) => new TextEncoder().encode(s).length <= 72, 'Use at most 72 bytes');

export const personNameSchema = z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters');
