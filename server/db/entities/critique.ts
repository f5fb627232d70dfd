import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { PinCategory, PinScope, PinState, PinupState } from '../../../shared/api/critique.js';
import type { Brief } from './brief.js';
import type { Revision, Submission } from './submission.js';
import type { User } from './user.js';

/**
 * A critic's pin on a submission's model, numbered per submission from 1. Where it sits on each
 * revision is a {@link PinAnchor}; `outdatedReason` says why it did not carry over to a later
 * revision (it then lives on its last anchored revision). `camera` is JSON `{ position, target }`.
 */
@Entity({ name: 'pins' })
@Index('uq_pins_submission_number', ['submissionId', 'number'], { unique: true })
export class Pin {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'submission_id' })
  submissionId: number;

  @Column('integer', { name: 'number' })
  number: number;

  @Column('integer', { name: 'placed_on_revision_id' })
  placedOnRevisionId: number;

  @Column('varchar', { name: 'scope', length: 10 })
  scope: PinScope;

  @Column('varchar', { name: 'category', length: 20 })
  category: PinCategory;

  @Column('varchar', { name: 'state', length: 10 })
  state: PinState;

  @Column('text', { name: 'camera' })
  camera: string;

  @Column('integer', { name: 'author_id', nullable: true })
  authorId: number | null;

  @Column('integer', { name: 'resolved_by_id', nullable: true })
  resolvedById: number | null;

  @Column('text', { name: 'outdated_reason', nullable: true })
  outdatedReason: string | null;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne('Submission', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'submission_id' })
  submission: Submission;

  @ManyToOne('Revision', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'placed_on_revision_id' })
  placedOnRevision: Revision;

  @ManyToOne('User', { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id' })
  author: User | null;

  @ManyToOne('User', { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'resolved_by_id' })
  resolvedBy: User | null;
}

/** Where a pin sits on one revision: the piece, the point in its frame (mm) and the slab side. */
@Entity({ name: 'pin_anchors' })
@Index('uq_pin_anchors_pin_revision', ['pinId', 'revisionId'], { unique: true })
export class PinAnchor {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'pin_id' })
  pinId: number;

  @Index('ix_pin_anchors_revision')
  @Column('integer', { name: 'revision_id' })
  revisionId: number;

  @Column('varchar', { name: 'piece', length: 130 })
  piece: string;

  @Column('real', { name: 'x' })
  x: number;

  @Column('real', { name: 'y' })
  y: number;

  @Column('integer', { name: 'side' })
  side: 1 | -1;

  @ManyToOne('Pin', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'pin_id' })
  pin: Pin;

  @ManyToOne('Revision', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'revision_id' })
  revision: Revision;
}

/** One comment of a pin's thread (the first is the pin's body); markdown stored as typed. */
@Entity({ name: 'pin_comments' })
export class PinComment {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_pin_comments_pin')
  @Column('integer', { name: 'pin_id' })
  pinId: number;

  @Column('integer', { name: 'author_id', nullable: true })
  authorId: number | null;

  @Column('text', { name: 'body' })
  body: string;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @ManyToOne('Pin', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'pin_id' })
  pin: Pin;

  @ManyToOne('User', { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id' })
  author: User | null;
}

/** A pin-up (critique session) of a brief. */
@Entity({ name: 'pinups' })
export class Pinup {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_pinups_brief')
  @Column('integer', { name: 'brief_id' })
  briefId: number;

  @Column('varchar', { name: 'title', length: 200 })
  title: string;

  @Column('datetime', { name: 'starts_at' })
  startsAt: Date;

  @Column('integer', { name: 'duration_minutes' })
  durationMinutes: number;

  @Column('varchar', { name: 'room', length: 200 })
  room: string;

  @Column('varchar', { name: 'state', length: 20 })
  state: PinupState;

  @Column('integer', { name: 'created_by_id', nullable: true })
  createdById: number | null;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne('Brief', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'brief_id' })
  brief: Brief;

  @ManyToOne('User', { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy: User | null;
}

/** A submission in a pin-up's running order (position from 1). */
@Entity({ name: 'pinup_entries' })
@Index('uq_pinup_entries_pinup_submission', ['pinupId', 'submissionId'], { unique: true })
export class PinupEntry {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'pinup_id' })
  pinupId: number;

  @Column('integer', { name: 'submission_id' })
  submissionId: number;

  @Column('integer', { name: 'position' })
  position: number;

  @ManyToOne('Pinup', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'pinup_id' })
  pinup: Pinup;

  @ManyToOne('Submission', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'submission_id' })
  submission: Submission;
}

/** One scorer's rubric scores of a submission; `scores` is JSON `CriterionScore[]`. */
@Entity({ name: 'score_sheets' })
@Index('uq_score_sheets_submission_scorer', ['submissionId', 'scorerId'], { unique: true })
export class ScoreSheet {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'submission_id' })
  submissionId: number;

  @Column('integer', { name: 'scorer_id' })
  scorerId: number;

  @Column('text', { name: 'scores' })
  scores: string;

  @Column('datetime', { name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne('Submission', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'submission_id' })
  submission: Submission;

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'scorer_id' })
  scorer: User;
}

/** The instructor's final mark and summary of a submission, and when it was released. */
@Entity({ name: 'feedback' })
export class Feedback {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'submission_id', unique: true })
  submissionId: number;

  @Column('real', { name: 'final_mark', nullable: true })
  finalMark: number | null;

  @Column('text', { name: 'summary' })
  summary: string;

  @Column('datetime', { name: 'released_at', nullable: true })
  releasedAt: Date | null;

  @Column('datetime', { name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne('Submission', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'submission_id' })
  submission: Submission;
}
