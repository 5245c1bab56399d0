import type { DraftConflictDetails, DraftSaved } from '../../../../../core/contract/sheets';
import { ApiError } from '../../../lib/api-client';
import { writeRequest } from './request';
import type { ConflictingDraft, Draft } from './types';

export type SaveResult =
  | { kind: 'saved'; draftVersion: number; updatedAt: string }
  | { kind: 'conflict'; current: ConflictingDraft; message: string };

/**
 * Saves the draft against the version it was loaded at (optimistic concurrency with If-Match).
 * A stale version is not an error for the caller: it returns the server's current draft so the
 * author can choose, and nothing is lost.
 */
export async function saveDraft(
  sheetId: number | string,
  draftVersion: number,
  draft: Draft,
): Promise<SaveResult> {
  try {
    const response = await writeRequest('PUT', `/api/sheets/${sheetId}/draft`, {
      body: JSON.stringify(draft),
      headers: { 'Content-Type': 'application/json', 'If-Match': `"${draftVersion}"` },
    });
    const body = (await response.json()) as DraftSaved;
    return { kind: 'saved', draftVersion: body.draftVersion, updatedAt: body.updatedAt };
  } catch (error) {
    if (error instanceof ApiError && error.status === 409 && error.code === 'DRAFT_CONFLICT') {
      const current = (error.details as Partial<DraftConflictDetails> | undefined)?.current as
        ConflictingDraft | undefined;
      if (current && Array.isArray(current.blocks)) {
        return { kind: 'conflict', current, message: error.message };
      }
    }
    throw error;
  }
}
