import { Suspense } from 'react';
import { Link, Outlet, useLocation, useNavigation } from 'react-router-dom';
import { PageSkeleton } from '../../components/ui/spinner.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { signInPath } from '../../lib/api-client.js';
import { TopBar } from './top-bar.js';

function NavigationProgress() {
  const navigation = useNavigation();
  const busy = navigation.state !== 'idle';
  return (
    <div aria-hidden="true" className="h-0.5 w-full overflow-hidden">
      <div className={busy ? 'h-full w-1/3 animate-pulse bg-accent' : 'h-full w-0'} />
    </div>
  );
}

export function PageFrame({ children }: { children: React.ReactNode }) {
  return (
    <main id="main" tabIndex={-1} className="mx-auto w-full max-w-sheet flex-1 px-5 py-8 outline-none sm:px-8 sm:py-10">
      {children}
    </main>
  );
}

export function AppLayout() {
  const { data: user } = useMe();
  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only rounded-md bg-ink px-3 py-2 text-paper-raised focus:not-sr-only focus:absolute focus:left-3 focus:top-3 focus:z-10"
      >
        Skip to content
      </a>
      <TopBar user={user} />
      <NavigationProgress />
      <PageFrame>
        <Suspense fallback={<PageSkeleton />}>
          <Outlet />
        </Suspense>
      </PageFrame>
      <footer className="border-t border-rule/70">
        <p className="mx-auto max-w-sheet px-5 py-4 font-mono text-xs text-ink-soft sm:px-8">
          Planewright · flat parts, square joints
        </p>
      </footer>
    </div>
  );
}

/**
 * Children render only for a signed-in person. Loaders redirect signed-out visits; when the
 * session ends while a screen is open (sign-out, or expiry noticed by the API client) whoever
 * noticed navigates, and until then this says so instead of racing them with a redirect of its own.
 */
export function SignedInOutlet() {
  const { data: user } = useMe();
  const location = useLocation();
  if (!user) {
    return (
      <div className="mx-auto max-w-xl space-y-3 py-10" role="status">
        <h1 className="text-2xl font-semibold">You are signed out</h1>
        <p className="text-ink-soft">
          <Link to={signInPath(`${location.pathname}${location.search}`)}>Sign in again</Link> to continue here.
        </p>
      </div>
    );
  }
  return <Outlet />;
}
