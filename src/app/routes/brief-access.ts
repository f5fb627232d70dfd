import type { QueryClient } from '@tanstack/react-query';
import { meQueryOptions } from '../../features/auth/api/get-me.js';
import { studioQueryOptions } from '../../features/studios/api/get-studio.js';

/**
 * Briefs are written by the studio's instructors (and admins). The server refuses anyone else;
 * this answers the screen with the same refusal before showing a form that could not be saved.
 */
export async function requireBriefWriter(queryClient: QueryClient, studioId: number): Promise<void> {
  const [studio, me] = await Promise.all([queryClient.ensureQueryData(studioQueryOptions(studioId)), queryClient.ensureQueryData(meQueryOptions())]);
  if (studio.myRole !== 'instructor' && me?.globalRole !== 'admin') {
    throw new Response('Only the instructors of this studio write and change its briefs.', { status: 403, statusText: 'Forbidden' });
  }
}
