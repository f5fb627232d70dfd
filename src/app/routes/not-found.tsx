import { Link, useLocation } from 'react-router-dom';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function Component() {
  const location = useLocation();
  useDocumentTitle('Not found');
  return (
    <div className="mx-auto max-w-xl space-y-4 py-10">
      <p className="font-mono text-xs uppercase tracking-[0.14em] text-ink-soft">404</p>
      <h1 className="text-3xl font-semibold">Not found</h1>
      <p className="text-ink-soft">
        There is no page at <span className="font-mono text-ink">{location.pathname}</span>. The link may be mistyped or out of date.
      </p>
      <p>
        <Link to="/">Go to my studios</Link>
      </p>
    </div>
  );
}
