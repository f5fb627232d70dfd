// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { Pinup } from '../../shared/api/critique.js';
import { Component, makeLoader } from '../../src/app/routes/pinup.js';
import { stubFetch } from './client-support.js';

// The session page against a fake server answering by address (the real routes' shapes).
const fetchMock = stubFetch();
const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

const people = {
  instructor: { id: 2, email: 'instructor@example.org', name: 'Wren Halloway', globalRole: null, memberships: [{ studioId: 1, role: 'instructor' }] },
  critic: { id: 5, email: 'critic@example.org', name: 'Juno Pell', globalRole: null, memberships: [{ studioId: 1, role: 'critic' }] },
};

const pinup = (): Pinup => ({
  id: 9,
  briefId: 3,
  briefTitle: 'Icosahedral lantern',
  studioId: 1,
  title: 'Mid-brief pin-up',
  startsAt: '2026-05-04T12:00:00.000Z',
  durationMinutes: 90,
  room: 'Workshop 2',
  state: 'scheduled',
  createdBy: { id: 2, name: 'Wren Halloway' },
  entries: [{ position: 1, submissionId: 7, participant: { id: 30, name: 'Oda Finch' }, latestRevision: { id: 44, number: 2 }, critics: [], openPins: 3, resolvedPins: 1 }],
});

interface Server {
  me: (typeof people)[keyof typeof people];
  pinup: Pinup | { status: number; message: string };
  writes: { url: string; method: string; body: unknown }[];
}

function serve(server: Server) {
  fetchMock.mockImplementation(async (input, init) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    if (method !== 'GET') {
      const body = init?.body ? JSON.parse(String(init.body)) : undefined;
      server.writes.push({ url, method, body });
      const p = server.pinup as Pinup;
      if (method === 'DELETE') return new Response(null, { status: 204 });
      if (url === '/api/submissions/7/critics') {
        server.pinup = { ...p, entries: p.entries.map((e) => ({ ...e, critics: body.userIds.map((id: number) => ({ id, name: id === 5 ? 'Juno Pell' : 'Tamsin Reede' })) })) };
        return json(200, { id: 7 });
      }
      server.pinup = { ...p, ...body };
      return json(200, server.pinup);
    }
    if (url === '/api/auth/me') return json(200, server.me);
    if (url === '/api/pinups/9') {
      const p = server.pinup;
      return 'status' in p ? json(p.status, { error: { code: 'forbidden', message: p.message } }) : json(200, p);
    }
    if (url === '/api/studios/1') return json(200, { id: 1, name: 'Quillmarsh Lamp Studio', description: '', createdAt: '', myRole: server.me.memberships[0].role, memberCount: 5 });
    if (url === '/api/studios/1/members')
      return json(200, [
        { userId: 5, name: 'Juno Pell', email: 'critic@example.org', role: 'critic', joinedAt: '' },
        { userId: 6, name: 'Tamsin Reede', email: 'tamsin@example.org', role: 'critic', joinedAt: '' },
        { userId: 30, name: 'Oda Finch', email: 'participant@example.org', role: 'participant', joinedAt: '' },
      ]);
    if (url === '/api/briefs/3') return json(200, { id: 3, title: 'Icosahedral lantern' });
    if (url === '/api/briefs/3/submissions') return json(200, [{ submissionId: 7, participant: { id: 30, name: 'Oda Finch', email: 'participant@example.org' }, latestRevision: { id: 44, number: 2, createdAt: '' } }]);
    return json(404, { error: { code: 'not_found', message: `no fake for ${url}` } });
  });
}

function open(server: Server) {
  serve(server);
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter(
    [
      { path: '/pinups/:pinupId', Component, loader: makeLoader(queryClient), ErrorBoundary: () => <p role="alert">route error</p> },
      { path: '/briefs/:briefId', Component: () => <p>Brief page</p> },
    ],
    { initialEntries: ['/pinups/9'] },
  );
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}


