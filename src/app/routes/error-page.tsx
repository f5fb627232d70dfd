import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { isApiError } from '../../lib/api-client.js';
import { BrandMark } from '../layout/brand-mark.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

interface Explained {
  title: string;
  message: string;
  code: string;
}

function explain(error: unknown): Explained {
  const status = isRouteErrorResponse(error) ? error.status : isApiError(error) ? error.status : 0;
  const serverMessage = isApiError(error)
    ? error.message
    : isRouteErrorResponse(error) && typeof error.data === 'string' && error.data
      ? error.data
      : null;
  if (status === 404) {
    return { code: '404', title: 'Not found', message: serverMessage ?? 'There is nothing at this address. It may have been removed, or the link is mistyped.' };
  }
  if (status === 403) {
    return { code: '403', title: 'Not for this account', message: serverMessage ?? 'Your account does not have access to this page.' };
  }
  if (status === 0 && isApiError(error)) {
    return { code: 'offline', title: 'The server did not answer', message: error.message };
  }
  if (error instanceof Error && /dynamically imported module|Importing a module script failed|Failed to fetch/i.test(error.message)) {
    return { code: 'update', title: 'The app was updated', message: 'Part of the app could not be loaded, probably because a newer version was installed. Reload the page.' };
  }
  if (status >= 400 && serverMessage) return { code: String(status), title: 'That did not work', message: serverMessage };
  return {
    code: status ? String(status) : 'error',
    title: 'Something went wrong',
    message: 'The page hit an unexpected problem. Reload it; if it happens again, tell the maker-space staff what you were doing.',
  };
}

function ErrorBody({ explained }: { explained: Explained }) {
  useDocumentTitle(explained.title);
  return (
    <div className="mx-auto max-w-xl space-y-4 py-10" role="alert">
      <p className="font-mono text-xs uppercase tracking-[0.14em] text-ink-soft">{explained.code}</p>
      <h1 className="text-3xl font-semibold">{explained.title}</h1>
      <p className="text-ink-soft">{explained.message}</p>
      <div className="flex flex-wrap gap-4 text-sm">
        <Link to="/">Go to my studios</Link>
        <button type="button" className="text-accent underline underline-offset-2" onClick={() => window.location.reload()}>
          Reload the page
        </button>
      </div>
    </div>
  );
}

/** Errors of one screen, shown inside the layout. */
export function RouteErrorPage() {
  const error = useRouteError();
  if (!isRouteErrorResponse(error) && !isApiError(error)) console.error(error);
  return <ErrorBody explained={explain(error)} />;
}

/** Errors of the layout itself (e.g. the session could not be read): a page of its own. */
export function RootErrorPage() {
  const error = useRouteError();
  if (!isRouteErrorResponse(error) && !isApiError(error)) console.error(error);
  return (
    <div className="min-h-screen">
      <header className="border-b border-rule bg-paper-raised/90">
        <div className="mx-auto flex max-w-sheet items-center gap-2 px-5 py-3 sm:px-8">
          <BrandMark className="size-7" />
          <span className="text-lg font-semibold">Planewright</span>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-sheet px-5 sm:px-8">
        <ErrorBody explained={explain(error)} />
      </main>
    </div>
  );
}
