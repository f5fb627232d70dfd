import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, apiRequest, configureApiClient, safeNextPath, signInPath } from '../../src/lib/api-client.js';

function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json; charset=utf-8' } });
}

describe('apiRequest', () => {
  const fetchMock = vi.fn<typeof fetch>();
  const onUnauthorized = vi.fn();

  beforeEach(() => {
    fetchMock.mockReset();
    onUnauthorized.mockReset();
    vi.stubGlobal('fetch', fetchMock);
    configureApiClient({ onUnauthorized });
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    configureApiClient({ onUnauthorized: () => {} });
  });

  it('sends JSON with same-origin credentials and returns the parsed body', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { id: 7 }));
    await expect(api.post('/api/studios', { name: 'Loft' })).resolves.toEqual({ id: 7 });
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/studios');
    expect(init?.method).toBe('POST');
    expect(init?.credentials).toBe('same-origin');
    expect((init?.headers as Record<string, string>)['Content-Type']).toBe('application/json');
    expect(init?.body).toBe('{"name":"Loft"}');
  });

  it('sends no body and no content type when there is nothing to send', async () => {
    fetchMock.mockResolvedValue(new Response(null, { status: 204 }));
    await expect(api.post('/api/auth/logout')).resolves.toBeUndefined();
    const init = fetchMock.mock.calls[0][1];
    expect(init?.body).toBeUndefined();
    expect((init?.headers as Record<string, string>)['Content-Type']).toBeUndefined();
  });

  it('when the server answers with the error envelope, throws ApiError with its code, message and fields', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(422, { error: { code: 'validation', message: 'Check the fields', fields: { 'body.email': 'Enter a valid e-mail address' } } }),
    );
    const error = await apiRequest('/api/studios/1/invitations', { method: 'POST', body: {} }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 422, code: 'validation', message: 'Check the fields', fields: { 'body.email': 'Enter a valid e-mail address' } });
  });

  it('when an error answer is not JSON (a proxy page), still throws a readable ApiError', async () => {
    fetchMock.mockResolvedValue(new Response('<html>Bad gateway</html>', { status: 502, headers: { 'Content-Type': 'text/html' } }));
    const error = (await api.get('/api/studios').catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(502);
    expect(error.code).toBe('http_502');
    expect(error.message).toMatch(/502/);
    expect(error.fields).toEqual({});
  });

  it('when the network fails, throws ApiError with status 0 instead of a TypeError', async () => {
    fetchMock.mockRejectedValue(new TypeError('Failed to fetch'));
    await expect(api.get('/api/studios')).rejects.toMatchObject({ name: 'ApiError', status: 0, code: 'network_error' });
  });

  it('hands a 401 from an ordinary call to the unauthorized handler', async () => {
    fetchMock.mockResolvedValue(jsonResponse(401, { error: { code: 'unauthenticated', message: 'Sign in to continue.' } }));
    await expect(api.get('/api/studios/1/members')).rejects.toMatchObject({ status: 401 });
    expect(onUnauthorized).toHaveBeenCalledTimes(1);
    expect(onUnauthorized.mock.calls[0][0]).toBeInstanceOf(ApiError);
  });

  it('does not redirect on a 401 from the session probe or from sign-in itself', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(401, { error: { code: 'unauthenticated', message: 'no' } }));
    await expect(api.get('/api/auth/me')).rejects.toMatchObject({ status: 401 });
    await expect(api.post('/api/auth/login', { email: 'a@example.org', password: 'x' })).rejects.toMatchObject({ status: 401 });
    expect(onUnauthorized).not.toHaveBeenCalled();
  });

  it('does not call the unauthorized handler for a 403', async () => {
    fetchMock.mockResolvedValue(jsonResponse(403, { error: { code: 'forbidden', message: 'Not yours' } }));
    await expect(api.get('/api/admin/users')).rejects.toMatchObject({ status: 403, message: 'Not yours' });
    expect(onUnauthorized).not.toHaveBeenCalled();
  });
});

describe('safeNextPath', () => {
  it('keeps an in-app path with its query', () => {
    expect(safeNextPath('/studios/3?tab=members')).toBe('/studios/3?tab=members');
  });
  it('when the target is another site (absolute or protocol-relative), goes home instead', () => {
    expect(safeNextPath('https://elsewhere.example.org/')).toBe('/');
    expect(safeNextPath('//elsewhere.example.org/')).toBe('/');
    expect(safeNextPath('/\\elsewhere.example.org')).toBe('/');
  });
  it('when missing or pointing back at sign-in, goes home', () => {
    expect(safeNextPath(null)).toBe('/');
    expect(safeNextPath('')).toBe('/');
    expect(safeNextPath('/sign-in?next=/x')).toBe('/');
  });
});

describe('signInPath', () => {
  it('encodes the return path and leaves it out for the home page', () => {
    expect(signInPath('/studios/1?x=a&y=b')).toBe('/sign-in?next=%2Fstudios%2F1%3Fx%3Da%26y%3Db');
    expect(signInPath('/')).toBe('/sign-in');
  });
});
