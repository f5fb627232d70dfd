/**
 * The deadline reminder: 48 hours before a published brief's deadline, each participant of its
 * studio gets one e-mail. A timer checks every minute and once at start-up; each send is claimed
 * in notification_log first, so running again — or after a restart — never sends twice. The
 * clock is the app's, so tests move it instead of waiting.
 */
import type { AppContext } from '../context.js';
import { rawDb, sqlDate } from '../db/raw.js';
import { simpleHtml } from '../mail/mail-service.js';
import { notifier, settingsLine } from './service.js';

export const REMINDER_LEAD_MS = 48 * 60 * 60 * 1000;
export const REMINDER_CHECK_MS = 60_000;

export interface ReminderJob {
  /** Sends every reminder that is due now; returns how many went out. */
  tick(): Promise<number>;
  start(): void;
  stop(): void;
}

export function reminderJob(ctx: Pick<AppContext, 'dataSource' | 'mail' | 'clock' | 'config' | 'logError'>): ReminderJob {
  const db = rawDb(ctx.dataSource);
  const notify = notifier(ctx);
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<number> | null = null;

  async function tick(): Promise<number> {
    const now = ctx.clock.now();
    const due = db
      .prepare(
        `SELECT b.id AS brief_id, b.title, b.deadline, u.id AS user_id, u.email, u.name
           FROM briefs b JOIN memberships m ON m.studio_id = b.studio_id AND m.role = 'participant' JOIN users u ON u.id = m.user_id
          WHERE b.state = 'published' AND b.deadline > ? AND b.deadline <= ?
            AND NOT EXISTS (SELECT 1 FROM notification_log l WHERE l.kind = 'deadline-reminder' AND l.user_id = u.id AND l.subject_id = b.id)`,
      )
      .all(sqlDate(now), sqlDate(new Date(now.getTime() + REMINDER_LEAD_MS))) as { brief_id: number; title: string; deadline: string; user_id: number; email: string; name: string }[];
    let sent = 0;
    for (const d of due) {
      const deadline = new Date(d.deadline.replace(' ', 'T') + 'Z');
      const link = `${ctx.config.publicUrl}/briefs/${d.brief_id}`;
      const lines = [`Hello ${d.name},`, `The deadline of "${d.title}" is ${deadline.toUTCString()}, less than 48 hours from now.`];
      if (
        await notify.sendOnce('deadline-reminder', d.user_id, d.brief_id, {
          to: d.email,
          subject: `Deadline in 48 hours: ${d.title}`,
          text: `${lines.join('\n\n')}\n\nOpen the brief: ${link}\n\n${settingsLine(ctx.config.publicUrl)}\n\n— Planewright\n`,
          html: simpleHtml([...lines, settingsLine(ctx.config.publicUrl)], { href: link, label: 'Open the brief' }),
        })
      ) {
        sent++;
      }
    }
    return sent;
  }

  const guarded = (): Promise<number> => (running ??= tick().finally(() => (running = null)));
  const log = ctx.logError ?? ((e: unknown) => console.error(e));

  return {
    tick: guarded,
    start() {
      if (timer) return;
      void guarded().catch(log);
      timer = setInterval(() => void guarded().catch(log), REMINDER_CHECK_MS);
      timer.unref();
    },
    stop() {
      if (timer) clearInterval(timer);
      timer = null;
    },
  };
}
