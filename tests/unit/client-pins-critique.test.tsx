// @vitest-environment jsdom
import { describe, expect, it, vi } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import type { AuditReportDto } from '../../shared/api/revisions.js';
import cubePlates from '../fixtures/designs/o-cube-plates.json';
import { type CritiqueViewer, RevisionCritique } from '../../src/app/compositions/revision-critique.js';
import { CRITIC, PARTICIPANT, json, pin, revisionPins } from './client-pins-fixtures.test.js';
import { stubFetch } from './client-support.js';

const fetchMock = stubFetch();
const revision = { id: 12, number: 2, design: {}, participant: { id: PARTICIPANT.id, name: PARTICIPANT.name } };
const critic: CritiqueViewer = { id: CRITIC.id, name: CRITIC.name, role: 'critic' };
const owner: CritiqueViewer = { id: PARTICIPANT.id, name: PARTICIPANT.name, role: 'participant' };

function renderCritique(props: Partial<Parameters<typeof RevisionCritique>[0]> = {}) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <RevisionCritique revision={revision} report={null} viewer={critic} {...props} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}


describe('RevisionCritique states', () => {
  it('shows a loading placeholder, then the pins of the revision', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 }), pin({ id: 2, state: 'resolved' })])));
    renderCritique();
    expect(screen.getByRole('status').textContent).toContain('Loading the pins');
    expect(await screen.findByTestId('pin-list')).toBeTruthy();
    expect(screen.getByRole('heading', { name: 'Pins (2)' })).toBeTruthy();
    expect(fetchMock.mock.calls[0][0]).toBe('/api/revisions/12/pins');
  });

  it('says so when the pins cannot be loaded, and tries again on request', async () => {
    fetchMock.mockResolvedValueOnce(json(500, { error: { code: 'internal', message: 'The pins are resting.' } }));
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 })])));
    renderCritique();
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('The pins could not be loaded');
    expect(alert.textContent).toContain('The pins are resting.');
    fireEvent.click(within(alert).getByRole('button', { name: 'Try again' }));
    expect(await screen.findByTestId('pin-list')).toBeTruthy();
  });

  it('tells a critic there are no pins yet and how to place one', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([])));
    renderCritique();
    expect(await screen.findByText('No pins yet. Place one with the button above or the P key.')).toBeTruthy();
  });

  it("tells the participant critics' pins will appear, and offers no pin placing", async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([], { canPin: false })));
    renderCritique({ viewer: owner });
    expect(await screen.findByText("No comments yet; critics' pins appear here.")).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Place a pin/ })).toBeNull();
  });

  it('says when a poll brings pins or replies from someone else', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    try {
      fetchMock.mockResolvedValueOnce(json(200, revisionPins([pin({ id: 1 })], { version: 'a' })));
      fetchMock.mockResolvedValue(
        json(200, revisionPins([pin({ id: 1 }), pin({ id: 2, author: { id: 8, name: 'Ilse Varga' } })], { version: 'b' })),
      );
      renderCritique();
      await screen.findByTestId('pin-list');
      expect(screen.queryByTestId('pin-news')).toBeNull();
      await act(async () => {
        await vi.advanceTimersByTimeAsync(5_100);
      });
      expect((await screen.findByTestId('pin-news')).textContent).toContain('Just in: 1 new pin.');
      expect(within(screen.getByTestId('pin-list')).getAllByRole('button')).toHaveLength(2);
    } finally {
      vi.useRealTimers();
    }
  });

  it('names the pins that stayed on an earlier revision, with a link there', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([], { outdatedEarlier: [{ revisionId: 9, revisionNumber: 1, count: 3 }] })));
    renderCritique();
    const note = await screen.findByTestId('outdated-earlier');
    expect(note.textContent).toContain('3 pins stayed on revision 1 (the piece changed).');
    expect(within(note).getByRole('link', { name: 'Open revision 1' }).getAttribute('href')).toBe('/revisions/9');
  });
});

