import { NavLink } from 'react-router-dom';
import type { MailSummary } from '../../../../shared/api/admin.js';
import { cn } from '../../../components/ui/cn.js';
import { formatDateTime } from '../../../lib/format.js';

export function OutboxList({ mails }: { mails: MailSummary[] }) {
  return (
    <ol aria-label="Messages, newest first" className="divide-y divide-rule overflow-hidden rounded-lg border border-rule bg-paper-raised">
      {mails.map((mail) => (
        <li key={mail.id}>
          <NavLink
            to={`/admin/outbox/${mail.id}`}
            className={({ isActive }) =>
              cn(
                'block border-l-4 px-4 py-3 text-ink no-underline hover:bg-paper hover:text-ink',
                isActive ? 'border-accent bg-accent-wash/60' : 'border-transparent',
              )
            }
          >
            <span className="block truncate font-medium">{mail.subject || '(no subject)'}</span>
            <span className="block truncate font-mono text-xs text-ink-soft">to {mail.to}</span>
            <span className="block font-mono text-xs text-ink-soft">{formatDateTime(mail.receivedAt)}</span>
          </NavLink>
        </li>
      ))}
    </ol>
  );
}
