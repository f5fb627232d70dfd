import { Column, Entity, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import type { GlobalRole } from '../../../shared/api/roles.js';
import type { Membership } from './membership.js';

@Entity({ name: 'users' })
export class User {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  /** Stored lower-cased and trimmed. */
  @Column('varchar', { name: 'email', length: 254, unique: true })
  email: string;

  @Column('varchar', { name: 'name', length: 120 })
  name: string;

  @Column('varchar', { name: 'password_hash', length: 100 })
  passwordHash: string;

  @Column('varchar', { name: 'global_role', length: 20, nullable: true })
  globalRole: GlobalRole | null;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'last_login_at', nullable: true })
  lastLoginAt: Date | null;

  @OneToMany('Membership', (m: Membership) => m.user)
  memberships: Membership[];
}
