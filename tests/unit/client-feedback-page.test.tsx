// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { Feedback } from '../../shared/api/critique.js';
import { Component, makeLoader } from '../../src/app/routes/submission-feedback.js';
import { stubFetch } from './client-support.js';

// The feedback page against a fake server answering by address (the real routes' shapes).
const fetchMock = stubFetch();
const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

const rubric: Feedback['rubric'] = [
  { id: 'structure', criterion: 'Structure and joints', weight: 3, levels: [{ score: 1, label: 'Loose', descriptor: '' }, { score: 3, label: 'Sound', descriptor: 'Every joint square.' }] },
  { id: 'light', criterion: 'Light and form', weight: 1, levels: [{ score: 1, label: 'Unresolved', descriptor: '' }, { score: 2, label: 'Striking', descriptor: '' }] },
];

const people = {
  participant: { id: 30, email: 'participant@example.org', name: 'Oda Finch', globalRole: null, memberships: [{ studioId: 1, role: 'participant' }] },
  critic: { id: 5, email: 'critic@example.org', name: 'Juno Pell', globalRole: null, memberships: [{ studioId: 1, role: 'critic' }] },
  instructor: { id: 2, email: 'instructor@example.org', name: 'Wren Halloway', globalRole: null, memberships: [{ studioId: 1, role: 'instructor' }] },
};

const base: Feedback = { submissionId: 7, rubric, sheets: [], finalMark: null, summary: '', released: false, releasedAt: null, canScore: false, canMark: false };

interface Server {
  me: (typeof people)[keyof typeof people];
  feedback: Feedback | { status: number; message: string };
  writes: { url: string; method: string; body: unknown }[];
}

function serve(server: Server) {
  fetchMock.mockImplementation(async (input, init) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    if (method !== 'GET') {
      const body = init?.body ? JSON.parse(String(init.body)) : undefined;
      server.writes.push({ url, method, body });
      const fb = server.feedback as Feedback;
      if (url.endsWith('/feedback/release')) server.feedback = { ...fb, released: true, releasedAt: '2026-05-06T09:30:00.000Z' };
      else if (url.endsWith('/feedback')) server.feedback = { ...fb, finalMark: body.finalMark, summary: body.summary };
      else if (url.endsWith('/scores')) server.feedback = { ...fb, sheets: [{ scorer: { id: server.me.id, name: server.me.name, role: 'critic' }, scores: body.scores, weighted: 75, updatedAt: '2026-05-05T10:00:00.000Z' }] };
      return json(200, server.feedback);
    }
    if (url === '/api/auth/me') return json(200, server.me);
    if (url === '/api/submissions/7') return json(200, { id: 7, briefId: 3, studioId: 1, participant: { id: 30, name: 'Oda Finch' }, createdAt: '2026-04-01T10:00:00.000Z', revisions: [{ id: 44, number: 2 }], critics: [{ id: 5, name: 'Juno Pell' }] });
    if (url === '/api/studios/1') return json(200, { id: 1, name: 'Quillmarsh Lamp Studio', description: '', createdAt: '', myRole: server.me.memberships[0].role, memberCount: 5 });
    if (url === '/api/briefs/3') return json(200, { id: 3, title: 'Icosahedral lantern' });
    if (url === '/api/submissions/7/feedback') {
      const f = server.feedback;
      return 'status' in f ? json(f.status, { error: { code: 'forbidden', message: f.message } }) : json(200, f);
    }
    return json(404, { error: { code: 'not_found', message: `no fake for ${url}` } });
  });
}

function open(server: Server) {
  serve(server);
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter([{ path: '/submissions/:submissionId/feedback', Component, loader: makeLoader(queryClient) }], { initialEntries: ['/submissions/7/feedback'] });
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}


