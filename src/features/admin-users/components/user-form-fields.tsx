import { useQuery } from '@tanstack/react-query';
import { Controller, useFormContext } from 'react-hook-form';
import { z } from 'zod';
import { CheckboxGroup, SelectField, TextField } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { roleLabels, roles, type Role } from '@/features/auth/api/roles';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import type { ApiError } from '@/lib/api';

/*
 * What a user may see depends on the role: managers and specialists get territories, a grower is
 * linked to one farm account, admins see everything. The form asks only for what the role uses.
 */

export const roleOptions = roles.map((role) => ({ value: role, label: roleLabels[role] }));

export const scopeFieldsSchema = z.object({
  role: z.enum(roles, { error: 'Choose a role' }),
  territoryIds: z.array(z.number()),
  // Typed as text in the form; checked and turned into a number on submit.
  accountId: z.string().trim(),
});

type ScopeValues = z.infer<typeof scopeFieldsSchema>;

export function checkScope(values: ScopeValues, ctx: z.RefinementCtx): void {
  if (values.role === 'grower' && !/^[1-9]\d{0,8}$/.test(values.accountId)) {
    ctx.addIssue({ code: 'custom', path: ['accountId'], message: "Enter the grower's account number (digits only)" });
  }
  if ((values.role === 'manager' || values.role === 'specialist') && values.territoryIds.length === 0) {
    ctx.addIssue({ code: 'custom', path: ['territoryIds'], message: 'Choose at least one territory' });
  }
}

/** The request body's scope: territories only for managers and specialists, the account only for growers. */
export function scopeForRequest(values: ScopeValues): { role: Role; territoryIds: number[]; accountId: number | null } {
  return {
    role: values.role,
    territoryIds: values.role === 'manager' || values.role === 'specialist' ? values.territoryIds : [],
    accountId: values.role === 'grower' ? Number(values.accountId) : null,
  };
}

/**
 * Puts a 400's details.fields (and a 409 on the e-mail) onto the form's fields. Returns the
 * messages that match no field, for the form-level alert.
 */
export function applyServerFieldErrors<T extends string>(
  error: ApiError,
  known: readonly T[],
  setError: (name: T, error: { type: string; message: string }, options?: { shouldFocus: boolean }) => void,
): string[] {
  const unplaced: string[] = [];
  let first = true;
  for (const [path, message] of Object.entries(error.fields)) {
    const field = path.split('.')[0] as T;
    if (known.includes(field)) {
      setError(field, { type: 'server', message }, { shouldFocus: first });
      first = false;
    } else {
      unplaced.push(message);
    }
  }
  if (error.status === 409 && known.includes('email' as T)) {
    setError('email' as T, { type: 'server', message: error.message || 'That e-mail address is already in use' }, { shouldFocus: true });
  }
  return unplaced;
}

interface ScopeFieldsProps {
  /** An admin cannot change their own role (it would lock them out of this page). */
  roleLocked?: boolean;
}

/** Role, territories and grower account; used inside a <FormProvider> whose values include ScopeValues. */
export function ScopeFields({ roleLocked = false }: ScopeFieldsProps) {
  const {
    control,
    register,
    watch,
    formState: { errors },
  } = useFormContext<ScopeValues>();
  const role = watch('role');
  const territories = useQuery(territoriesQueryOptions());
  const usesTerritories = role === 'manager' || role === 'specialist';

  return (
    <>
      {roleLocked ? (
        // Shown, not a disabled select: a disabled field would drop out of the form's values.
        <div>
          <p className="mb-1 font-semibold text-ink-900">Role</p>
          <p className="text-ink-950">{roleLabels[role]}</p>
          <p className="mt-1 text-sm text-loam-700">You cannot change your own role.</p>
        </div>
      ) : (
        <SelectField label="Role" options={roleOptions} error={errors.role?.message} {...register('role')} />
      )}

      {usesTerritories &&
        (territories.isPending ? (
          <LoadingBlock label="Loading territories…" />
        ) : territories.isError ? (
          <p role="alert" className="font-semibold text-brick-700">
            Territories could not be loaded: {territories.error.message}
          </p>
        ) : (
          <Controller
            control={control}
            name="territoryIds"
            render={({ field }) => (
              <CheckboxGroup
                ref={field.ref}
                legend="Territories"
                hint={role === 'manager' ? 'The territories this manager answers for.' : "The specialist's territory."}
                error={errors.territoryIds?.message}
                options={territories.data.map((t) => ({ value: t.id, label: t.name, description: t.region }))}
                value={field.value as number[]}
                onChange={field.onChange}
                onBlur={field.onBlur}
                emptyText="No territories exist yet."
              />
            )}
          />
        ))}

      {role === 'grower' && (
        <TextField
          label="Grower's account number"
          inputMode="numeric"
          autoComplete="off"
          hint="Shown on the account's page as “Account #…”."
          error={errors.accountId?.message}
          {...register('accountId')}
        />
      )}

      {role === 'admin' && <p className="text-loam-700">Administrators see every territory and account.</p>}
    </>
  );
}
