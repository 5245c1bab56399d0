import type { QueryClient } from '@tanstack/react-query';
import { membersQueryKey } from './get-members';

/**
 * A change of membership changes the members table, the project's member count and the
 * person's own roles in the projects list, and writes an activity row.
 */
export function invalidateAfterMembershipChange(queryClient: QueryClient, projectId: number) {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: membersQueryKey(projectId) }),
    queryClient.invalidateQueries({ queryKey: ['projects'] }),
    queryClient.invalidateQueries({ queryKey: ['activity', 'project', projectId] }),
  ]);
}