describe('pin-up page', () => {
  it('lets the instructor start the session and then finish it', async () => {
    const server: Server = { me: people.instructor, pinup: pinup(), writes: [] };
    open(server);
    fireEvent.click(await screen.findByRole('button', { name: 'Start the pin-up' }));
    await waitFor(() => expect(server.writes).toEqual([{ url: '/api/pinups/9', method: 'PATCH', body: { state: 'running' } }]));
    expect(await screen.findByText('The pin-up is running.')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Finish the pin-up' }));
    await waitFor(() => expect(server.writes[1]).toEqual({ url: '/api/pinups/9', method: 'PATCH', body: { state: 'finished' } }));
    expect(await screen.findByText('The pin-up is finished.')).toBeTruthy();
  });

  it('assigns critics per entry from the studio’s critics only', async () => {
    const server: Server = { me: people.instructor, pinup: pinup(), writes: [] };
    open(server);
    const group = await screen.findByRole('group', { name: 'Critics of Oda Finch' });
    expect(within(group).getAllByRole('checkbox').map((c) => c.parentElement?.textContent)).toEqual(['Juno Pell', 'Tamsin Reede']);
    fireEvent.click(within(group).getByLabelText('Tamsin Reede'));
    fireEvent.click(within(group).getByRole('button', { name: 'Save critics of Oda Finch' }));
    await waitFor(() => expect(server.writes).toEqual([{ url: '/api/submissions/7/critics', method: 'PUT', body: { userIds: [6] } }]));
    expect(await within(group).findByText('Critics of Oda Finch saved.')).toBeTruthy();
  });

  it('deletes only after confirming, then returns to the brief', async () => {
    const server: Server = { me: people.instructor, pinup: pinup(), writes: [] };
    const router = open(server);
    fireEvent.click(await screen.findByRole('button', { name: 'Delete pin-up' }));
    fireEvent.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(server.writes).toEqual([]);
    fireEvent.click(screen.getByRole('button', { name: 'Delete pin-up' }));
    fireEvent.click(screen.getByRole('button', { name: 'Yes, delete' }));
    expect(await screen.findByText('Brief page')).toBeTruthy();
    expect(server.writes).toEqual([{ url: '/api/pinups/9', method: 'DELETE', body: undefined }]);
    expect(router.state.location.pathname).toBe('/briefs/3');
  });

  it('edits the session and sends the whole plan', async () => {
    const server: Server = { me: people.instructor, pinup: pinup(), writes: [] };
    open(server);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit pin-up' }));
    const form = screen.getByRole('form', { name: 'Edit the pin-up' });
    fireEvent.change(within(form).getByLabelText('Room'), { target: { value: 'Loft' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save changes' }));
    await waitFor(() => expect(server.writes).toHaveLength(1));
    expect(server.writes[0]).toEqual({
      url: '/api/pinups/9',
      method: 'PATCH',
      body: { title: 'Mid-brief pin-up', startsAt: '2026-05-04T12:00:00.000Z', durationMinutes: 90, room: 'Loft', submissionIds: [7] },
    });
    expect(await screen.findByText('Saved “Mid-brief pin-up”.')).toBeTruthy();
    expect(screen.getByText(/Room: Loft/)).toBeTruthy();
  });

  it('shows a critic the running order without the instructor’s controls', async () => {
    open({ me: people.critic, pinup: pinup(), writes: [] });
    expect(await screen.findByRole('table', { name: 'Running order' })).toBeTruthy();
    expect(screen.getByText('3 open')).toBeTruthy();
    expect(screen.getByText('None assigned')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Start the pin-up' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Delete pin-up' })).toBeNull();
    expect(screen.queryByRole('checkbox')).toBeNull();
    expect(screen.getByRole('link', { name: 'Present' }).getAttribute('href')).toBe('/pinups/9/present');
  });
});
