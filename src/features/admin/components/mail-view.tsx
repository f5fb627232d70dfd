import { Link } from 'react-router-dom';
import type { MailMessage } from '../../../../shared/api/admin.js';
import { formatDateTime } from '../../../lib/format.js';
import { splitLinks } from '../../../lib/linkify.js';

function MailText({ text }: { text: string }) {
  const origin = window.location.origin;
  return (
    <pre className="whitespace-pre-wrap break-words font-mono text-[0.85rem] leading-6 text-ink">
      {splitLinks(text).map((part, i) => {
        if (part.kind === 'text') return <span key={i}>{part.text}</span>;
        const url = new URL(part.href);
        // Links into this app open in place, so an invitation can be followed from here.
        if (url.origin === origin) {
          return (
            <Link key={i} to={`${url.pathname}${url.search}${url.hash}`}>
              {part.text}
            </Link>
          );
        }
        return (
          <a key={i} href={part.href} target="_blank" rel="noopener noreferrer">
            {part.text}
          </a>
        );
      })}
    </pre>
  );
}

export function MailView({ mail }: { mail: MailMessage }) {
  return (
    <article aria-labelledby="mail-subject" className="space-y-4">
      <header className="space-y-2 border-b border-rule pb-4">
        <h2 id="mail-subject" className="text-xl font-semibold">
          {mail.subject || '(no subject)'}
        </h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">From</dt>
          <dd className="font-mono">{mail.from}</dd>
          <dt className="text-ink-soft">To</dt>
          <dd className="font-mono">{mail.to}</dd>
          <dt className="text-ink-soft">Received</dt>
          <dd className="font-mono">{formatDateTime(mail.receivedAt)}</dd>
        </dl>
      </header>
      {mail.text.trim() ? (
        <MailText text={mail.text} />
      ) : (
        <p className="text-sm text-ink-soft">
          This message has no plain-text part{mail.html ? '; its HTML part is not shown here.' : '.'}
        </p>
      )}
    </article>
  );
}
