import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ContactInput, FarmSiteInput, TractorInput } from '@shared/schemas/fleet';
import { accountKeys } from '@/features/accounts/api/accounts';
import { api } from '@/lib/api';
import type { Contact, FarmSite, Tractor } from './types';

/*
 * Contacts, farm sites and tractors share one API shape: POST /api/accounts/:id/<segment> to add,
 * PATCH /api/<segment>/:id with the loaded version to change, DELETE /api/<segment>/:id. Every
 * change refreshes the account (its lists) and its audit trail.
 */

interface ChildKinds {
  contacts: { input: ContactInput; record: Contact; key: 'contact' };
  'farm-sites': { input: FarmSiteInput; record: FarmSite; key: 'farmSite' };
  tractors: { input: TractorInput; record: Tractor; key: 'tractor' };
}
export type ChildSegment = keyof ChildKinds;

const responseKey: { [K in ChildSegment]: ChildKinds[K]['key'] } = { contacts: 'contact', 'farm-sites': 'farmSite', tractors: 'tractor' };

export type SaveChildVariables<K extends ChildSegment> =
  | { mode: 'create'; input: ChildKinds[K]['input'] }
  | { mode: 'update'; id: number; input: ChildKinds[K]['input']; version: number };

export function saveAccountChild<K extends ChildSegment>(segment: K, accountId: number, variables: SaveChildVariables<K>): Promise<ChildKinds[K]['record']> {
  const request =
    variables.mode === 'create'
      ? api.post<Record<string, ChildKinds[K]['record']>>(`/api/accounts/${accountId}/${segment}`, variables.input)
      : api.patch<Record<string, ChildKinds[K]['record']>>(`/api/${segment}/${variables.id}`, { ...variables.input, version: variables.version });
  return request.then((body) => body[responseKey[segment]]);
}

export function useSaveAccountChildMutation<K extends ChildSegment>(segment: K, accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (variables: SaveChildVariables<K>) => saveAccountChild(segment, accountId, variables),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: accountKeys.detail(accountId) }),
  });
}

export function useDeleteAccountChildMutation(segment: ChildSegment, accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/${segment}/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: accountKeys.detail(accountId) }),
  });
}
