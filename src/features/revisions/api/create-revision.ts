import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionDetail } from '../../../../shared/api/revisions.js';
import { api, type UploadProgress } from '../../../lib/api-client.js';
import { revisionKeys } from './keys.js';

/**
 * `POST /api/briefs/:briefId/revisions` as multipart/form-data, reporting upload progress.
 * The caller builds the form (design file, or group/families/motifs with their outline files).
 */
export function createRevision(briefId: number, form: FormData, onProgress?: (p: UploadProgress) => void, signal?: AbortSignal): Promise<RevisionDetail> {
  return api.upload<RevisionDetail>(`/api/briefs/${briefId}/revisions`, form, { onProgress, signal });
}

export function useCreateRevision(briefId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ form, onProgress, signal }: { form: FormData; onProgress?: (p: UploadProgress) => void; signal?: AbortSignal }) =>
      createRevision(briefId, form, onProgress, signal),
    onSuccess: (revision) => {
      queryClient.setQueryData(revisionKeys.detail(revision.id), revision);
      return queryClient.invalidateQueries({ queryKey: revisionKeys.submissions() });
    },
  });
}
