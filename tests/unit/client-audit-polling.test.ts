// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createElement, Suspense } from 'react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, render, screen } from '@testing-library/react';

// Loaded through variables: tsconfig.server.json (which type-checks tests/) does not list src/.
const GET_REVISION = '../../src/features/revisions/api/get-revision.js';
const POLLING = '../../src/features/revisions/api/audit-polling.js';
const { useRevision } = (await import(GET_REVISION)) as { useRevision: (id: number) => { data: { audit: { state: string } } } };
const { auditPollInterval } = (await import(POLLING)) as { auditPollInterval: (s: string | null | undefined) => number | false };

function Probe() {
  const { data } = useRevision(5);
  return createElement('p', null, `state ${data.audit.state}`);
}

const revision = (state: string) =>
  new Response(JSON.stringify({ id: 5, audit: { id: 1, state, report: null } }), { status: 200, headers: { 'Content-Type': 'application/json' } });

describe('audit polling', () => {
  const fetchMock = vi.fn<typeof fetch>();
  beforeEach(() => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
  });
  afterEach(() => {
    cleanup();
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  it('asks again only while the audit is queued or running', () => {
    expect(auditPollInterval('queued')).toBeGreaterThan(0);
    expect(auditPollInterval('running')).toBeGreaterThan(0);
    expect(auditPollInterval('done')).toBe(false);
    expect(auditPollInterval('failed')).toBe(false);
    expect(auditPollInterval(undefined)).toBe(false);
  });

  it('follows queued → running → done on screen, then stops asking', async () => {
    fetchMock.mockResolvedValueOnce(revision('queued')).mockResolvedValueOnce(revision('running')).mockResolvedValue(revision('done'));
    const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(createElement(QueryClientProvider, { client }, createElement(Suspense, { fallback: 'loading' }, createElement(Probe))));
    expect(await screen.findByText('state queued')).toBeTruthy();
    await act(() => vi.advanceTimersByTimeAsync(1600));
    expect(await screen.findByText('state running')).toBeTruthy();
    await act(() => vi.advanceTimersByTimeAsync(1600));
    expect(await screen.findByText('state done')).toBeTruthy();
    const calls = fetchMock.mock.calls.length;
    expect(calls).toBe(3);
    await act(() => vi.advanceTimersByTimeAsync(10_000));
    expect(fetchMock.mock.calls.length).toBe(calls);
    expect(String(fetchMock.mock.calls[0][0])).toBe('/api/revisions/5');
  });
});
