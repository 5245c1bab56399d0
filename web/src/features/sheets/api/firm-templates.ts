// The firm's template library: list, save a sheet or revision as a template, change or delete
// one, start a sheet from one (/api/firm-templates).
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { sheetsQueryKey } from './get-sheets';
import type { FirmTemplate, SheetSummary } from './types';

const firmTemplatesKey = ['firm-templates', 'list'] as const;

export function getFirmTemplates() {
  return api.get<{ templates: FirmTemplate[] }>('/api/firm-templates');
}

export function getFirmTemplatesQueryOptions() {
  return queryOptions({ queryKey: firmTemplatesKey, queryFn: getFirmTemplates });
}

export function useFirmTemplates() {
  return useQuery(getFirmTemplatesQueryOptions());
}

export type SaveTemplateInput = {
  sheetId: number;
  revisionId?: number;
  name: string;
  description: string;
};

export function useSaveTemplate() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: SaveTemplateInput) =>
      api.post<{ template: FirmTemplate }>('/api/firm-templates', input),
    onSuccess: () => client.invalidateQueries({ queryKey: firmTemplatesKey }),
  });
}

export function useUpdateTemplate(id: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: { name?: string; description?: string }) =>
      api.patch<{ template: FirmTemplate }>(`/api/firm-templates/${id}`, input),
    onSuccess: () => client.invalidateQueries({ queryKey: firmTemplatesKey }),
  });
}

export function useDeleteTemplate(id: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete(`/api/firm-templates/${id}`),
    onSuccess: () => client.invalidateQueries({ queryKey: firmTemplatesKey }),
  });
}

export type StartSheetInput = { number: string; title: string; subject?: string };

export function useStartSheetFromTemplate(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ templateId, ...input }: StartSheetInput & { templateId: number }) =>
      api.post<{ sheet: SheetSummary }>(`/api/firm-templates/${templateId}/sheets`, {
        ...input,
        projectId,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: sheetsQueryKey(projectId) }),
  });
}