describe('feedback page', () => {
  it('tells the participant the feedback is not released yet, and nothing else', async () => {
    open({ me: people.participant, feedback: base, writes: [] });
    expect(await screen.findByText('Feedback has not been released yet')).toBeTruthy();
    expect(screen.queryByRole('form')).toBeNull();
    expect(screen.queryByText('Structure and joints')).toBeNull();
  });

  it('shows the participant the mark, summary and sheets once released', async () => {
    open({
      me: people.participant,
      feedback: {
        ...base,
        released: true,
        releasedAt: '2026-05-06T09:30:00.000Z',
        finalMark: 78,
        summary: 'A sound lantern; the light could be bolder.',
        sheets: [{ scorer: { id: 5, name: 'Juno Pell', role: 'critic' }, scores: [{ criterion: 'structure', score: 3, comment: 'Square throughout.' }], weighted: 100, updatedAt: '2026-05-05T10:00:00.000Z' }],
      },
      writes: [],
    });
    expect(await screen.findByText('78')).toBeTruthy();
    expect(screen.getByText('A sound lantern; the light could be bolder.')).toBeTruthy();
    expect(screen.getByText('Square throughout.')).toBeTruthy();
    expect(screen.getByText(/Released/)).toBeTruthy();
  });

  it('shows the server’s refusal as it is', async () => {
    open({ me: people.critic, feedback: { status: 403, message: 'This submission is not yours to see.' }, writes: [] });
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('This submission is not yours to see.');
    expect(within(alert).getByRole('button', { name: 'Try again' })).toBeTruthy();
  });

  it('lets a critic score and save their own sheet', async () => {
    const server: Server = { me: people.critic, feedback: { ...base, canScore: true }, writes: [] };
    open(server);
    const form = await screen.findByRole('form', { name: 'Your scores' });
    fireEvent.click(within(form).getByRole('radio', { name: /Sound/ }));
    fireEvent.click(within(form).getByRole('button', { name: 'Save scores' }));
    await waitFor(() => expect(server.writes).toHaveLength(1));
    expect(server.writes[0]).toEqual({ url: '/api/submissions/7/scores', method: 'PUT', body: { scores: [{ criterion: 'structure', score: 3, comment: '' }] } });
    expect(await screen.findByText(/Saved .* · weighted 75 \/ 100/)).toBeTruthy();
    expect(screen.queryByRole('form', { name: 'Final mark and summary' })).toBeNull();
  });

  it('lets the instructor set the final mark, checks its range, and release after confirming', async () => {
    const server: Server = { me: people.instructor, feedback: { ...base, canScore: true, canMark: true }, writes: [] };
    open(server);
    const markForm = await screen.findByRole('form', { name: 'Final mark and summary' });
    fireEvent.change(within(markForm).getByLabelText('Final mark (0–100)'), { target: { value: '140' } });
    fireEvent.click(within(markForm).getByRole('button', { name: 'Save mark and summary' }));
    expect(await within(markForm).findByText('must be 100 or less')).toBeTruthy();
    expect(server.writes).toHaveLength(0);
    fireEvent.change(within(markForm).getByLabelText('Final mark (0–100)'), { target: { value: '78' } });
    fireEvent.change(within(markForm).getByLabelText('Summary for the participant'), { target: { value: 'Sound work.' } });
    fireEvent.click(within(markForm).getByRole('button', { name: 'Save mark and summary' }));
    await waitFor(() => expect(server.writes).toHaveLength(1));
    expect(server.writes[0]).toEqual({ url: '/api/submissions/7/feedback', method: 'PUT', body: { finalMark: 78, summary: 'Sound work.' } });

    fireEvent.click(screen.getByRole('button', { name: 'Release feedback' }));
    expect(screen.getByText(/Release the final mark 78, the summary and every sheet to Oda Finch\?/)).toBeTruthy();
    expect(server.writes).toHaveLength(1);
    fireEvent.click(screen.getByRole('button', { name: 'Yes, release' }));
    await waitFor(() => expect(server.writes).toHaveLength(2));
    expect(server.writes[1]).toMatchObject({ url: '/api/submissions/7/feedback/release', method: 'POST' });
    await waitFor(() => expect(document.body.textContent).toMatch(/Released at .*Oda Finch can read the mark, the summary and every sheet/));
    expect(screen.queryByRole('button', { name: 'Release feedback' })).toBeNull();
  });

  it('says when the brief has no rubric and only the final mark applies', async () => {
    open({ me: people.instructor, feedback: { ...base, rubric: [], canScore: true, canMark: true }, writes: [] });
    expect((await screen.findAllByText(/This brief has no rubric.*only the final mark applies/)).length).toBeGreaterThan(0);
    expect(screen.queryByRole('form', { name: 'Your scores' })).toBeNull();
    expect(screen.getByRole('form', { name: 'Final mark and summary' })).toBeTruthy();
  });
});
