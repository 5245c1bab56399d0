import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

import type { OutboxMessage, OutboxResponse as Outbox } from '../../../../../core/contract/outbox';

export type { Outbox, OutboxMessage };

export async function getOutbox(): Promise<Outbox> {
  return api.get<Outbox>('/api/outbox');
}

export const getOutboxQueryOptions = () =>
  queryOptions({ queryKey: ['outbox', 'list'], queryFn: getOutbox });

export const useOutbox = () => useQuery(getOutboxQueryOptions());
