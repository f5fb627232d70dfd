// @vitest-environment jsdom
// How the critique drives the viewer: the 3-D viewer itself needs WebGL (tests/browser/pins.test.ts
// drives the real one); here a stand-in records the props it is given and plays the viewer's part
// (a piece clicked in place-a-pin mode, a marker pressed), so the wiring can be checked in jsdom.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import type { AuditReportDto } from '../../shared/api/revisions.js';
import type { ModelViewerProps, ViewerPins } from '../../src/features/viewer/components/model-viewer.js';
import { RevisionCritique } from '../../src/app/compositions/revision-critique.js';
import { CRITIC, PARTICIPANT, json, pin, revisionPins } from './client-pins-fixtures.test.js';

const seen: { pins: ViewerPins | null } = { pins: null };
vi.mock('../../src/features/viewer/components/model-viewer.js', () => ({
  default: (props: ModelViewerProps) => {
    seen.pins = props.pins ?? null;
    return <div data-testid="viewer-stand-in" data-placing={String(props.pins?.placing ?? false)} />;
  },
}));

const fetchMock = vi.fn<typeof fetch>();
const revision = { id: 12, number: 2, design: {}, participant: { id: PARTICIPANT.id, name: PARTICIPANT.name } };
const report = { joints: [] } as unknown as AuditReportDto;
const placed = { anchor: { piece: 'keel-04', point: [3, 7] as [number, number], side: 1 as const }, camera: { position: [500, -400, 200] as [number, number, number], target: [0, 0, 30] as [number, number, number] }, orbitSize: 60 };

function renderCritique() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <RevisionCritique revision={revision} report={report} viewer={{ id: CRITIC.id, name: CRITIC.name, role: 'critic' }} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const rows = () => within(screen.getByTestId('pin-list')).getAllByRole('button');

beforeEach(() => {
  seen.pins = null;
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('RevisionCritique with the viewer', () => {
  it('hands the viewer every pin with its number, anchor, scope and state', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 }), pin({ id: 2, state: 'resolved', scope: 'orbit' })])));
    renderCritique();
    await screen.findByTestId('viewer-stand-in');
    await waitFor(() => expect(seen.pins?.pins).toHaveLength(2));
    expect(seen.pins!.pins[1]).toMatchObject({ key: '2', number: 2, scope: 'orbit', resolved: true, anchor: { piece: 'panel-05' } });
    expect(seen.pins!.canPlace).toBe(true);
  });

  it('a piece clicked in place-a-pin mode opens the form; Save shows the pin at once and sends it', async () => {
    fetchMock.mockResolvedValueOnce(json(200, revisionPins([pin({ id: 1 })])));
    let answer: (r: Response) => void = () => {};
    fetchMock.mockImplementationOnce(() => new Promise<Response>((resolve) => (answer = resolve)));
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1 }), pin({ id: 2, anchor: placed.anchor })], { version: 'v2' })));
    renderCritique();
    await screen.findByTestId('pin-list');
    fireEvent.click(screen.getByRole('button', { name: /Place a pin/ }));
    await waitFor(() => expect(seen.pins?.placing).toBe(true));
    act(() => seen.pins!.onPlace(placed));
    const form = screen.getByTestId('new-pin-form');
    expect(within(form).getByRole('heading').textContent).toBe('New pin on keel-04');
    expect(seen.pins!.placing).toBe(false);
    expect(seen.pins!.draft).toEqual(placed.anchor);
    fireEvent.change(within(form).getByLabelText('Comment'), { target: { value: 'Grain runs the weak way here.' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save pin' }));
    expect(screen.queryByTestId('new-pin-form')).toBeNull();
    // Listed before the server answers.
    await waitFor(() => expect(rows()).toHaveLength(2));
    expect(rows()[1].textContent).toContain('keel-04');
    expect(rows()[1].textContent).toContain('saving…');
    const [url, init] = fetchMock.mock.calls[1];
    expect(url).toBe('/api/revisions/12/pins');
    expect(JSON.parse(String(init?.body))).toEqual({ anchor: placed.anchor, scope: 'piece', category: 'structure', camera: placed.camera, body: 'Grain runs the weak way here.' });
    await act(async () => answer(json(201, pin({ id: 2, anchor: placed.anchor, comments: [] }))));
    await waitFor(() => expect(rows()[1].getAttribute('data-pin-id')).toBe('2'));
    // The new pin is selected: its thread is open and its marker highlighted.
    expect(screen.getByTestId('pin-thread')).toBeTruthy();
    expect(seen.pins!.selected).toBe('2');
  });

  it('when the server refuses the pin, the form comes back with the text and the reason', async () => {
    fetchMock.mockResolvedValueOnce(json(200, revisionPins([])));
    fetchMock.mockResolvedValueOnce(json(403, { error: { code: 'forbidden', message: 'You are not a critic of this submission.' } }));
    fetchMock.mockResolvedValue(json(200, revisionPins([])));
    renderCritique();
    await screen.findByText(/No pins yet/);
    act(() => seen.pins!.onPlace(placed));
    fireEvent.change(screen.getByLabelText('Comment'), { target: { value: 'Tight slot.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save pin' }));
    const alert = await screen.findByText(/The pin was not saved: You are not a critic of this submission\./);
    expect(alert).toBeTruthy();
    expect((screen.getByLabelText('Comment') as HTMLTextAreaElement).value).toBe('Tight slot.');
    expect(screen.queryByTestId('pin-list')).toBeNull();
  });

  it('Escape drops the pin being written', async () => {
    fetchMock.mockResolvedValue(json(200, revisionPins([])));
    renderCritique();
    await screen.findByText(/No pins yet/);
    act(() => seen.pins!.onPlace(placed));
    expect(screen.getByTestId('new-pin-form')).toBeTruthy();
    fireEvent.keyDown(document.body, { key: 'Escape' });
    expect(screen.queryByTestId('new-pin-form')).toBeNull();
    expect(seen.pins!.draft).toBeNull();
  });

  it('choosing a pin in the list flies to its saved view; pressing a marker selects it in the list', async () => {
    const camera = { position: [90, -80, 70] as [number, number, number], target: [5, 5, 5] as [number, number, number] };
    fetchMock.mockResolvedValue(json(200, revisionPins([pin({ id: 1, camera }), pin({ id: 2, state: 'resolved' })])));
    renderCritique();
    await screen.findByTestId('pin-list');
    fireEvent.click(rows()[0]);
    expect(seen.pins!.view?.camera).toEqual(camera);
    expect(seen.pins!.selected).toBe('1');
    const key = seen.pins!.view!.key;
    // Filtered to open pins, a marker of a resolved pin still finds its row.
    fireEvent.click(screen.getByLabelText('Open (1)'));
    act(() => seen.pins!.onSelect('2'));
    expect(rows().find((r) => r.getAttribute('aria-pressed') === 'true')?.getAttribute('data-pin-id')).toBe('2');
    expect(within(screen.getByTestId('pin-thread')).getByRole('heading').textContent).toContain('Pin 2');
    expect(seen.pins!.view!.key).toBe(key);
  });
});
