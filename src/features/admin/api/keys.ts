/**
 * Query keys of the admin feature. Two resources, each all → lists() → list(filters) → detail(id),
 * under one `admin` prefix.
 */
export type AdminListFilters = Record<string, never>;

export const adminKeys = {
  all: ['admin'] as const,
  users: () => [...adminKeys.all, 'users'] as const,
  userLists: () => [...adminKeys.users(), 'list'] as const,
  userList: (filters: AdminListFilters = {}) => [...adminKeys.userLists(), filters] as const,
  outbox: () => [...adminKeys.all, 'outbox'] as const,
  mailLists: () => [...adminKeys.outbox(), 'list'] as const,
  mailList: (filters: AdminListFilters = {}) => [...adminKeys.mailLists(), filters] as const,
  mails: () => [...adminKeys.outbox(), 'detail'] as const,
  mail: (id: number) => [...adminKeys.mails(), id] as const,
};
