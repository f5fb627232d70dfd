import type { ISession } from 'connect-typeorm';
import { Column, DeleteDateColumn, Entity, Index, PrimaryColumn } from 'typeorm';

/** express-session rows, in connect-typeorm's `ISession` shape. */
@Entity({ name: 'sessions' })
export class Session implements ISession {
  @Index('ix_sessions_expired_at')
  @Column('bigint', { name: 'expired_at' })
  expiredAt = Date.now();

  @PrimaryColumn('varchar', { name: 'id', length: 255 })
  id = '';

  @Column('text', { name: 'json' })
  json = '';

  @DeleteDateColumn({ name: 'destroyed_at', type: 'datetime', nullable: true })
  destroyedAt?: Date;
}
