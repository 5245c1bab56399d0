import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { CheckRecord, PackageResponse } from '../../../../../core/contract/print';
import type { PrintPackage } from './get-print';

/** The package as the server sends it (the contract's), each part's results read as the engine's. */
export type CalculationPackage = Omit<PackageResponse, 'parts'> & {
  parts: (PrintPackage & { record: CheckRecord })[];
};

/** `revisions`: the ids to bind, or null for the default (the latest sealed of each sheet). */
export async function getPackage(
  projectId: number,
  revisions: readonly number[] | null,
): Promise<CalculationPackage> {
  const query = revisions ? `?revisions=${revisions.join(',')}` : '';
  return api.get<PackageResponse>(
    `/api/projects/${projectId}/package${query}`,
  ) as Promise<CalculationPackage>;
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
