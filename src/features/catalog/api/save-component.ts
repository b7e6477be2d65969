import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ComponentInput } from '@shared/schemas/fleet';
import { api } from '@/lib/api';
import { catalogKeys, type CatalogComponent } from './components';

export type SaveComponentVariables = { mode: 'create'; input: ComponentInput } | { mode: 'update'; id: number; input: ComponentInput; version: number };

/** POST /api/components or PATCH /api/components/:id with the loaded version (admin and manager). */
export function useSaveComponentMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: SaveComponentVariables) =>
      (v.mode === 'create'
        ? api.post<{ component: CatalogComponent }>('/api/components', v.input)
        : api.patch<{ component: CatalogComponent }>(`/api/components/${v.id}`, { ...v.input, version: v.version })
      ).then((body) => body.component),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogKeys.all }),
  });
}

/** DELETE /api/components/:id (admin and manager); 409 "in_use" while any planter carries it. */
export function useDeleteComponentMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/components/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogKeys.all }),
  });
}
