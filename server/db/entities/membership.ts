import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { StudioRole } from '../../../shared/api/roles.js';
import type { Studio } from './studio.js';
import type { User } from './user.js';

/** One person's role in one studio; at most one per (user, studio). */
@Entity({ name: 'memberships' })
@Index('uq_memberships_user_studio', ['userId', 'studioId'], { unique: true })
export class Membership {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'user_id' })
  userId: number;

  @Index('ix_memberships_studio')
  @Column('integer', { name: 'studio_id' })
  studioId: number;

  @Column('varchar', { name: 'role', length: 20 })
  role: StudioRole;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @ManyToOne('User', (u: User) => u.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User;

  @ManyToOne('Studio', (s: Studio) => s.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'studio_id' })
  studio: Studio;
}
