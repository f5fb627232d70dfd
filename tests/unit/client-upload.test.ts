import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { apiUpload, configureApiClient, isApiError, type UploadProgress } from '../../src/lib/api-client.js';
import { foldsOf, isShown } from '../../src/features/revisions/components/upload-revision-panel.js';

type Listener = (event: { loaded: number; total: number; lengthComputable: boolean }) => void;

/** A stand-in XMLHttpRequest that the test drives: progress, then an answer, an error or an abort. */
class FakeXhr {
  static last: FakeXhr | null = null;
  method = '';
  url = '';
  status = 0;
  responseText = '';
  withCredentials = false;
  headers: Record<string, string> = {};
  responseHeaders: Record<string, string> = {};
  sent: unknown = null;
  private listeners: Record<string, Array<() => void>> = {};
  private uploadListeners: Listener[] = [];
  upload = { addEventListener: (_: string, fn: Listener) => this.uploadListeners.push(fn) };
  constructor() {
    FakeXhr.last = this;
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  getResponseHeader(name: string) {
    return this.responseHeaders[name.toLowerCase()] ?? null;
  }
  addEventListener(type: string, fn: () => void) {
    (this.listeners[type] ??= []).push(fn);
  }
  send(body: unknown) {
    this.sent = body;
  }
  abort() {
    this.emit('abort');
  }
  progress(loaded: number, total: number, lengthComputable = true) {
    for (const fn of this.uploadListeners) fn({ loaded, total, lengthComputable });
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseHeaders['content-type'] = 'application/json; charset=utf-8';
    this.responseText = JSON.stringify(body);
    this.emit('load');
  }
  emit(type: string) {
    for (const fn of this.listeners[type] ?? []) fn();
  }
}

describe('apiUpload', () => {
  const onUnauthorized = vi.fn();
  beforeEach(() => {
    FakeXhr.last = null;
    onUnauthorized.mockReset();
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    configureApiClient({ onUnauthorized });
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    configureApiClient({ onUnauthorized: () => {} });
  });

  it('posts the form with credentials and reports progress as a fraction', async () => {
    const seen: UploadProgress[] = [];
    const form = new FormData();
    form.append('group', 'I');
    const done = apiUpload('/api/briefs/3/revisions', form, { onProgress: (p) => seen.push(p) });
    const xhr = FakeXhr.last!;
    expect(xhr.method).toBe('POST');
    expect(xhr.url).toBe('/api/briefs/3/revisions');
    expect(xhr.withCredentials).toBe(true);
    expect(xhr.sent).toBe(form);
    xhr.progress(250, 1000);
    xhr.progress(1000, 1000);
    xhr.progress(10, 0, false);
    xhr.answer(201, { id: 7, number: 2 });
    await expect(done).resolves.toEqual({ id: 7, number: 2 });
    expect(seen).toEqual([
      { loaded: 250, total: 1000, fraction: 0.25 },
      { loaded: 1000, total: 1000, fraction: 1 },
      { loaded: 10, total: null, fraction: null },
    ]);
  });

  it('when the server refuses, rejects with its code, message and field messages', async () => {
    const done = apiUpload('/api/briefs/3/revisions', new FormData());
    FakeXhr.last!.answer(422, {
      error: { code: 'unprocessable', message: 'rib.svg could not be read', fields: { 'files.outline-1': 'the outline is open' } },
    });
    const error = await done.catch((e: unknown) => e);
    expect(isApiError(error)).toBe(true);
    expect(error).toMatchObject({ status: 422, code: 'unprocessable', message: 'rib.svg could not be read', fields: { 'files.outline-1': 'the outline is open' } });
    expect(onUnauthorized).not.toHaveBeenCalled();
  });

  it('when the answer is not the error envelope (a proxy’s 413 page), still says what went wrong', async () => {
    const done = apiUpload('/api/briefs/3/revisions', new FormData());
    const xhr = FakeXhr.last!;
    xhr.status = 413;
    xhr.responseHeaders['content-type'] = 'text/html';
    xhr.responseText = '<html>too big</html>';
    xhr.emit('load');
    await expect(done).rejects.toMatchObject({ status: 413, message: 'That upload is too large.' });
  });

  it('when the session has ended, hands over to the sign-in handler', async () => {
    const done = apiUpload('/api/briefs/3/revisions', new FormData());
    FakeXhr.last!.answer(401, { error: { code: 'unauthenticated', message: 'Please sign in.' } });
    await expect(done).rejects.toMatchObject({ status: 401 });
    expect(onUnauthorized).toHaveBeenCalledTimes(1);
  });

  it('when the connection drops, says nothing was stored', async () => {
    const done = apiUpload('/api/briefs/3/revisions', new FormData());
    FakeXhr.last!.emit('error');
    await expect(done).rejects.toMatchObject({ status: 0, code: 'network_error' });
    await done.catch((e: Error) => expect(e.message).toContain('nothing was stored'));
  });

  it('when cancelled, rejects with an AbortError and aborts the request', async () => {
    const controller = new AbortController();
    const done = apiUpload('/api/briefs/3/revisions', new FormData(), { signal: controller.signal });
    controller.abort();
    await expect(done).rejects.toMatchObject({ name: 'AbortError' });
  });
});

describe('upload panel helpers', () => {
  it('offers the folds each group has (FORMAT.md canonical normals)', () => {
    expect(foldsOf('I')).toEqual([2, 3, 5]);
    expect(foldsOf('O')).toEqual([2, 3, 4]);
    expect(foldsOf('T')).toEqual([2, 3]);
    expect(foldsOf('D5')).toEqual([2, 5]);
    expect(foldsOf('D2')).toEqual([2]);
    expect(foldsOf('C7')).toEqual([7]);
    expect(foldsOf('X')).toEqual([]);
  });

  it('shows a server message at a field only when that field is on screen', () => {
    expect(isShown('files.design', 'file', 0)).toBe(true);
    expect(isShown('files.design', 'form', 1)).toBe(false);
    expect(isShown('families.1.offset', 'form', 1)).toBe(true);
    expect(isShown('families.1.offset', 'file', 1)).toBe(false);
    expect(isShown('files.outline-2', 'form', 2)).toBe(true);
    expect(isShown('files.outline-3', 'form', 2)).toBe(false);
    expect(isShown('motifs.0.family', 'form', 1)).toBe(true);
    expect(isShown('files.photos', 'file', 0)).toBe(true);
    expect(isShown('body.unknown', 'form', 1)).toBe(false);
  });
});
