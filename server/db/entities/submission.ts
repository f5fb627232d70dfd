import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';
import type { AuditState } from '../../../shared/api/briefs.js';
import type { FileRole } from '../../../shared/api/revisions.js';
import type { Brief } from './brief.js';
import type { User } from './user.js';

/** One participant's work on one brief (at most one per pair). */
@Entity({ name: 'submissions' })
@Index('uq_submissions_brief_participant', ['briefId', 'participantId'], { unique: true })
export class Submission {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'brief_id' })
  briefId: number;

  @Column('integer', { name: 'participant_id' })
  participantId: number;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @ManyToOne('Brief', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'brief_id' })
  brief: Brief;

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'participant_id' })
  participant: User;
}

/** A numbered revision of a submission; `design` is the design document (JSON text). */
@Entity({ name: 'revisions' })
@Index('uq_revisions_submission_number', ['submissionId', 'number'], { unique: true })
export class Revision {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'submission_id' })
  submissionId: number;

  @Column('integer', { name: 'number' })
  number: number;

  @Column('varchar', { name: 'title', length: 200 })
  title: string;

  @Column('text', { name: 'design' })
  design: string;

  @Column('varchar', { name: 'source', length: 10 })
  source: 'file' | 'form';

  @Column('boolean', { name: 'late', default: false })
  late: boolean;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @ManyToOne('Submission', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'submission_id' })
  submission: Submission;
}

/** A file in the content-addressed store (`blobs/<aa>/<sha256>`). */
@Entity({ name: 'blobs' })
export class Blob {
  @PrimaryColumn('varchar', { name: 'sha256', length: 64 })
  sha256: string;

  @Column('integer', { name: 'size' })
  size: number;

  @Column('varchar', { name: 'media_type', length: 100 })
  mediaType: string;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;
}

/** A stored file of a revision in one role. */
@Entity({ name: 'revision_files' })
export class RevisionFile {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_revision_files_revision')
  @Column('integer', { name: 'revision_id' })
  revisionId: number;

  @Column('varchar', { name: 'blob_sha256', length: 64 })
  blobSha256: string;

  @Column('varchar', { name: 'role', length: 20 })
  role: FileRole;

  @Column('varchar', { name: 'original_name', length: 255 })
  originalName: string;

  @ManyToOne('Revision', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'revision_id' })
  revision: Revision;

  @ManyToOne('Blob', { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'blob_sha256' })
  blob: Blob;
}

/**
 * The audit of one revision (one row per revision; a re-audit resets it). `report` is the JSON
 * report when done; `figures` the counts the tables show; `error` a sentence when failed.
 */
@Entity({ name: 'audits' })
export class Audit {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'revision_id', unique: true })
  revisionId: number;

  @Index('ix_audits_state')
  @Column('varchar', { name: 'state', length: 20 })
  state: AuditState;

  @Column('text', { name: 'report', nullable: true })
  report: string | null;

  @Column('text', { name: 'figures', nullable: true })
  figures: string | null;

  @Column('integer', { name: 'errors', nullable: true })
  errors: number | null;

  @Column('integer', { name: 'warnings', nullable: true })
  warnings: number | null;

  @Column('text', { name: 'error', nullable: true })
  error: string | null;

  @Column('integer', { name: 'attempts', default: 0 })
  attempts: number;

  @Column('datetime', { name: 'queued_at' })
  queuedAt: Date;

  @Column('datetime', { name: 'started_at', nullable: true })
  startedAt: Date | null;

  @Column('datetime', { name: 'finished_at', nullable: true })
  finishedAt: Date | null;

  @ManyToOne('Revision', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'revision_id' })
  revision: Revision;
}

/** A critic assigned to a submission by the instructor. */
@Entity({ name: 'critic_assignments' })
@Index('uq_critic_assignments_submission_critic', ['submissionId', 'criticId'], { unique: true })
export class CriticAssignment {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'submission_id' })
  submissionId: number;

  @Index('ix_critic_assignments_critic')
  @Column('integer', { name: 'critic_id' })
  criticId: number;

  @Column('datetime', { name: 'assigned_at' })
  assignedAt: Date;

  @ManyToOne('Submission', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'submission_id' })
  submission: Submission;

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'critic_id' })
  critic: User;
}
