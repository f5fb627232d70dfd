import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { User } from './user.js';

/** A single-use password-reset token (sha256 stored), valid for an hour. */
@Entity({ name: 'password_resets' })
export class PasswordReset {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Index('ix_password_resets_user')
  @Column('integer', { name: 'user_id' })
  userId: number;

  @Column('varchar', { name: 'token_hash', length: 64, unique: true })
  tokenHash: string;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'expires_at' })
  expiresAt: Date;

  @Column('datetime', { name: 'used_at', nullable: true })
  usedAt: Date | null;

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User;
}
