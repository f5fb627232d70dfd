/**
 * Query keys of revisions and submissions:
 * all → details() → detail(revisionId) → audit; all → submissions() → submission(id) → history.
 */
export const revisionKeys = {
  all: ['revisions'] as const,
  details: () => [...revisionKeys.all, 'detail'] as const,
  detail: (revisionId: number) => [...revisionKeys.details(), revisionId] as const,
  audit: (revisionId: number) => [...revisionKeys.detail(revisionId), 'audit'] as const,
  submissions: () => [...revisionKeys.all, 'submission'] as const,
  submission: (submissionId: number) => [...revisionKeys.submissions(), submissionId] as const,
  history: (submissionId: number) => [...revisionKeys.submission(submissionId), 'history'] as const,
};
