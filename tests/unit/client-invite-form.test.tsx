// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { InviteForm } from '../../src/features/studios/components/invite-form.js';
import { stubFetch } from './client-support.js';

const fetchMock = stubFetch();
const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

function renderForm() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <InviteForm studioId={4} studioName="North Loft" />
    </QueryClientProvider>,
  );
}


describe('InviteForm', () => {
  it('when the address is not valid, says so at the field and sends nothing', async () => {
    renderForm();
    fireEvent.change(screen.getByLabelText('E-mail address'), { target: { value: 'not-an-address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(screen.getByLabelText('E-mail address').getAttribute('aria-invalid')).toBe('true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('when the server refuses a field, shows its message at that field and states the refusal', async () => {
    fetchMock.mockResolvedValue(
      json(409, { error: { code: 'conflict', message: 'This person is already in the studio.', fields: { 'body.email': 'Already a member' } } }),
    );
    renderForm();
    fireEvent.change(screen.getByLabelText('E-mail address'), { target: { value: 'ada@example.org' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Already a member')).toBeTruthy();
    expect(screen.getByRole('status').textContent).toContain('This person is already in the studio.');
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/studios/4/invitations');
    expect(JSON.parse(String(init?.body))).toEqual({ email: 'ada@example.org', role: 'participant' });
  });

  it('when the invitation is sent, says to whom and clears the address', async () => {
    fetchMock.mockResolvedValue(
      json(201, {
        id: 9,
        studioId: 4,
        email: 'mira@example.org',
        role: 'critic',
        state: 'pending',
        invitedBy: 'Ada Brenn',
        createdAt: '2026-03-01T10:00:00.000Z',
        expiresAt: '2026-03-08T10:00:00.000Z',
      }),
    );
    renderForm();
    fireEvent.change(screen.getByLabelText('E-mail address'), { target: { value: 'Mira@Example.org' } });
    fireEvent.change(screen.getByLabelText('Role in this studio'), { target: { value: 'critic' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    await waitFor(() => expect(screen.getByRole('status').textContent).toContain('Invitation sent to mira@example.org'));
    expect(screen.getByRole('status').textContent).toContain('as critic');
    expect(screen.getByLabelText<HTMLInputElement>('E-mail address').value).toBe('');
  });
});
