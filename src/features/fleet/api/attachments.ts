import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { accountKeys } from '@/features/accounts/api/accounts';
import { api } from '@/lib/api';
import { postRaw } from './raw-request';
import type { Attachment, AttachmentOwnerType } from './types';

/** Photos and documents the API accepts (it checks the bytes, not the name). */
export const ACCEPTED_FILE_TYPES = 'image/jpeg,image/png,image/webp,application/pdf,.jpg,.jpeg,.png,.webp,.pdf';
export const MAX_FILE_BYTES = 10 * 1024 * 1024;

export const attachmentKeys = {
  all: ['attachments'] as const,
  account: (accountId: number) => [...attachmentKeys.all, 'account', accountId] as const,
};

/** GET /api/accounts/:id/attachments — every file of the account (its planters and installs too), newest first. */
export const accountAttachmentsQueryOptions = (accountId: number) =>
  queryOptions({
    queryKey: attachmentKeys.account(accountId),
    queryFn: ({ signal }) => api.get<{ items: Attachment[] }>(`/api/accounts/${accountId}/attachments`, undefined, signal),
    select: (data) => data.items,
  });

export interface UploadVariables {
  ownerType: AttachmentOwnerType;
  ownerId: number;
  file: File;
}

/** POST /api/attachments (staff who may change the account): multipart ownerType, ownerId, file. */
export function useUploadAttachmentMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ ownerType, ownerId, file }: UploadVariables) => {
      const form = new FormData();
      form.set('ownerType', ownerType);
      form.set('ownerId', String(ownerId));
      form.set('file', file, file.name);
      return postRaw<{ attachment: Attachment }>('/api/attachments', form).then((body) => body.attachment);
    },
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: accountKeys.audit(accountId) });
      return queryClient.invalidateQueries({ queryKey: attachmentKeys.account(accountId) });
    },
  });
}

/** DELETE /api/attachments/:id (staff who may change the account). */
export function useDeleteAttachmentMutation(accountId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/api/attachments/${id}`),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: accountKeys.audit(accountId) });
      return queryClient.invalidateQueries({ queryKey: attachmentKeys.account(accountId) });
    },
  });
}
