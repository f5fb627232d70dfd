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
