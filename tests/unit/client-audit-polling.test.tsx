// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { Suspense } from 'react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import type { Audit } from '../../shared/api/revisions.js';
import { auditPollInterval } from '../../src/features/revisions/api/audit-polling.js';
import { useRevision } from '../../src/features/revisions/api/get-revision.js';
import { AuditStatus } from '../../src/features/revisions/components/audit-status.js';

function Probe() {
  const { data } = useRevision(5);
  return <p>{`state ${data.audit.state}`}</p>;
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
    render(
      <QueryClientProvider client={client}>
        <Suspense fallback="loading">
          <Probe />
        </Suspense>
      </QueryClientProvider>,
    );
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

describe('AuditStatus', () => {
  const fetchMock = vi.fn<typeof fetch>();
  beforeEach(() => {
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });
  const failed: Audit = { id: 1, state: 'failed', attempts: 1, error: 'The worker stopped: the design has 40,000 pieces, more than the audit takes.', queuedAt: '2026-03-01T10:00:00Z', startedAt: null, finishedAt: null, report: null };
  const renderStatus = (canRetry: boolean) => {
    const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
    render(
      <QueryClientProvider client={client}>
        <AuditStatus revisionId={5} audit={failed} canRetry={canRetry} />
      </QueryClientProvider>,
    );
  };

  it('says why a failed audit stopped and retries it on request', async () => {
    fetchMock.mockResolvedValue(new Response(JSON.stringify({ ...failed, state: 'queued', attempts: 2 }), { status: 200, headers: { 'Content-Type': 'application/json' } }));
    renderStatus(true);
    expect(screen.getByText(/more than the audit takes/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Retry the audit' }));
    await vi.waitFor(() => expect(fetchMock).toHaveBeenCalled());
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/revisions/5/retry');
    expect(init?.method).toBe('POST');
  });

  it('shows the server’s refusal of a retry', async () => {
    fetchMock.mockResolvedValue(new Response(JSON.stringify({ error: { code: 'conflict', message: 'Only a failed audit can be retried.' } }), { status: 409, headers: { 'Content-Type': 'application/json' } }));
    renderStatus(true);
    fireEvent.click(screen.getByRole('button', { name: 'Retry the audit' }));
    expect(await screen.findByText('Only a failed audit can be retried.')).toBeTruthy();
  });

  it('offers no retry to someone who may not ask for one', () => {
    renderStatus(false);
    expect(screen.queryByRole('button', { name: 'Retry the audit' })).toBeNull();
  });
});
