import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type OutboxMessage = {
  id: number;
  to: string[] | string;
  subject: string;
  text: string;
  createdAt: string;
  relatedSheetId: number | null;
  relatedProjectId: number | null;
};

export type Outbox = {
  /** `all` for an administrator; `mine` for everyone else (the mail addressed to them). */
  scope: 'all' | 'mine';
  messages: OutboxMessage[];
};

export async function getOutbox(): Promise<Outbox> {
  return api.get<Outbox>('/api/outbox');
}

export const getOutboxQueryOptions = () =>
  queryOptions({ queryKey: ['outbox', 'list'], queryFn: getOutbox });

export const useOutbox = () => useQuery(getOutboxQueryOptions());
