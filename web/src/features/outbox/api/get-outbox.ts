import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type OutboxMessage = {
  id: number;
  to: string[] | string;
  subject: string;
  text: string;
  createdAt: string;
  relatedSheetId: number | null;
};

export async function getOutbox(): Promise<OutboxMessage[]> {
  return (await api.get<{ messages: OutboxMessage[] }>('/api/outbox')).messages;
}

export const getOutboxQueryOptions = () =>
  queryOptions({ queryKey: ['outbox', 'list'], queryFn: getOutbox });

export const useOutbox = () => useQuery(getOutboxQueryOptions());
