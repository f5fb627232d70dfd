/**
 * Date-times in forms: a `datetime-local` box holds a local date and time without a zone; the
 * API wants an ISO instant. This field schema turns one into the other, with the message at the
 * field when the box is empty or holds no valid date.
 */
import { z } from 'zod';
import { fromLocalInput } from './format.js';

export const localDateTimeSchema = z
  .string()
  .min(1, 'Choose a date and time')
  .transform((value, ctx) => {
    const iso = fromLocalInput(value);
    if (!iso) {
      ctx.addIssue({ code: 'custom', message: 'must be a date and time' });
      return z.NEVER;
    }
    return iso;
  });
