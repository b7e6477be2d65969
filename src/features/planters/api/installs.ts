import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InstallInput } from '@shared/schemas/fleet';
import { accountKeys } from '@/features/accounts/api/accounts';
import type { Install } from '@/features/fleet/api/types';
import { api } from '@/lib/api';
import { planterKeys } from './planters';

/*
 * Installed components of one planter. After any change the planter is fetched again (its drawing
 * and history), and the account's page (install counts, audit trail) is marked stale.
 */

export type SaveInstallVariables = { mode: 'create'; input: InstallInput } | { mode: 'update'; id: number; input: InstallInput; version: number };

function useRefresh(planterId: number, accountId: number) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: accountKeys.detail(accountId) });
    void queryClient.invalidateQueries({ queryKey: planterKeys.lists() });
    return queryClient.invalidateQueries({ queryKey: planterKeys.detail(planterId) });
  };
}

/** POST /api/planters/:id/installs or PUT /api/installs/:id with the loaded version (staff). */
export function useSaveInstallMutation(planterId: number, accountId: number) {
  const refresh = useRefresh(planterId, accountId);
  return useMutation({
    mutationFn: (v: SaveInstallVariables) =>
      (v.mode === 'create'
        ? api.post<{ install: Install }>(`/api/planters/${planterId}/installs`, v.input)
        : api.put<{ install: Install }>(`/api/installs/${v.id}`, { ...v.input, version: v.version })
      ).then((body) => body.install),
    onSuccess: refresh,
  });
}

/** DELETE /api/installs/:id — erases a record made in error (a real removal is "Mark removed"). */
export function useDeleteInstallMutation(planterId: number, accountId: number) {
  const refresh = useRefresh(planterId, accountId);
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/installs/${id}`),
    onSuccess: refresh,
  });
}

/** The install as the API's body, for a PUT that changes only some of it (e.g. marking it removed). */
export function installToInput(install: Install): InstallInput {
  return {
    componentId: install.componentId,
    scope: install.scope,
    toolbarId: install.toolbarId,
    rowFrom: install.rowFrom,
    rowTo: install.rowTo,
    quantity: install.quantity,
    installDate: install.installDate,
    pricePaidUsd: install.pricePaidUsd,
    serialNumbers: install.serialNumbers ?? [],
    workOrder: install.workOrder,
    status: install.status,
    removedDate: install.removedDate,
    removedReason: install.removedReason,
  };
}
