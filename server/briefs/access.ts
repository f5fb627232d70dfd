/**
 * Loads what the policy decides on for routes keyed by a brief, submission or revision id (the
 * studio, the brief's state and gallery, the owner and assigned critics). An unknown id is 404.
 */
import type { DataSource } from 'typeorm';
import type { BriefState } from '../../shared/api/briefs.js';
import { rawDb } from '../db/raw.js';
import { NotFoundError } from '../http/errors.js';
import type { Resource } from '../policy/policy.js';

interface Row {
  studio_id: number;
  state: BriefState;
  gallery_open: number;
  participant_id?: number;
  submission_id?: number;
}

function critics(ds: DataSource, submissionId: number): number[] {
  return (rawDb(ds).prepare('SELECT critic_id FROM critic_assignments WHERE submission_id = ?').all(submissionId) as { critic_id: number }[]).map((r) => r.critic_id);
}

export function briefResource(ds: DataSource, briefId: number): Resource {
  const row = rawDb(ds).prepare('SELECT studio_id, state, gallery_open FROM briefs WHERE id = ?').get(briefId) as Row | undefined;
  if (!row) throw new NotFoundError('There is no brief with this id.');
  return { studioId: row.studio_id, briefState: row.state, galleryOpen: row.gallery_open === 1 };
}

export function submissionResource(ds: DataSource, submissionId: number): Resource {
  const row = rawDb(ds)
    .prepare('SELECT b.studio_id, b.state, b.gallery_open, s.participant_id FROM submissions s JOIN briefs b ON b.id = s.brief_id WHERE s.id = ?')
    .get(submissionId) as Row | undefined;
  if (!row) throw new NotFoundError('There is no submission with this id.');
  return { studioId: row.studio_id, briefState: row.state, galleryOpen: row.gallery_open === 1, ownerId: row.participant_id, criticIds: critics(ds, submissionId) };
}

export function revisionResource(ds: DataSource, revisionId: number): Resource {
  const row = rawDb(ds)
    .prepare(
      'SELECT b.studio_id, b.state, b.gallery_open, s.participant_id, s.id AS submission_id FROM revisions r JOIN submissions s ON s.id = r.submission_id JOIN briefs b ON b.id = s.brief_id WHERE r.id = ?',
    )
    .get(revisionId) as Row | undefined;
  if (!row) throw new NotFoundError('There is no revision with this id.');
  return { studioId: row.studio_id, briefState: row.state, galleryOpen: row.gallery_open === 1, ownerId: row.participant_id, criticIds: critics(ds, row.submission_id!) };
}
