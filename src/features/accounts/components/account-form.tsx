import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { accountSchema, accountStatuses, crops, type AccountInput } from '@shared/schemas/accounts';
import { SelectField, TextField } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { adminUsersQueryOptions } from '@/features/admin-users/api/users';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { FieldGroup, FormButtons, SaveErrorAlert, TextAreaField } from '@/features/fleet/components/form-bits';
import { asText, numberOrNull, sharedResolver, textOrNull } from '@/features/fleet/lib/forms';
import { cropLabels } from '@/features/fleet/lib/labels';
import { useSaveError } from '@/features/fleet/lib/use-save-error';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { accountListQueryOptions, accountStatusLabels, type AccountDetail } from '../api/accounts';

type Crop = (typeof crops)[number];

export interface AccountFormValues {
  name: string;
  status: string;
  territoryId: string;
  specialistId: string;
  address: string;
  town: string;
  state: string;
  lat: string;
  lng: string;
  /** Same name as the API field, so client and server messages land on the same box. */
  acresByCrop: Record<Crop, string>;
  notes: string;
}

const fields = ['name', 'status', 'territoryId', 'specialistId', 'address', 'town', 'state', 'lat', 'lng', 'acresByCrop', 'notes'] as const;

function toBody(v: AccountFormValues) {
  const acresByCrop: Partial<Record<Crop, number>> = {};
  for (const crop of crops) {
    const value = numberOrNull(v.acresByCrop?.[crop]);
    if (value !== null) acresByCrop[crop] = value;
  }
  return {
    name: v.name,
    status: v.status,
    territoryId: v.territoryId ? Number(v.territoryId) : undefined,
    specialistId: v.specialistId ? Number(v.specialistId) : null,
    address: textOrNull(v.address),
    town: textOrNull(v.town),
    state: textOrNull(v.state),
    lat: numberOrNull(v.lat),
    lng: numberOrNull(v.lng),
    acresByCrop,
    notes: textOrNull(v.notes),
  };
}
const resolver = sharedResolver<AccountFormValues, AccountInput>(accountSchema, toBody);

export function accountFormDefaults(account: AccountDetail | null, territoryId?: number): AccountFormValues {
  return {
    name: account?.name ?? '',
    status: account?.status ?? 'active',
    territoryId: asText(account?.territoryId ?? territoryId),
    specialistId: asText(account?.specialistId),
    address: account?.address ?? '',
    town: account?.town ?? '',
    state: account?.state ?? '',
    lat: asText(account?.lat),
    lng: asText(account?.lng),
    acresByCrop: Object.fromEntries(crops.map((c) => [c, asText(account?.acresByCrop?.[c])])) as Record<Crop, string>,
    notes: account?.notes ?? '',
  };
}

/**
 * Who can be assigned. Administrators see every specialist of the territory (the user list);
 * others see themselves (a specialist), the specialists already serving accounts there, and the
 * account's current one. Rowpath has no staff directory for non-admins yet.
 */
function useSpecialistOptions(territoryId: number | null, current: { id: number | null; name: string | null }) {
  const me = useCurrentUser();
  const admin = me.role === 'admin';
  const users = useQuery({ ...adminUsersQueryOptions(), enabled: admin });
  const accounts = useQuery({
    ...accountListQueryOptions({ page: 1, pageSize: 200, sort: 'name', territoryId: territoryId ?? undefined }),
    enabled: !admin && territoryId !== null,
  });
  return useMemo(() => {
    const found = new Map<number, string>();
    if (admin) {
      for (const u of users.data ?? []) if (u.role === 'specialist' && !u.disabled && territoryId !== null && u.territoryIds.includes(territoryId)) found.set(u.id, u.name);
    } else {
      if (me.role === 'specialist' && territoryId !== null && me.territoryIds.includes(territoryId)) found.set(me.id, `${me.name} (you)`);
      for (const a of accounts.data?.items ?? []) if (a.specialistId && a.specialistName && !found.has(a.specialistId)) found.set(a.specialistId, a.specialistName);
    }
    if (current.id && !found.has(current.id)) found.set(current.id, current.name ?? `Specialist #${current.id}`);
    return {
      loading: admin ? users.isPending : accounts.isFetching && !accounts.data,
      options: [{ value: '', label: 'Unassigned' }, ...[...found].sort((a, b) => a[1].localeCompare(b[1])).map(([id, name]) => ({ value: String(id), label: name }))],
    };
  }, [admin, users.data, users.isPending, accounts.data, accounts.isFetching, me, territoryId, current.id, current.name]);
}

