import { describe, expect, it } from 'vitest';
import { QueryClient } from '@tanstack/react-query';
import { adminKeys } from '../../src/features/admin/api/keys.js';
import { studioKeys } from '../../src/features/studios/api/keys.js';

function seeded() {
  const client = new QueryClient();
  client.setQueryData(studioKeys.list(), []);
  client.setQueryData(studioKeys.detail(1), { id: 1 });
  client.setQueryData(studioKeys.members(1), []);
  client.setQueryData(studioKeys.invitations(1), []);
  client.setQueryData(studioKeys.members(2), []);
  return client;
}

const invalid = (client: QueryClient, key: readonly unknown[]) => client.getQueryState(key)?.isInvalidated ?? false;

describe('studioKeys', () => {
  it('when one studio is invalidated, its members and invitations go stale and other studios and lists do not', async () => {
    const client = seeded();
    await client.invalidateQueries({ queryKey: studioKeys.detail(1) });
    expect(invalid(client, studioKeys.detail(1))).toBe(true);
    expect(invalid(client, studioKeys.members(1))).toBe(true);
    expect(invalid(client, studioKeys.invitations(1))).toBe(true);
    expect(invalid(client, studioKeys.members(2))).toBe(false);
    expect(invalid(client, studioKeys.list())).toBe(false);
  });

  it('when lists are invalidated, details stay fresh', async () => {
    const client = seeded();
    await client.invalidateQueries({ queryKey: studioKeys.lists() });
    expect(invalid(client, studioKeys.list())).toBe(true);
    expect(invalid(client, studioKeys.detail(1))).toBe(false);
  });

  it('invalidating the feature prefix reaches everything in it', async () => {
    const client = seeded();
    await client.invalidateQueries({ queryKey: studioKeys.all });
    for (const key of [studioKeys.list(), studioKeys.detail(1), studioKeys.members(2)]) expect(invalid(client, key)).toBe(true);
  });
});

describe('adminKeys', () => {
  it('keeps users and the outbox apart under one prefix', async () => {
    const client = new QueryClient();
    client.setQueryData(adminKeys.userList(), []);
    client.setQueryData(adminKeys.mailList(), []);
    client.setQueryData(adminKeys.mail(4), { id: 4 });
    await client.invalidateQueries({ queryKey: adminKeys.users() });
    expect(invalid(client, adminKeys.userList())).toBe(true);
    expect(invalid(client, adminKeys.mailList())).toBe(false);
    await client.invalidateQueries({ queryKey: adminKeys.outbox() });
    expect(invalid(client, adminKeys.mail(4))).toBe(true);
  });
});
