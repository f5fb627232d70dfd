import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { NotificationKind } from '../../../shared/api/notifications.js';
import type { User } from './user.js';

/** A person's choice for one kind of e-mail; no row means on. */
@Entity({ name: 'notification_settings' })
@Index('uq_notification_settings_user_kind', ['userId', 'kind'], { unique: true })
export class NotificationSetting {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('integer', { name: 'user_id' })
  userId: number;

  @Column('varchar', { name: 'kind', length: 40 })
  kind: NotificationKind;

  @Column('boolean', { name: 'enabled' })
  enabled: boolean;

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User;
}

/**
 * One e-mail sent (kind × person × subject, e.g. the brief for a reminder), unique, so a job that
 * runs again after a restart never sends the same message twice.
 */
@Entity({ name: 'notification_log' })
@Index('uq_notification_log_kind_user_subject', ['kind', 'userId', 'subjectId'], { unique: true })
export class NotificationLog {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('varchar', { name: 'kind', length: 40 })
  kind: NotificationKind;

  @Column('integer', { name: 'user_id' })
  userId: number;

  @Column('integer', { name: 'subject_id' })
  subjectId: number;

  @Column('datetime', { name: 'sent_at' })
  sentAt: Date;

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User;
}
