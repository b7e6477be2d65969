import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, TextField } from '@/components/ui/form-field';
import { isApiError } from '@/lib/api';
import { useCreateUserMutation } from '../api/create-user';
import type { AdminUser } from '../api/users';
import { applyServerFieldErrors, checkScope, scopeFieldsSchema, scopeForRequest, ScopeFields } from './user-form-fields';

const createUserFormSchema = scopeFieldsSchema
  .extend({
    email: z.string().trim().min(1, 'Enter an e-mail address').pipe(z.email('Enter a valid e-mail address, like name@example.com')),
    name: z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
    password: z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters'),
  })
  .superRefine(checkScope);

type CreateUserValues = z.input<typeof createUserFormSchema>;
const fieldNames = ['email', 'name', 'role', 'password', 'territoryIds', 'accountId'] as const;

const emptyValues: CreateUserValues = { email: '', name: '', role: 'specialist', password: '', territoryIds: [], accountId: '' };

export function CreateUserPanel({ open, onClose, onCreated }: { open: boolean; onClose: () => void; onCreated: (user: AdminUser) => void }) {
  return (
    <Dialog open={open} onClose={onClose} variant="panel" title="Add a user" description="They sign in with this e-mail and password.">
      {/* Mounted only while open, so every opening starts with an empty form. */}
      {open && <CreateUserForm onCancel={onClose} onCreated={onCreated} />}
    </Dialog>
  );
}

function CreateUserForm({ onCancel, onCreated }: { onCancel: () => void; onCreated: (user: AdminUser) => void }) {
  const createUser = useCreateUserMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<CreateUserValues>({ resolver: zodResolver(createUserFormSchema), defaultValues: emptyValues });
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = form;

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    createUser.mutate(
      { email: values.email.trim().toLowerCase(), name: values.name.trim(), password: values.password, ...scopeForRequest(values) },
      {
        onSuccess: ({ user }) => onCreated(user),
        onError: (error) => {
          if (isApiError(error) && (error.status === 400 || error.status === 409)) {
            const unplaced = applyServerFieldErrors(error, fieldNames, setError);
            if (unplaced.length > 0 || (error.status === 400 && Object.keys(error.fields).length === 0)) {
              setFormError(unplaced.join(' ') || error.message);
            }
            return;
          }
          setFormError(error.message);
        },
      },
    );
  });

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Add a user">
        {formError && <FormAlert>{formError}</FormAlert>}
        <TextField label="Name" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
        <TextField
          label="E-mail"
          type="email"
          inputMode="email"
          autoComplete="off"
          spellCheck={false}
          error={errors.email?.message}
          {...register('email')}
        />
        <TextField
          label="Password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters. Share it with them in person or by phone, not by e-mail."
          error={errors.password?.message}
          {...register('password')}
        />
        <ScopeFields />
        <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-5">
          <Button type="submit" busy={createUser.isPending}>
            {createUser.isPending ? 'Adding…' : 'Add user'}
          </Button>
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