describe('RevisionCritique placing and threads', () => {
  it('P toggles place-a-pin mode, not while typing, and Escape leaves it', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 })])));
    renderCritique({ report: null });
    const button = await screen.findByRole('button', { name: /Place a pin/ });
    // Without a model there is nothing to click: the button waits for the audit.
    expect((button as HTMLButtonElement).disabled).toBe(true);
    fireEvent.keyDown(document.body, { key: 'p' });
    expect(screen.getByRole('button', { name: /Placing/ }).getAttribute('aria-pressed')).toBe('true');
    fireEvent.keyDown(document.body, { key: 'Escape' });
    expect(screen.getByRole('button', { name: /Place a pin/ }).getAttribute('aria-pressed')).toBe('false');
    fireEvent.click(within(screen.getByTestId('pin-list')).getAllByRole('button')[0]);
    const reply = await screen.findByLabelText('Reply to pin 1');
    fireEvent.keyDown(reply, { key: 'p' });
    expect(screen.getByRole('button', { name: /Place a pin/ }).getAttribute('aria-pressed')).toBe('false');
  });

  it('opens the thread of the pin chosen in the list, and closes it', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 }), pin({ id: 2, category: 'form' })])));
    renderCritique();
    fireEvent.click(within(await screen.findByTestId('pin-list')).getAllByRole('button')[1]);
    const thread = screen.getByTestId('pin-thread');
    expect(within(thread).getByRole('heading').textContent).toContain('Pin 2: Form');
    fireEvent.click(within(thread).getByRole('button', { name: 'Close the thread of pin 2' }));
    expect(screen.queryByTestId('pin-thread')).toBeNull();
  });

  it('read-only shows pins and threads without placing, replying or resolving', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 })])));
    renderCritique({ readOnly: true });
    fireEvent.click(within(await screen.findByTestId('pin-list')).getAllByRole('button')[0]);
    expect(screen.getByTestId('pin-thread')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Place a pin/ })).toBeNull();
    expect(screen.queryByLabelText('Reply to pin 1')).toBeNull();
    expect(screen.queryByRole('button', { name: 'Resolve' })).toBeNull();
    fireEvent.keyDown(document.body, { key: 'p' });
    expect(screen.queryByRole('button', { name: /Placing/ })).toBeNull();
  });

  it('the owner of the submission may reply and resolve, but not recategorise a critic’s pin', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 })], { canPin: false })));
    renderCritique({ viewer: owner });
    fireEvent.click(within(await screen.findByTestId('pin-list')).getAllByRole('button')[0]);
    expect(screen.getByLabelText('Reply to pin 1')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Resolve' })).toBeTruthy();
    expect(within(screen.getByTestId('pin-thread')).queryByLabelText('Category')).toBeNull();
  });

  it('a caller may hold the selection: its pin is shown, and choices in the list are reported', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 }), pin({ id: 2, category: 'brief' })])));
    const onChange = vi.fn();
    renderCritique({ selectedPinId: 2, onSelectedPinChange: onChange, readOnly: true });
    expect(within(await screen.findByTestId('pin-thread')).getByRole('heading').textContent).toContain('Pin 2: Brief');
    fireEvent.click(within(screen.getByTestId('pin-list')).getAllByRole('button')[0]);
    expect(onChange).toHaveBeenCalledWith(1);
    // Still the caller's choice until it changes the prop.
    expect(within(screen.getByTestId('pin-thread')).getByRole('heading').textContent).toContain('Pin 2');
  });

  it('when the browser has no WebGL the model says so and the pin list still works', async () => {
    const design: unknown = cubePlates;
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 })])));
    const report = { joints: [] } as unknown as AuditReportDto;
    renderCritique({ revision: { ...revision, design }, report });
    expect(await screen.findByText(/WebGL is turned off or not supported here/, undefined, { timeout: 20_000 })).toBeTruthy();
    expect(await screen.findByTestId('pin-list')).toBeTruthy();
    await waitFor(() => expect(screen.getByRole('button', { name: /Place a pin/ }).hasAttribute('disabled')).toBe(false));
  }, 30_000);
});
