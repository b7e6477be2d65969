import { useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert } from '@/components/ui/form-field';
import { isApiError } from '@/lib/api';

interface ConfirmDeleteDialogProps {
  /** What is being deleted, e.g. "the tractor Big tractor"; null closes the dialog. */
  what: string | null;
  title: string;
  children?: ReactNode;
  confirmLabel?: string;
  onConfirm: () => Promise<unknown>;
  onClose: () => void;
  onDeleted?: () => void;
}

/** Deleting is never one click: this asks first, names the record, and shows why it failed. */
export function ConfirmDeleteDialog({ what, title, children, confirmLabel = 'Delete', onConfirm, onClose, onDeleted }: ConfirmDeleteDialogProps) {
  return (
    <Dialog open={what !== null} onClose={onClose} title={title}>
      {what !== null && <ConfirmBody key={what} what={what} confirmLabel={confirmLabel} onConfirm={onConfirm} onClose={onClose} onDeleted={onDeleted}>{children}</ConfirmBody>}
    </Dialog>
  );
}

function ConfirmBody({ what, children, confirmLabel, onConfirm, onClose, onDeleted }: Omit<ConfirmDeleteDialogProps, 'title' | 'what'> & { what: string; confirmLabel: string }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-4">
      <p>{children ?? `This deletes ${what}. It cannot be undone.`}</p>
      {error && <FormAlert>{error}</FormAlert>}
      <div className="flex flex-wrap gap-3 pt-2">
        <Button
          variant="danger"
          busy={busy}
          onClick={async () => {
            setBusy(true);
            setError(null);
            try {
              await onConfirm();
              onDeleted?.();
              onClose();
            } catch (err) {
              setError(isApiError(err) || err instanceof Error ? err.message : 'It could not be deleted. Try again.');
            } finally {
              setBusy(false);
            }
          }}
        >
          {confirmLabel}
        </Button>
        <Button variant="secondary" onClick={onClose} data-autofocus>
          Keep it
        </Button>
      </div>
    </div>
  );
}
