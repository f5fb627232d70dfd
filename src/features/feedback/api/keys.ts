/** Query keys of rubric feedback: all → details() → detail(submissionId). */
export const feedbackKeys = {
  all: ['feedback'] as const,
  details: () => [...feedbackKeys.all, 'detail'] as const,
  detail: (submissionId: number) => [...feedbackKeys.details(), submissionId] as const,
};
