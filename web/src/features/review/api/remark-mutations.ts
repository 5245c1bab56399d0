// Adding a remark, replying, and closing or reopening one: each refreshes the revision's remarks.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Remark, RemarkType } from './types';

export type NewRemarkInput = { blockId: string; line: number; type: RemarkType; text: string };

export async function createRemark(revisionId: number, input: NewRemarkInput): Promise<Remark> {
  return (await api.post<{ remark: Remark }>(`/api/revisions/${revisionId}/remarks`, input)).remark;
}

export async function replyToRemark(remarkId: number, text: string): Promise<Remark> {
  return (await api.post<{ remark: Remark }>(`/api/remarks/${remarkId}/replies`, { text })).remark;
}

export async function setRemarkState(remarkId: number, state: 'open' | 'closed'): Promise<Remark> {
  return (await api.patch<{ remark: Remark }>(`/api/remarks/${remarkId}`, { state })).remark;
}

export async function editReply(remarkId: number, replyId: number, text: string): Promise<Remark> {
  return (
    await api.patch<{ remark: Remark }>(`/api/remarks/${remarkId}/replies/${replyId}`, { text })
  ).remark;
}

export async function withdrawReply(remarkId: number, replyId: number): Promise<Remark> {
  return (await api.delete<{ remark: Remark }>(`/api/remarks/${remarkId}/replies/${replyId}`))
    .remark;
}

function useRefresh(revisionId: number) {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: ['remarks', 'list', revisionId] }),
      queryClient.invalidateQueries({ queryKey: ['sheets', 'activity'] }),
    ]);
}

export function useCreateRemark(revisionId: number) {
  const refresh = useRefresh(revisionId);
  return useMutation({
    mutationFn: (input: NewRemarkInput) => createRemark(revisionId, input),
    onSuccess: refresh,
  });
}

export function useReplyToRemark(revisionId: number) {
  const refresh = useRefresh(revisionId);
  return useMutation({
    mutationFn: ({ remarkId, text }: { remarkId: number; text: string }) =>
      replyToRemark(remarkId, text),
    onSuccess: refresh,
  });
}

export function useSetRemarkState(revisionId: number) {
  const refresh = useRefresh(revisionId);
  return useMutation({
    mutationFn: ({ remarkId, state }: { remarkId: number; state: 'open' | 'closed' }) =>
      setRemarkState(remarkId, state),
    onSuccess: refresh,
  });
}

/** Edit (with text) or withdraw (without) one's own reply while nobody has acted on it. */
export function useChangeReply(revisionId: number) {
  const refresh = useRefresh(revisionId);
  return useMutation({
    mutationFn: ({
      remarkId,
      replyId,
      text,
    }: {
      remarkId: number;
      replyId: number;
      text?: string;
    }) =>
      text === undefined ? withdrawReply(remarkId, replyId) : editReply(remarkId, replyId, text),
    onSuccess: refresh,
  });
}
