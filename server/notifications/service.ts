/**
 * E-mail notifications: revision received (with the audit summary), brief published, deadline
 * reminder. Each send is claimed first in `notification_log` (kind × person × subject, unique),
 * so a message is sent at most once even across restarts; a failed send releases the claim so a
 * later run can try again. A person who turned a kind off gets nothing of that kind.
 */
import { NOTIFICATION_KINDS, NOTIFICATION_LABELS, type NotificationKind, type NotificationSettings, type UpdateNotificationSettingsBody } from '../../shared/api/notifications.js';
import type { DataSource } from 'typeorm';
import { NotificationSetting } from '../db/entities/index.js';
import { rawDb, sqlDate } from '../db/raw.js';
import type { Clock } from '../lib/clock.js';
import type { MailService, OutgoingMail } from '../mail/mail-service.js';

export interface NotifierDeps {
  dataSource: DataSource;
  mail: MailService;
  clock: Clock;
  logError?: (e: unknown) => void;
}

export function notifier(deps: NotifierDeps) {
  const db = rawDb(deps.dataSource);
  const log = deps.logError ?? ((e: unknown) => console.error(e));

  function enabled(userId: number, kind: NotificationKind): boolean {
    const row = db.prepare('SELECT enabled FROM notification_settings WHERE user_id = ? AND kind = ?').get(userId, kind) as { enabled: number } | undefined;
    return row === undefined || row.enabled === 1;
  }

  return {
    enabled,

    /**
     * Sends `mail` unless this (kind, user, subject) was sent before or the person turned the
     * kind off. Returns whether a message went out. Never throws: a failed send is logged and
     * the claim released.
     */
    async sendOnce(kind: NotificationKind, userId: number, subjectId: number, mail: OutgoingMail): Promise<boolean> {
      if (!enabled(userId, kind)) return false;
      const claim = db
        .prepare('INSERT OR IGNORE INTO notification_log (kind, user_id, subject_id, sent_at) VALUES (?, ?, ?, ?)')
        .run(kind, userId, subjectId, sqlDate(deps.clock.now()));
      if (claim.changes === 0) return false;
      try {
        await deps.mail.send(mail);
        return true;
      } catch (e) {
        db.prepare('DELETE FROM notification_log WHERE kind = ? AND user_id = ? AND subject_id = ?').run(kind, userId, subjectId);
        log(e);
        return false;
      }
    },

    async settings(userId: number): Promise<NotificationSettings> {
      return { settings: NOTIFICATION_KINDS.map((kind) => ({ kind, label: NOTIFICATION_LABELS[kind], enabled: enabled(userId, kind) })) };
    },

    async update(userId: number, body: UpdateNotificationSettingsBody): Promise<NotificationSettings> {
      const repo = deps.dataSource.getRepository(NotificationSetting);
      for (const kind of NOTIFICATION_KINDS) {
        const value = body[kind];
        if (value === undefined) continue;
        await repo.upsert({ userId, kind, enabled: value }, ['userId', 'kind']);
      }
      return this.settings(userId);
    },
  };
}
export type Notifier = ReturnType<typeof notifier>;

/** The last line of every notification: where to turn them off. */
export const settingsLine = (publicUrl: string): string => `To turn these e-mails off, open ${publicUrl}/settings/notifications.`;
