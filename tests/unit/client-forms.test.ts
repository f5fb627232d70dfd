import { describe, expect, it, vi } from 'vitest';
import { zodResolver } from '@hookform/resolvers/zod';
import { loginBodySchema } from '../../shared/api/auth.js';
import { createStudioBodySchema, inviteBodySchema } from '../../shared/api/studios.js';
import { applyFieldErrors, fieldNameFromPath } from '../../src/lib/form-errors.js';

type Errors = Record<string, { message?: string } | undefined>;

const resolverOptions = { fields: {}, shouldUseNativeValidation: false } as const;

describe('zodResolver with the shared zod 4 schemas', () => {
  it('when the invitation form is filled in badly, reports a message per field', async () => {
    const result = await zodResolver(inviteBodySchema)({ email: 'not-an-address', role: 'visitor' } as never, undefined, resolverOptions);
    expect(result.values).toEqual({});
    expect((result.errors as Errors).email?.message).toBe('Enter a valid e-mail address');
    expect((result.errors as Errors).role?.message).toBeTruthy();
  });

  it('when the form is valid, hands on the parsed (trimmed, lower-cased) values', async () => {
    const result = await zodResolver(inviteBodySchema)({ email: '  Ada@Example.ORG ', role: 'critic' }, undefined, resolverOptions);
    expect(result.errors).toEqual({});
    expect(result.values).toEqual({ email: 'ada@example.org', role: 'critic' });
  });

  it('applies schema defaults to the output (studio description)', async () => {
    const result = await zodResolver(createStudioBodySchema)({ name: 'North Loft' }, undefined, resolverOptions);
    expect(result.values).toEqual({ name: 'North Loft', description: '' });
  });

  it('names the empty password of the sign-in form', async () => {
    const result = await zodResolver(loginBodySchema)({ email: 'a@example.org', password: '' }, undefined, resolverOptions);
    expect((result.errors as Errors).password?.message).toBe('Enter your password');
  });
});

describe('fieldNameFromPath', () => {
  it('strips the request part the server validated', () => {
    expect(fieldNameFromPath('body.email')).toBe('email');
    expect(fieldNameFromPath('params.studioId')).toBe('studioId');
    expect(fieldNameFromPath('name')).toBe('name');
  });
});

describe('applyFieldErrors', () => {
  it('puts known fields on the form and returns the rest as text, so nothing is lost', () => {
    const setError = vi.fn();
    const unplaced = applyFieldErrors(
      { 'body.email': 'Already invited', 'body.token': 'Expired', 'params.studioId': 'No such studio' },
      ['email', 'role'] as const,
      setError,
    );
    expect(setError).toHaveBeenCalledTimes(1);
    expect(setError).toHaveBeenCalledWith('email', { type: 'server', message: 'Already invited' });
    expect(unplaced).toEqual(['token: Expired', 'studioId: No such studio']);
  });

  it('when there are no field errors, does nothing', () => {
    const setError = vi.fn();
    expect(applyFieldErrors({}, ['email'] as const, setError)).toEqual([]);
    expect(setError).not.toHaveBeenCalled();
  });
});
