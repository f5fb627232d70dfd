const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

function parse(iso: string): Date | null {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
}

export function formatDate(iso: string | null | undefined): string {
  const d = iso ? parse(iso) : null;
  return d ? dateFormat.format(d) : '—';
}

export function formatDateTime(iso: string | null | undefined): string {
  const d = iso ? parse(iso) : null;
  return d ? dateTimeFormat.format(d) : '—';
}

/** An ISO instant as the value of a `datetime-local` box, in the browser's time zone. */
export function toLocalInput(iso: string | null | undefined): string {
  const d = iso ? parse(iso) : null;
  if (!d) return '';
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** A `datetime-local` value (local time) as an ISO instant, or null when it is not a date. */
export function fromLocalInput(value: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(value)) return null;
  const d = new Date(value);
  return Number.isNaN(d.getTime()) ? null : d.toISOString();
}

/**
 * Time from `now` to `iso` in words: "3 days 4 hours left", "5 hours 10 minutes left",
 * "closed 2 days ago" once past.
 */
export function formatTimeLeft(iso: string, now: number = Date.now()): string {
  const d = parse(iso);
  if (!d) return '—';
  const ms = d.getTime() - now;
  const abs = Math.abs(ms);
  const minutes = Math.floor(abs / 60_000);
  const hours = Math.floor(minutes / 60);
  const days = Math.floor(hours / 24);
  if (ms <= 0 && minutes === 0) return 'passed just now';
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  const span =
    days >= 1
      ? `${plural(days, 'day')}${hours % 24 ? ` ${plural(hours % 24, 'hour')}` : ''}`
      : hours >= 1
        ? `${plural(hours, 'hour')}${minutes % 60 ? ` ${plural(minutes % 60, 'minute')}` : ''}`
        : plural(Math.max(minutes, 1), 'minute');
  return ms > 0 ? `${span} left` : `passed ${span} ago`;
}
