/**
 * What the policy decides on for routes keyed by a pin or a pin-up id: the submission's (or the
 * brief's) studio, state, owner and critics, and a pin's author. An unknown id is 404.
 */
import type { DataSource } from 'typeorm';
import { briefResource, submissionResource } from '../briefs/access.js';
import { rawDb } from '../db/raw.js';
import { NotFoundError } from '../http/errors.js';
import type { Resource } from '../policy/policy.js';

export function pinResource(ds: DataSource, pinId: number): Resource {
  const row = rawDb(ds).prepare('SELECT submission_id, author_id FROM pins WHERE id = ?').get(pinId) as { submission_id: number; author_id: number | null } | undefined;
  if (!row) throw new NotFoundError('There is no pin with this id.');
  return { ...submissionResource(ds, row.submission_id), authorId: row.author_id };
}

export function pinupResource(ds: DataSource, pinupId: number): Resource {
  const row = rawDb(ds).prepare('SELECT brief_id FROM pinups WHERE id = ?').get(pinupId) as { brief_id: number } | undefined;
  if (!row) throw new NotFoundError('There is no pin-up with this id.');
  return briefResource(ds, row.brief_id);
}
