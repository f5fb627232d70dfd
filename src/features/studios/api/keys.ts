/**
 * Query keys of the studios feature, one hierarchy so a prefix invalidates everything below it:
 * all → lists() → list(filters); all → details() → detail(id) → members / invitations.
 */
export type StudioListFilters = Record<string, never>;

export const studioKeys = {
  all: ['studios'] as const,
  lists: () => [...studioKeys.all, 'list'] as const,
  list: (filters: StudioListFilters = {}) => [...studioKeys.lists(), filters] as const,
  details: () => [...studioKeys.all, 'detail'] as const,
  detail: (studioId: number) => [...studioKeys.details(), studioId] as const,
  members: (studioId: number) => [...studioKeys.detail(studioId), 'members'] as const,
  invitations: (studioId: number) => [...studioKeys.detail(studioId), 'invitations'] as const,
};
