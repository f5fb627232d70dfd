// @vitest-environment jsdom
import { describe, expect, it, vi } from 'vitest';
import { QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { Pin } from '../../shared/api/critique.js';
import { revisionPinsQueryOptions } from '../../src/features/pins/api/get-revision-pins.js';
import { pinKeys } from '../../src/features/pins/api/keys.js';
import { PinThread } from '../../src/features/pins/components/pin-thread.js';
import { PARTICIPANT, comment, json, pin, revisionPins } from './client-pins-fixtures.test.js';
import { stubFetch } from './client-support.js';

const fetchMock = stubFetch();

/** Watches the list as the page does (its structural sharing then applies to every cache edit), without fetching. */
function WatchList() {
  useQuery({ ...revisionPinsQueryOptions(12), staleTime: Infinity });
  return null;
}

function renderThread(p: Pin, rights = { canReply: true, canResolve: true, canChangeCategory: false }) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  client.setQueryData(pinKeys.list(12), revisionPins([p]));
  const onClose = vi.fn();
  const utils = render(
    <QueryClientProvider client={client}>
      <WatchList />
      <PinThread pin={p} revisionId={12} {...rights} onClose={onClose} />
    </QueryClientProvider>,
  );
  return { client, onClose, ...utils };
}


describe('PinThread markdown', () => {
  it('drops a <script> in a comment and shows the words around it as text', () => {
    const { container } = renderThread(pin({ id: 1, comments: [comment(1, 'Before <script>window.hacked = 1</script> after')] }));
    expect(container.querySelector('script')).toBeNull();
    expect(within(screen.getByTestId('pin-thread')).getByText(/Before/).textContent).toContain('after');
    expect((window as unknown as { hacked?: number }).hacked).toBeUndefined();
  });

  it('renders an <img onerror=…> without the image or its handler', () => {
    const { container } = renderThread(pin({ id: 1, comments: [comment(1, 'Look <img src=x onerror="window.hacked=2"> here')] }));
    expect(container.querySelector('img')).toBeNull();
    expect(container.innerHTML).not.toContain('onerror');
    expect(screen.getByText(/Look/).textContent).toContain('here');
  });

  it('keeps the text of a javascript: link but gives it no href', () => {
    const { container } = renderThread(pin({ id: 1, comments: [comment(1, 'See [x](javascript:alert(1)) and [the rules](/briefs/3)')] }));
    const hrefs = Array.from(container.querySelectorAll('a')).map((a) => a.getAttribute('href'));
    expect(hrefs).toEqual(['/briefs/3']);
    expect(container.innerHTML).not.toContain('javascript:');
    expect(screen.getByText('x')).toBeTruthy();
  });

  it('shows each comment with its author, role and time', () => {
    renderThread(pin({ id: 1, comments: [comment(1, 'First'), comment(2, 'I will widen it.', PARTICIPANT, '2026-12-01T09:30:00.000Z')] }));
    const items = within(screen.getByRole('list', { name: 'Comments on pin 1' })).getAllByRole('listitem');
    expect(items).toHaveLength(2);
    expect(items[1].textContent).toContain('Kofi Mensah-Lowe');
    expect(items[1].textContent).toContain('Participant');
    expect(items[1].querySelector('time')?.getAttribute('dateTime')).toBe('2026-12-01T09:30:00.000Z');
  });
});

describe('PinThread actions', () => {
  it('refuses an empty reply at the field and sends nothing', async () => {
    renderThread(pin({ id: 5 }));
    fireEvent.click(screen.getByRole('button', { name: 'Send reply' }));
    expect(await screen.findByText('Write a comment')).toBeTruthy();
    expect(screen.getByLabelText('Reply to pin 5').getAttribute('aria-invalid')).toBe('true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('sends a reply to the pin and adds it to the cached thread', async () => {
    fetchMock.mockResolvedValue(json(201, comment(77, 'Widened to 8 mm.', PARTICIPANT)));
    const { client } = renderThread(pin({ id: 5 }));
    fireEvent.change(screen.getByLabelText('Reply to pin 5'), { target: { value: '  Widened to 8 mm.  ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send reply' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalled());
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/pins/5/comments');
    expect(init?.method).toBe('POST');
    expect(JSON.parse(String(init?.body))).toEqual({ body: 'Widened to 8 mm.' });
    await waitFor(() => expect((screen.getByLabelText('Reply to pin 5') as HTMLTextAreaElement).value).toBe(''));
    const cached = client.getQueryData<ReturnType<typeof revisionPins>>(pinKeys.list(12));
    expect(cached?.pins[0].comments.map((c) => c.id)).toEqual([500, 77]);
  });

  it('keeps the reply and states the refusal when the server says no', async () => {
    fetchMock.mockResolvedValue(json(403, { error: { code: 'forbidden', message: 'Only people on this submission can reply.' } }));
    renderThread(pin({ id: 5 }));
    fireEvent.change(screen.getByLabelText('Reply to pin 5'), { target: { value: 'Thanks' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send reply' }));
    expect(await screen.findByText('Only people on this submission can reply.')).toBeTruthy();
    expect((screen.getByLabelText('Reply to pin 5') as HTMLTextAreaElement).value).toBe('Thanks');
  });

  it('resolves an open pin with a PATCH of its state', async () => {
    fetchMock.mockResolvedValue(json(200, pin({ id: 5, state: 'resolved', resolvedBy: { id: 4, name: 'Kofi Mensah-Lowe' } })));
    const { client } = renderThread(pin({ id: 5 }));
    expect(screen.queryByRole('button', { name: 'Reopen' })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Resolve' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalled());
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/pins/5');
    expect(init?.method).toBe('PATCH');
    expect(JSON.parse(String(init?.body))).toEqual({ state: 'resolved' });
    await waitFor(() => expect(client.getQueryData<ReturnType<typeof revisionPins>>(pinKeys.list(12))?.pins[0].state).toBe('resolved'));
  });

  it('offers Reopen on a resolved pin', async () => {
    fetchMock.mockResolvedValue(json(200, pin({ id: 5 })));
    renderThread(pin({ id: 5, state: 'resolved' }));
    fireEvent.click(screen.getByRole('button', { name: 'Reopen' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalled());
    expect(JSON.parse(String(fetchMock.mock.calls[0][1]?.body))).toEqual({ state: 'open' });
  });

  it('changes the category only where it is allowed', async () => {
    fetchMock.mockResolvedValue(json(200, pin({ id: 5, category: 'form' })));
    renderThread(pin({ id: 5 }), { canReply: true, canResolve: true, canChangeCategory: true });
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'form' } });
    await waitFor(() => expect(fetchMock).toHaveBeenCalled());
    expect(JSON.parse(String(fetchMock.mock.calls[0][1]?.body))).toEqual({ category: 'form' });
    cleanup();
    renderThread(pin({ id: 6 }), { canReply: false, canResolve: false, canChangeCategory: false });
    expect(screen.queryByLabelText('Category')).toBeNull();
    expect(screen.queryByRole('button', { name: 'Resolve' })).toBeNull();
    expect(screen.queryByLabelText('Reply to pin 6')).toBeNull();
  });

  it('marks an outdated pin and says why it stayed', () => {
    renderThread(pin({ id: 5, outdated: true, outdatedReason: 'The pinned point is no longer on panel-05: its outline changed there.' }));
    const thread = screen.getByTestId('pin-thread');
    expect(within(thread).getByText('outdated')).toBeTruthy();
    expect(thread.textContent).toContain('its outline changed there');
  });
});
