import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { StudioRole } from '../../../shared/api/roles.js';
import type { Studio } from './studio.js';
import type { User } from './user.js';

/** An e-mailed invitation into a studio. Only the sha256 of the token is stored. */
@Entity({ name: 'invitations' })
export class Invitation {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_invitations_studio')
  @Column('integer', { name: 'studio_id' })
  studioId: number;

  @Column('varchar', { name: 'email', length: 254 })
  email: string;

  @Column('varchar', { name: 'role', length: 20 })
  role: StudioRole;

  @Column('varchar', { name: 'token_hash', length: 64, unique: true })
  tokenHash: string;

  @Column('integer', { name: 'invited_by_id', nullable: true })
  invitedById: number | null;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'expires_at' })
  expiresAt: Date;

  @Column('datetime', { name: 'accepted_at', nullable: true })
  acceptedAt: Date | null;

  @Column('integer', { name: 'accepted_by_id', nullable: true })
  acceptedById: number | null;

  @Column('datetime', { name: 'revoked_at', nullable: true })
  revokedAt: Date | null;

  @ManyToOne('Studio', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'studio_id' })
  studio: Studio;

  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'invited_by_id' })
  invitedBy: User | null;

  @ManyToOne('User', { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'accepted_by_id' })
  acceptedBy: User | null;
}
