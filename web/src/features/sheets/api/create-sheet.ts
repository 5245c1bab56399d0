import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { sheetsQueryKey } from './get-sheets';
import type { SheetSummary } from './types';

export type CreateSheetInput = {
  number: string;
  title: string;
  subject?: string;
  template: string;
};

export function createSheet(projectId: number, input: CreateSheetInput) {
  return api.post<{ sheet: SheetSummary }>(`/api/projects/${projectId}/sheets`, input);
}

export function useCreateSheet(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSheetInput) => createSheet(projectId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: sheetsQueryKey(projectId) }),
  });
}
