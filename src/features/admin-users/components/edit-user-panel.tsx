import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, TextField } from '@/components/ui/form-field';
import { isApiError } from '@/lib/api';
import { useUpdateUserMutation } from '../api/update-user';
import type { AdminUser } from '../api/users';
import { applyServerFieldErrors, checkScope, scopeFieldsSchema, scopeForRequest, ScopeFields } from './user-form-fields';

const editUserFormSchema = scopeFieldsSchema
  .extend({ name: z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters') })
  .superRefine(checkScope);

type EditUserValues = z.input<typeof editUserFormSchema>;
const fieldNames = ['name', 'role', 'territoryIds', 'accountId'] as const;

interface EditUserPanelProps {
  user: AdminUser | null;
  isSelf: boolean;
  onClose: () => void;
  onSaved: (user: AdminUser) => void;
}

export function EditUserPanel({ user, isSelf, onClose, onSaved }: EditUserPanelProps) {
  return (
    <Dialog open={user !== null} onClose={onClose} variant="panel" title={user ? `Edit ${user.name}` : 'Edit user'} description={user?.email}>
      {user && <EditUserForm key={user.id} user={user} isSelf={isSelf} onCancel={onClose} onSaved={onSaved} />}
    </Dialog>
  );
}

function EditUserForm({ user, isSelf, onCancel, onSaved }: { user: AdminUser; isSelf: boolean; onCancel: () => void; onSaved: (user: AdminUser) => void }) {
  const updateUser = useUpdateUserMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<EditUserValues>({
    resolver: zodResolver(editUserFormSchema),
    defaultValues: {
      name: user.name,
      role: user.role,
      territoryIds: user.territoryIds,
      accountId: user.accountId === null ? '' : String(user.accountId),
    },
  });
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isDirty },
  } = form;

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const scope = scopeForRequest(values);
    updateUser.mutate(
      // Your own role is not sent: the field is locked for you.
      { id: user.id, changes: { name: values.name.trim(), ...scope, role: isSelf ? undefined : scope.role } },
      {
        onSuccess: ({ user: saved }) => onSaved(saved),
        onError: (error) => {
          if (isApiError(error) && error.status === 400) {
            const unplaced = applyServerFieldErrors(error, fieldNames, setError);
            if (unplaced.length > 0 || Object.keys(error.fields).length === 0) setFormError(unplaced.join(' ') || error.message);
            return;
          }
          setFormError(error.message);
        },
      },
    );
  });

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label={`Edit ${user.name}`}>
        {formError && <FormAlert>{formError}</FormAlert>}
        <TextField label="Name" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
        <ScopeFields roleLocked={isSelf} />
        <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-5">
          <Button type="submit" busy={updateUser.isPending} disabled={!isDirty}>
            {updateUser.isPending ? 'Saving…' : 'Save changes'}
          </Button>
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
