// What the client tests share: a stubbed fetch, reset before each test and removed after it,
// with the rendered tree cleaned up (jsdom tests that answer the client's requests by hand).
import { cleanup } from '@testing-library/react';
import { afterEach, beforeEach, vi } from 'vitest';

/** A fetch stub installed for every test of the file; set its answers in each test. */
export function stubFetch() {
  const fetchMock = vi.fn<typeof fetch>();
  beforeEach(() => {
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });
  return fetchMock;
}
