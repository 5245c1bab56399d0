import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { PrintPackage } from './get-print';

type Person = { id: number; name: string };

/** One remark of the record of check, with its thread. */
export type RecordRemark = {
  id: number;
  blockId: string;
  line: number;
  type: string;
  text: string;
  state: string;
  author: Person;
  createdAt: string;
  closedBy: Person | null;
  closedAt: string | null;
  carriedFrom: { remarkId: number; revisionNumber: number; line: number } | null;
  replies: { id: number; text: string; author: Person; createdAt: string }[];
};

export type CalculationPackage = {
  firm: { name: string };
  project: { id: number; jobNumber: string; name: string; client: string; site: string };
  sheets: {
    id: number;
    number: string;
    title: string;
    revisions: { id: number; number: number; status: string; sealCode: string | null }[];
    chosenRevisionId: number | null;
  }[];
  parts: (PrintPackage & { record: { revisionId: number; remarks: RecordRemark[] } })[];
  defaultChoice: boolean;
};

/** `revisions`: the ids to bind, or null for the default (the latest sealed of each sheet). */
export async function getPackage(
  projectId: number,
  revisions: readonly number[] | null,
): Promise<CalculationPackage> {
  const query = revisions ? `?revisions=${revisions.join(',')}` : '';
  return api.get<CalculationPackage>(`/api/projects/${projectId}/package${query}`);
}

export const getPackageQueryOptions = (projectId: number, revisions: readonly number[] | null) =>
  queryOptions({
    queryKey: ['projects', 'package', projectId, revisions?.join(',') ?? 'default'],
    queryFn: () => getPackage(projectId, revisions),
  });

export const usePackage = (projectId: number, revisions: readonly number[] | null) =>
  useQuery(getPackageQueryOptions(projectId, revisions));

/** Where the server prints the same package to PDF. */
export function packagePdfHref(projectId: number, revisions: readonly number[]): string {
  return `/api/projects/${projectId}/package/pdf?revisions=${revisions.join(',')}`;
}
