/**
 * The one router of the app. Route modules load lazily; each may export `makeLoader(queryClient)`,
 * whose loader calls `ensureQueryData` with the same query options its component reads, so a
 * screen renders with its data instead of a spinner.
 */
import type { ComponentType } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type LoaderFunction, type LoaderFunctionArgs } from 'react-router-dom';
import { meQueryOptions } from '../features/auth/api/get-me.js';
import { signInPath } from '../lib/api-client.js';
import { AppLayout, SignedInOutlet } from './layout/app-layout.js';
import { RootErrorPage, RouteErrorPage } from './routes/error-page.js';
import { PageSkeleton } from '../components/ui/spinner.js';

export interface RouteModule {
  Component: ComponentType;
  makeLoader?: (queryClient: QueryClient) => LoaderFunction;
}

function rootLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(meQueryOptions());
    return null;
  };
}

/** Signed-out visitors go to sign-in and come back to where they were heading. */
function requireSession(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (!me) {
      const url = new URL(request.url);
      throw redirect(signInPath(`${url.pathname}${url.search}`));
    }
    return null;
  };
}

function requireAdmin(queryClient: QueryClient) {
  return async (args: LoaderFunctionArgs) => {
    await requireSession(queryClient)(args);
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (me?.globalRole !== 'admin') {
      throw new Response('These pages are for the maker-space admin.', { status: 403, statusText: 'Forbidden' });
    }
    return null;
  };
}

export function createAppRouter(queryClient: QueryClient) {
  // React Router runs the loaders of all matched routes at once, so a screen's loader first
  // repeats its parents' guard; otherwise a signed-out or non-admin visit would still fire the
  // screen's own requests.
  type Guard = (args: LoaderFunctionArgs) => Promise<unknown>;
  const lazy = (load: () => Promise<RouteModule>, guard?: Guard) => async () => {
    const module = await load();
    const loader = module.makeLoader?.(queryClient);
    return {
      Component: module.Component,
      ...(loader
        ? {
            loader: async (args: LoaderFunctionArgs) => {
              if (guard) await guard(args);
              return loader(args);
            },
          }
        : {}),
    };
  };
  const signedIn = requireSession(queryClient);
  const admin = requireAdmin(queryClient);

  return createBrowserRouter([
    {
      // Presentation mode fills the screen: no top bar or footer, but the same session guard.
      id: 'present',
      path: '/pinups/:pinupId/present',
      loader: async (args: LoaderFunctionArgs) => {
        await rootLoader(queryClient)();
        return signedIn(args);
      },
      ErrorBoundary: RootErrorPage,
      HydrateFallback: () => <PageSkeleton label="Opening the presentation…" />,
      Component: SignedInOutlet,
      children: [{ index: true, lazy: lazy(() => import('./routes/pinup-present.js'), signedIn) }],
    },
    {
      id: 'root',
      path: '/',
      Component: AppLayout,
      loader: rootLoader(queryClient),
      ErrorBoundary: RootErrorPage,
      HydrateFallback: () => <PageSkeleton label="Opening Planewright…" />,
      children: [
        {
          // Errors below here render inside the layout, so the top bar stays usable.
          ErrorBoundary: RouteErrorPage,
          children: [
            { path: 'sign-in', lazy: lazy(() => import('./routes/sign-in.js')) },
            { path: 'forgot-password', lazy: lazy(() => import('./routes/forgot-password.js')) },
            { path: 'reset-password', lazy: lazy(() => import('./routes/reset-password.js')) },
            { path: 'invitations/:token', lazy: lazy(() => import('./routes/invitation.js')) },
            {
              id: 'signed-in',
              loader: signedIn,
              Component: SignedInOutlet,
              children: [
                { index: true, lazy: lazy(() => import('./routes/dashboard.js'), signedIn) },
                { path: 'studios/:studioId', lazy: lazy(() => import('./routes/studio.js'), signedIn) },
                { path: 'studios/:studioId/briefs/new', lazy: lazy(() => import('./routes/brief-new.js'), signedIn) },
                { path: 'briefs/:briefId', lazy: lazy(() => import('./routes/brief.js'), signedIn) },
                { path: 'briefs/:briefId/edit', lazy: lazy(() => import('./routes/brief-edit.js'), signedIn) },
                { path: 'briefs/:briefId/submissions', lazy: lazy(() => import('./routes/brief-submissions.js'), signedIn) },
                { path: 'revisions/:revisionId', lazy: lazy(() => import('./routes/revision.js'), signedIn) },
                { path: 'pinups/:pinupId', lazy: lazy(() => import('./routes/pinup.js'), signedIn) },
                { path: 'submissions/:submissionId/feedback', lazy: lazy(() => import('./routes/submission-feedback.js'), signedIn) },
                { path: 'settings/notifications', lazy: lazy(() => import('./routes/notification-settings.js'), signedIn) },
                {
                  path: 'admin',
                  loader: admin,
                  children: [
                    { index: true, loader: () => redirect('/admin/users') },
                    { path: 'users', lazy: lazy(() => import('./routes/admin-users.js'), admin) },
                    { path: 'studios', lazy: lazy(() => import('./routes/admin-studios.js'), admin) },
                    { path: 'materials', lazy: lazy(() => import('./routes/admin-materials.js'), admin) },
                    {
                      path: 'outbox',
                      lazy: lazy(() => import('./routes/admin-outbox.js'), admin),
                      children: [
                        { index: true, lazy: lazy(() => import('./routes/admin-outbox-empty.js'), admin) },
                        { path: ':mailId', lazy: lazy(() => import('./routes/admin-mail.js'), admin) },
                      ],
                    },
                  ],
                },
              ],
            },
            { path: '*', lazy: lazy(() => import('./routes/not-found.js')) },
          ],
        },
      ],
    },
  ]);
}

export type AppRouter = ReturnType<typeof createAppRouter>;
