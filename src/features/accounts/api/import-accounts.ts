import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AccountExportQuery, ImportReport } from '@shared/schemas/csv';
import { buildQueryString } from '@/lib/api';
import { postRaw } from '@/features/fleet/api/raw-request';
import { accountKeys } from './accounts';

export type { ImportReport };

/**
 * POST /api/imports/accounts?mode=preview|commit with the CSV as text/csv. A preview writes
 * nothing and reports every bad line; a commit imports the whole file or nothing (400 with the
 * same line list if anything is wrong).
 */
export function useImportAccountsMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ csv, mode }: { csv: string; mode: 'preview' | 'commit' }) =>
      postRaw<ImportReport>(`/api/imports/accounts?mode=${mode}`, new Blob([csv], { type: 'text/csv' }), 'text/csv'),
    onSuccess: (report) => {
      if (report.committed) return queryClient.invalidateQueries({ queryKey: accountKeys.lists() });
    },
  });
}

/** The export's address with the list's current search, territory and sort (a plain download link). */
export function accountsExportHref(filters: Partial<AccountExportQuery>): string {
  return `/api/accounts/export.csv${buildQueryString({ q: filters.q, territoryId: filters.territoryId, sort: filters.sort, status: filters.status })}`;
}
