import type { Pinup } from '../../../../shared/api/critique.js';
import { formatDateTime } from '../../../lib/format.js';

const timeOnly = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' });

/**
 * When a session runs, in the browser's time zone: "4 Mar 2026, 14:00–15:30". A session that
 * runs past midnight names the end's date too.
 */
export function formatPinupTime(pinup: Pick<Pinup, 'startsAt' | 'durationMinutes'>): string {
  const start = new Date(pinup.startsAt);
  if (Number.isNaN(start.getTime())) return '—';
  const end = new Date(start.getTime() + pinup.durationMinutes * 60_000);
  const sameDay = start.toDateString() === end.toDateString();
  return `${formatDateTime(pinup.startsAt)}–${sameDay ? timeOnly.format(end) : formatDateTime(end.toISOString())}`;
}

/** "90 minutes", "1 hour", "2 hours 15 minutes". */
export function formatDuration(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  const plural = (n: number, w: string) => `${n} ${w}${n === 1 ? '' : 's'}`;
  if (h === 0) return plural(m, 'minute');
  return m ? `${plural(h, 'hour')} ${plural(m, 'minute')}` : plural(h, 'hour');
}
