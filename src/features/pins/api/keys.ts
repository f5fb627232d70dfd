/** Query keys of pins: all → lists() → list(revisionId) (the pins shown on one revision). */
export const pinKeys = {
  all: ['pins'] as const,
  lists: () => [...pinKeys.all, 'list'] as const,
  list: (revisionId: number) => [...pinKeys.lists(), revisionId] as const,
};
