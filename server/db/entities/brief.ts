import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { BriefState, LatePolicy } from '../../../shared/api/briefs.js';
import type { Material } from './material.js';
import type { Studio } from './studio.js';
import type { User } from './user.js';

/** A brief of a studio. `constraints` and `rubric` are JSON validated by shared/api/briefs.ts. */
@Entity({ name: 'briefs' })
export class Brief {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_briefs_studio')
  @Column('integer', { name: 'studio_id' })
  studioId: number;

  @Column('varchar', { name: 'title', length: 200 })
  title: string;

  @Column('text', { name: 'body' })
  body: string;

  @Column('text', { name: 'constraints' })
  constraints: string;

  @Column('integer', { name: 'material_id' })
  materialId: number;

  @Column('datetime', { name: 'deadline' })
  deadline: Date;

  @Column('varchar', { name: 'late_policy', length: 30 })
  latePolicy: LatePolicy;

  @Column('datetime', { name: 'critique_opens_at', nullable: true })
  critiqueOpensAt: Date | null;

  @Column('datetime', { name: 'critique_closes_at', nullable: true })
  critiqueClosesAt: Date | null;

  @Column('text', { name: 'rubric' })
  rubric: string;

  @Column('varchar', { name: 'state', length: 20 })
  state: BriefState;

  @Column('boolean', { name: 'gallery_open', default: false })
  galleryOpen: boolean;

  @Column('integer', { name: 'created_by_id', nullable: true })
  createdById: number | null;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'updated_at' })
  updatedAt: Date;

  @Column('datetime', { name: 'published_at', nullable: true })
  publishedAt: Date | null;

  @Column('datetime', { name: 'closed_at', nullable: true })
  closedAt: Date | null;

  @ManyToOne('Studio', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'studio_id' })
  studio: Studio;

  @ManyToOne('Material', { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'material_id' })
  material: Material;

  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'created_by_id' })
  createdBy: User | null;
}

/** One changelog entry of a brief; `details` is a JSON array of sentences. */
@Entity({ name: 'brief_changes' })
export class BriefChange {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_brief_changes_brief')
  @Column('integer', { name: 'brief_id' })
  briefId: number;

  @Column('integer', { name: 'user_id', nullable: true })
  userId: number | null;

  @Column('varchar', { name: 'user_name', length: 120 })
  userName: string;

  @Column('datetime', { name: 'at' })
  at: Date;

  @Column('text', { name: 'summary' })
  summary: string;

  @Column('text', { name: 'details' })
  details: string;

  @Column('integer', { name: 'reaudited', default: 0 })
  reaudited: number;

  @ManyToOne('Brief', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'brief_id' })
  brief: Brief;

  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'user_id' })
  user: User | null;
}
