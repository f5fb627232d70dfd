// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import type { CreatePinBody, RevisionPins } from '../../shared/api/critique.js';
import { optimisticPin, useCreatePin } from '../../src/features/pins/api/create-pin.js';
import { PIN_POLL_MS, keepSameVersion, revisionPinsQueryOptions, useRevisionPins } from '../../src/features/pins/api/get-revision-pins.js';
import { pinKeys } from '../../src/features/pins/api/keys.js';
import { CRITIC, json, pin, revisionPins } from './client-pins-fixtures.test.js';

const fetchMock = vi.fn<typeof fetch>();
let client: QueryClient;
const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;

const body: CreatePinBody = {
  anchor: { piece: 'keel-03', point: [12.5, -4], side: -1 },
  scope: 'orbit',
  category: 'fabrication',
  camera: { position: [300, -200, 150], target: [0, 0, 40] },
  body: 'Slot looks tight.',
};

beforeEach(() => {
  client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.useRealTimers();
});

describe('pinKeys', () => {
  it('nests one revision list under the lists, so invalidating lists reaches every revision', async () => {
    client.setQueryData(pinKeys.list(1), revisionPins([]));
    client.setQueryData(pinKeys.list(2), revisionPins([]));
    await client.invalidateQueries({ queryKey: pinKeys.list(1) });
    expect(client.getQueryState(pinKeys.list(1))?.isInvalidated).toBe(true);
    expect(client.getQueryState(pinKeys.list(2))?.isInvalidated).toBe(false);
    await client.invalidateQueries({ queryKey: pinKeys.lists() });
    expect(client.getQueryState(pinKeys.list(2))?.isInvalidated).toBe(true);
  });
});

describe('keepSameVersion', () => {
  it('keeps the cached object when the version is unchanged, even if a poll brought a copy', () => {
    const old = revisionPins([pin({ id: 1 })], { version: 'abc' });
    // A field differs but the server says nothing changed: the cached object stays (deep
    // comparison alone would take the copy).
    const copy = structuredClone(old);
    copy.pins[0].updatedAt = '2026-12-01T00:00:00.000Z';
    expect(keepSameVersion(old, copy)).toBe(old);
  });

  it('takes the new answer when the version changed, sharing unchanged pins', () => {
    const old = revisionPins([pin({ id: 1 })], { version: 'abc' });
    const next = revisionPins([structuredClone(old.pins[0]), pin({ id: 2 })], { version: 'abd' }) as RevisionPins;
    const merged = keepSameVersion(old, next) as RevisionPins;
    expect(merged).not.toBe(old);
    expect(merged.pins).toHaveLength(2);
    expect(merged.pins[0]).toBe(old.pins[0]);
  });

  it('is the structural sharing of the list query', () => {
    expect(revisionPinsQueryOptions(4).structuralSharing).toBe(keepSameVersion);
    expect(revisionPinsQueryOptions(4).queryKey).toEqual(pinKeys.list(4));
  });
});

describe('useRevisionPins', () => {
  it('asks for the revision pins again every 5 s', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    let n = 0;
    fetchMock.mockImplementation(async () => json(200, revisionPins([pin({ id: 1, updatedAt: `2026-12-01T00:00:0${n++}.000Z` })], { version: 'same' })));
    const { result } = renderHook(() => useRevisionPins(12), { wrapper });
    await waitFor(() => expect(result.current.isSuccess).toBe(true));
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(fetchMock.mock.calls[0][0]).toBe('/api/revisions/12/pins');
    const first = result.current.data;
    await act(async () => {
      await vi.advanceTimersByTimeAsync(PIN_POLL_MS + 50);
    });
    expect(fetchMock).toHaveBeenCalledTimes(2);
    expect(result.current.data).toBe(first);
  });

  it('does not poll when not live', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    fetchMock.mockImplementation(async () => json(200, revisionPins([])));
    const { result } = renderHook(() => useRevisionPins(12, false), { wrapper });
    await waitFor(() => expect(result.current.isSuccess).toBe(true));
    await act(async () => {
      await vi.advanceTimersByTimeAsync(PIN_POLL_MS * 2);
    });
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });
});

describe('useCreatePin', () => {
  it('shows the pin at once in the watched list, then swaps in the server answer', async () => {
    let answer: (r: Response) => void = () => {};
    fetchMock.mockResolvedValueOnce(json(200, revisionPins([pin({ id: 1 })], { version: 'v1' })));
    fetchMock.mockImplementationOnce(() => new Promise<Response>((resolve) => (answer = resolve)));
    fetchMock.mockImplementation(async () => json(200, revisionPins([pin({ id: 1 }), pin({ id: 9, number: 2 })], { version: 'v9' })));
    // The list is watched as on the page, so its structural sharing applies to the optimistic entry too.
    const { result } = renderHook(() => ({ list: useRevisionPins(12), create: useCreatePin(12, CRITIC) }), { wrapper });
    await waitFor(() => expect(result.current.list.isSuccess).toBe(true));
    act(() => result.current.create.mutate(body));
    await waitFor(() => expect(result.current.list.data?.pins).toHaveLength(2));
    const temp = result.current.list.data!.pins[1];
    expect(temp.id).toBeLessThan(0);
    expect(temp.number).toBe(2);
    expect(temp.anchor).toEqual(body.anchor);
    expect(temp.comments[0].body).toBe('Slot looks tight.');
    const [url, init] = fetchMock.mock.calls[1];
    expect(url).toBe('/api/revisions/12/pins');
    expect(init?.method).toBe('POST');
    expect(JSON.parse(String(init?.body))).toEqual(body);
    await act(async () => answer(json(201, pin({ id: 9, number: 2 }))));
    await waitFor(() => expect(result.current.list.data?.pins.map((p) => p.id)).toEqual([1, 9]));
  });

  it('takes the pin back out of the watched list when the server refuses it', async () => {
    let refuse: (r: Response) => void = () => {};
    fetchMock.mockResolvedValueOnce(json(200, revisionPins([pin({ id: 1 })], { version: 'v1' })));
    fetchMock.mockImplementationOnce(() => new Promise<Response>((resolve) => (refuse = resolve)));
    // The refetch after the refusal hangs, so what the list shows is the rollback itself.
    fetchMock.mockImplementation(() => new Promise<Response>(() => {}));
    const { result } = renderHook(() => ({ list: useRevisionPins(12), create: useCreatePin(12, CRITIC) }), { wrapper });
    await waitFor(() => expect(result.current.list.isSuccess).toBe(true));
    act(() => result.current.create.mutate(body));
    await waitFor(() => expect(result.current.list.data?.pins).toHaveLength(2));
    await act(async () => refuse(json(403, { error: { code: 'forbidden', message: 'Only assigned critics pin here.' } })));
    await waitFor(() => expect(result.current.create.isError).toBe(true));
    expect(result.current.create.error?.message).toBe('Only assigned critics pin here.');
    await waitFor(() => expect(result.current.list.data?.pins.map((p) => p.id)).toEqual([1]));
  });

  it('numbers the optimistic pin after the highest number so far', () => {
    const data = revisionPins([pin({ id: 1, number: 4 }), pin({ id: 2, number: 2 })]);
    const temp = optimisticPin(data, 12, body, CRITIC, new Date('2026-12-01T08:00:00Z'));
    expect(temp.number).toBe(5);
    expect(temp.state).toBe('open');
    expect(temp.scope).toBe('orbit');
    expect(temp.createdAt).toBe('2026-12-01T08:00:00.000Z');
  });
});
