/**
 * Query keys of briefs: all → lists() → list(studioId); all → details() → detail(briefId) → changes.
 */
export const briefKeys = {
  all: ['briefs'] as const,
  lists: () => [...briefKeys.all, 'list'] as const,
  list: (studioId: number) => [...briefKeys.lists(), { studioId }] as const,
  details: () => [...briefKeys.all, 'detail'] as const,
  detail: (briefId: number) => [...briefKeys.details(), briefId] as const,
  changes: (briefId: number) => [...briefKeys.detail(briefId), 'changes'] as const,
};
