/**
 * Query keys of pin-up sessions: all → lists() → list(briefId); all → details() → detail(pinupId).
 * Changing a session invalidates its detail and every brief's list (a prefix covers them).
 */
export const pinupKeys = {
  all: ['pinups'] as const,
  lists: () => [...pinupKeys.all, 'list'] as const,
  list: (briefId: number) => [...pinupKeys.lists(), { briefId }] as const,
  details: () => [...pinupKeys.all, 'detail'] as const,
  detail: (pinupId: number) => [...pinupKeys.details(), pinupId] as const,
};
