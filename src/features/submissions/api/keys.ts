import type { SubmissionsQuery } from '../../../../shared/api/briefs.js';

/** Query keys of the instructor's submissions table: all → lists() → list(briefId, filters). */
export const submissionKeys = {
  all: ['submissions'] as const,
  lists: () => [...submissionKeys.all, 'list'] as const,
  list: (briefId: number, filters: SubmissionsQuery = {}) => [...submissionKeys.lists(), briefId, filters] as const,
};
