import { useQueryClient } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { accountKeys } from '@/features/accounts/api/accounts';
import { useDeleteAccountChildMutation, type ChildSegment } from '../api/account-children';
import { ConfirmDeleteDialog } from './confirm-delete-dialog';

/*
 * What the contacts, farm sites and tractors sections share: which record is open in the form
 * panel, which one is waiting for a delete confirmation, and the per-record Edit / Delete buttons.
 */

export type Editing<T> = { mode: 'create' } | { mode: 'update'; record: T } | null;

export function useChildSection<T extends { id: number }>(segment: ChildSegment, accountId: number) {
  const [editing, setEditing] = useState<Editing<T>>(null);
  const [deleting, setDeleting] = useState<T | null>(null);
  const remove = useDeleteAccountChildMutation(segment, accountId);
  const queryClient = useQueryClient();
  const reload = () => queryClient.invalidateQueries({ queryKey: accountKeys.detail(accountId) });
  return { editing, setEditing, deleting, setDeleting, remove, reload };
}

export function RecordActions({ name, onEdit, onDelete }: { name: string; onEdit: () => void; onDelete: () => void }) {
  return (
    <div className="flex shrink-0 gap-1">
      <Button variant="ghost" className="px-3" onClick={onEdit}>
        Edit<span className="sr-only"> {name}</span>
      </Button>
      <Button variant="ghost" className="px-3 text-brick-700 hover:bg-brick-50" onClick={onDelete}>
        Delete<span className="sr-only"> {name}</span>
      </Button>
    </div>
  );
}

export function ChildFormPanel({ open, title, description, onClose, children }: { open: boolean; title: string; description?: string; onClose: () => void; children: ReactNode }) {
  return (
    <Dialog open={open} onClose={onClose} variant="panel" title={title} description={description}>
      {open && children}
    </Dialog>
  );
}

export function DeleteChildDialog<T extends { id: number; name: string }>({
  kind,
  record,
  onClose,
  remove,
  children,
}: {
  kind: string;
  record: T | null;
  onClose: () => void;
  remove: ReturnType<typeof useDeleteAccountChildMutation>;
  children?: ReactNode;
}) {
  return (
    <ConfirmDeleteDialog
      what={record ? `the ${kind} ${record.name}` : null}
      title={record ? `Delete the ${kind} ${record.name}?` : ''}
      onConfirm={() => remove.mutateAsync(record!.id)}
      onClose={onClose}
    >
      {children}
    </ConfirmDeleteDialog>
  );
}
