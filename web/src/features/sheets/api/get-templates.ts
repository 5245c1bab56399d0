import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { SheetTemplate } from './types';

export function getTemplatesQueryOptions() {
  return queryOptions({
    queryKey: ['sheets', 'templates'],
    queryFn: () => api.get<{ templates: SheetTemplate[] }>('/api/sheet-templates'),
    staleTime: Infinity,
  });
}

export function useTemplates() {
  return useQuery(getTemplatesQueryOptions());
}