interface AccountFormProps {
  account: AccountDetail | null;
  busy: boolean;
  onSubmit: (input: AccountInput, handleError: (error: unknown) => void) => void;
  onCancel: () => void;
  onReload?: () => void;
}

/** The account's own fields, for "Add an account" and "Edit account details" alike. */
export function AccountForm({ account, busy, onSubmit, onCancel, onReload }: AccountFormProps) {
  const me = useCurrentUser();
  const territories = useQuery(territoriesQueryOptions());
  const onlyTerritory = territories.data?.length === 1 ? territories.data[0].id : undefined;
  const form = useForm<AccountFormValues, unknown, AccountInput>({
    resolver,
    defaultValues: accountFormDefaults(account, onlyTerritory ?? (me.territoryIds.length === 1 ? me.territoryIds[0] : undefined)),
  });
  const { register, handleSubmit, setError, watch, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);
  const territoryId = watch('territoryId');
  const specialists = useSpecialistOptions(territoryId ? Number(territoryId) : null, { id: account?.specialistId ?? null, name: account?.specialistName ?? null });
  const acresErrors = errors.acresByCrop as (Partial<Record<Crop, { message?: string }>> & { message?: string }) | undefined;

  const submit = handleSubmit((input) => {
    clearSaveError();
    onSubmit(input, handleSaveError);
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label={account ? `Edit ${account.name}` : 'Add an account'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      <TextField label="Operation name" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField label="Status" options={accountStatuses.map((s) => ({ value: s, label: accountStatusLabels[s] }))} error={errors.status?.message} {...register('status')} />
        {territories.isPending ? (
          <LoadingBlock label="Loading territories…" />
        ) : (
          <SelectField
            label="Territory"
            options={[{ value: '', label: 'Choose a territory' }, ...(territories.data ?? []).map((t) => ({ value: String(t.id), label: t.name }))]}
            error={errors.territoryId?.message ?? (territories.isError ? `Territories could not be loaded: ${territories.error.message}` : undefined)}
            {...register('territoryId')}
          />
        )}
      </div>
      <SelectField
        label="Planting specialist"
        options={specialists.options}
        hint={specialists.loading ? 'Loading specialists…' : 'The specialist who looks after this operation.'}
        error={errors.specialistId?.message}
        {...register('specialistId')}
      />
      <TextField label="Address" autoComplete="off" error={errors.address?.message} {...register('address')} />
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <TextField label="Town" autoComplete="off" error={errors.town?.message} {...register('town')} />
        <TextField label="State" hint="Two letters, e.g. KS" autoComplete="off" maxLength={2} error={errors.state?.message} {...register('state')} />
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Farm office latitude (°)" inputMode="decimal" autoComplete="off" error={errors.lat?.message} {...register('lat')} />
        <TextField label="Farm office longitude (°)" inputMode="decimal" autoComplete="off" hint="West is negative" error={errors.lng?.message} {...register('lng')} />
      </div>
      <FieldGroup legend="Acres by crop (a year)">
        {acresErrors?.message && <p className="mb-2 text-sm font-semibold text-brick-700">{acresErrors.message}</p>}
        <div className="grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-3">
          {crops.map((crop) => (
            <TextField key={crop} label={`${cropLabels[crop]} (ac)`} inputMode="decimal" autoComplete="off" error={acresErrors?.[crop]?.message} {...register(`acresByCrop.${crop}`)} />
          ))}
        </div>
      </FieldGroup>
      <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
      <FormButtons busy={busy} busyLabel="Saving…" label={account ? 'Save account' : 'Add account'} onCancel={onCancel} />
    </form>
  );
}
