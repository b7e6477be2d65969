import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { installSchema, type InstallInput, type InstallScope } from '@shared/schemas/fleet';
import { ErrorMark, SelectField, TextField, inputClasses } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { catalogPickerQueryOptions } from '@/features/catalog/api/components';
import type { CatalogComponent, Install, PlanterDetail } from '@/features/fleet/api/types';
import { FormButtons, SaveErrorAlert, TextAreaField } from '@/features/fleet/components/form-bits';
import { asText, numberOrNull, sharedResolver, textOrNull } from '@/features/fleet/lib/forms';
import { categoryLabels, categoryOrder, formatUsd, scopeLabels, todayIso, unitLabels } from '@/features/fleet/lib/labels';
import { useSaveError } from '@/features/fleet/lib/use-save-error';
import { useSaveInstallMutation } from '../api/installs';
import type { PanelTarget } from './planter-drawing';

interface InstallFormValues {
  componentId: string;
  scope: string;
  toolbarId: string;
  rowFrom: string;
  rowTo: string;
  quantity: string;
  installDate: string;
  pricePaidUsd: string;
  serialNumbers: string;
  workOrder: string;
  status: string;
  removedDate: string;
  removedReason: string;
}

const fields = ['componentId', 'scope', 'toolbarId', 'rowFrom', 'rowTo', 'quantity', 'installDate', 'pricePaidUsd', 'serialNumbers', 'workOrder', 'status', 'removedDate', 'removedReason'] as const;

/** Serial numbers typed one a line (or separated by commas). */
export const parseSerials = (text: string) =>
  text
    .split(/[\n,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);

const toBody = (v: InstallFormValues) => ({
  componentId: v.componentId ? Number(v.componentId) : undefined,
  scope: v.scope || undefined,
  toolbarId: v.scope === 'toolbar' && v.toolbarId ? Number(v.toolbarId) : null,
  rowFrom: v.scope === 'rows' ? numberOrNull(v.rowFrom) : null,
  rowTo: v.scope === 'rows' ? numberOrNull(v.rowTo) : null,
  quantity: numberOrNull(v.quantity),
  installDate: textOrNull(v.installDate),
  pricePaidUsd: numberOrNull(v.pricePaidUsd),
  serialNumbers: parseSerials(v.serialNumbers),
  workOrder: textOrNull(v.workOrder),
  status: v.status || 'installed',
  removedDate: v.status === 'removed' ? textOrNull(v.removedDate) : null,
  removedReason: v.status === 'removed' ? textOrNull(v.removedReason) : null,
});
const resolver = sharedResolver<InstallFormValues, InstallInput>(installSchema, toBody);

const scopesFor: Record<CatalogComponent['unit'], InstallScope[]> = { row: ['all-rows', 'rows'], toolbar: ['toolbar'], planter: ['planter'] };

function startValues(planter: PlanterDetail, target: PanelTarget, install: Install | null): InstallFormValues {
  if (install) {
    return {
      componentId: String(install.componentId),
      scope: install.scope,
      toolbarId: asText(install.toolbarId),
      rowFrom: asText(install.rowFrom),
      rowTo: asText(install.rowTo),
      quantity: asText(install.quantity),
      installDate: install.installDate ?? '',
      pricePaidUsd: asText(install.pricePaidUsd),
      serialNumbers: (install.serialNumbers ?? []).join('\n'),
      workOrder: install.workOrder ?? '',
      status: install.status,
      removedDate: install.removedDate ?? '',
      removedReason: install.removedReason ?? '',
    };
  }
  const firstToolbar = [...planter.toolbars].sort((a, b) => a.position - b.position)[0];
  const base = { componentId: '', quantity: '', installDate: todayIso(), pricePaidUsd: '', serialNumbers: '', workOrder: '', status: 'installed', removedDate: '', removedReason: '' };
  switch (target.kind) {
    case 'row':
      return { ...base, scope: 'rows', toolbarId: '', rowFrom: String(target.row), rowTo: String(target.row) };
    case 'toolbar':
      return { ...base, scope: 'toolbar', toolbarId: String(target.toolbarId), rowFrom: '', rowTo: '' };
    case 'planter':
      return { ...base, scope: 'planter', toolbarId: '', rowFrom: '', rowTo: '' };
    default:
      return { ...base, scope: 'all-rows', toolbarId: firstToolbar ? String(firstToolbar.id) : '', rowFrom: '1', rowTo: String(planter.rows) };
  }
}

/** Which parts the picker offers first: a row's panel lists row-unit parts, a toolbar's bar parts… */
const unitForTarget = (target: PanelTarget): CatalogComponent['unit'] | null =>
  target.kind === 'row' ? 'row' : target.kind === 'toolbar' ? 'toolbar' : target.kind === 'planter' ? 'planter' : null;

interface InstallFormProps {
  planter: PlanterDetail;
  target: PanelTarget;
  install: Install | null;
  onDone: (saved: Install) => void;
  onCancel: () => void;
  onReload: () => void;
}

/**
 * Records a catalog part on the planter (or changes that record): the part, where it goes (every
 * row, a range of rows, one toolbar, or the whole planter — only the places its unit allows),
 * how many, when, at what price, serial numbers and the work order.
 */
export function InstallForm({ planter, target, install, onDone, onCancel, onReload }: InstallFormProps) {
  const catalog = useQuery(catalogPickerQueryOptions());
  const save = useSaveInstallMutation(planter.id, planter.accountId);
  const searchId = useId();
  const [search, setSearch] = useState('');
  const [allUnits, setAllUnits] = useState(false);
  const form = useForm<InstallFormValues, unknown, InstallInput>({ resolver, defaultValues: startValues(planter, target, install) });
  const { register, handleSubmit, setError, watch, setValue, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);

  const componentId = watch('componentId');
  const scope = watch('scope') as InstallScope;
  const status = watch('status');
  const preferredUnit = install ? null : unitForTarget(target);

  // A part made inactive since it was fitted is still offered for its own record.
  const components = useMemo(() => {
    const list = catalog.data ?? [];
    return install?.component && !list.some((c) => c.id === install.componentId) ? [...list, install.component] : list;
  }, [catalog.data, install]);
  const chosen = components.find((c) => String(c.id) === componentId) ?? install?.component ?? null;
  const offered = useMemo(() => {
    const words = search.trim().toLowerCase().split(/\s+/).filter(Boolean);
    return components
      .filter((c) => allUnits || !preferredUnit || c.unit === preferredUnit || String(c.id) === componentId)
      .filter((c) => words.every((w) => `${c.name} ${c.partNumber} ${c.maker ?? ''} ${categoryLabels[c.category]}`.toLowerCase().includes(w)) || String(c.id) === componentId)
      .sort((a, b) => categoryOrder.indexOf(a.category) - categoryOrder.indexOf(b.category) || a.name.localeCompare(b.name));
  }, [components, search, allUnits, preferredUnit, componentId]);

  // The scope follows the part's unit: a per-row part goes on rows, a bar part on a toolbar.
  useEffect(() => {
    if (!chosen) return;
    const allowed = scopesFor[chosen.unit];
    if (!allowed.includes(scope)) setValue('scope', allowed[0]);
  }, [chosen, scope, setValue]);

  const allowedScopes = chosen ? scopesFor[chosen.unit] : (['all-rows', 'rows', 'toolbar', 'planter'] as InstallScope[]);
  const rowFrom = numberOrNull(watch('rowFrom'));
  const rowTo = numberOrNull(watch('rowTo'));
  const defaultQuantity = scope === 'all-rows' ? planter.rows : scope === 'rows' && rowFrom && rowTo && rowTo >= rowFrom ? rowTo - rowFrom + 1 : 1;
  const groups = categoryOrder.map((category) => ({ category, items: offered.filter((c) => c.category === category) })).filter((g) => g.items.length);

  const submit = handleSubmit((input) => {
    clearSaveError();
    save.mutate(install ? { mode: 'update', id: install.id, input, version: install.version } : { mode: 'create', input }, { onSuccess: onDone, onError: handleSaveError });
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label={install ? `Change the record of ${install.component?.name ?? 'this part'}` : 'Add a component'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}

      <fieldset className="space-y-3">
        <legend className="mb-1 text-lg font-bold text-ink-900">Component</legend>
        {catalog.isPending ? (
          <LoadingBlock label="Loading the catalog…" />
        ) : catalog.isError ? (
          <p role="alert" className="font-semibold text-brick-700">The catalog could not be loaded: {catalog.error.message}</p>
        ) : (
          <>
            <div>
              <label htmlFor={searchId} className="mb-1 block font-semibold text-ink-900">
                Find a part
              </label>
              <input id={searchId} type="search" className={inputClasses} placeholder="Name, part number or maker" value={search} onChange={(e) => setSearch(e.target.value)} autoComplete="off" data-autofocus />
            </div>
            <div>
              <label htmlFor="install-component" className="mb-1 block font-semibold text-ink-900">
                Part from the catalog
              </label>
              <select
                id="install-component"
                className={inputClasses}
                aria-invalid={errors.componentId ? true : undefined}
                aria-describedby={errors.componentId ? 'install-component-error' : 'install-component-hint'}
                {...register('componentId')}
              >
                <option value="">{offered.length ? `Choose one of ${offered.length} parts` : 'No part matches the search'}</option>
                {groups.map((g) => (
                  <optgroup key={g.category} label={categoryLabels[g.category]}>
                    {g.items.map((c) => (
                      <option key={c.id} value={c.id}>
                        {c.partNumber} · {c.name} ({unitLabels[c.unit].toLowerCase()})
                      </option>
                    ))}
                  </optgroup>
                ))}
              </select>
              {errors.componentId?.message ? (
                <p id="install-component-error" className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
                  <ErrorMark />
                  {errors.componentId.message}
                </p>
              ) : (
                <p id="install-component-hint" className="mt-1 text-sm text-loam-700">
                  {chosen ? `${chosen.name}: list price ${formatUsd(chosen.priceUsd)}, ${unitLabels[chosen.unit].toLowerCase()}.` : 'Only active parts are offered.'}
                </p>
              )}
            </div>
            {preferredUnit && (
              <label className="flex min-h-11 cursor-pointer items-center gap-3">
                <input type="checkbox" className="size-5 accent-ink-700" checked={allUnits} onChange={(e) => setAllUnits(e.target.checked)} />
                <span>Also list parts fitted per {preferredUnit === 'row' ? 'toolbar or planter' : preferredUnit === 'toolbar' ? 'row or planter' : 'row or toolbar'}</span>
              </label>
            )}
          </>
        )}
      </fieldset>

      <fieldset>
        <legend className="mb-2 text-lg font-bold text-ink-900">Where it goes</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {(['all-rows', 'rows', 'toolbar', 'planter'] as InstallScope[]).map((s) => {
            const allowed = allowedScopes.includes(s);
            return (
              <label key={s} className={`flex min-h-11 items-center gap-3 rounded-lg border px-3 ${allowed ? 'cursor-pointer border-loam-400 bg-white' : 'border-loam-200 bg-loam-50 text-loam-600'}`}>
                <input type="radio" value={s} className="size-5 accent-ink-700" disabled={!allowed} {...register('scope')} />
                {scopeLabels[s]}
                {s === 'all-rows' && <span className="text-sm text-loam-700">({planter.rows})</span>}
              </label>
            );
          })}
        </div>
        {errors.scope?.message && (
          <p className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
            <ErrorMark />
            {errors.scope.message}
          </p>
        )}
        {scope === 'rows' && (
          <div className="mt-3 grid grid-cols-2 gap-4">
            <TextField label="First row" inputMode="numeric" autoComplete="off" hint={`1 to ${planter.rows}`} error={errors.rowFrom?.message} {...register('rowFrom')} />
            <TextField label="Last row" inputMode="numeric" autoComplete="off" error={errors.rowTo?.message} {...register('rowTo')} />
          </div>
        )}
        {scope === 'toolbar' && (
          <SelectField
            className="mt-3"
            label="Toolbar"
            options={[{ value: '', label: 'Choose the toolbar' }, ...[...planter.toolbars].sort((a, b) => a.position - b.position).map((t) => ({ value: String(t.id), label: `${t.name} (${t.sizeFt} ft, rows ${t.firstRow}–${t.lastRow})` }))]}
            error={errors.toolbarId?.message}
            {...register('toolbarId')}
          />
        )}
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Quantity" inputMode="numeric" autoComplete="off" hint={`Empty: ${defaultQuantity}`} error={errors.quantity?.message} {...register('quantity')} />
        <TextField label="Install date" type="date" error={errors.installDate?.message} {...register('installDate')} />
        <TextField label="Price paid (USD, in all)" inputMode="decimal" autoComplete="off" error={errors.pricePaidUsd?.message} {...register('pricePaidUsd')} />
        <TextField label="Work order" autoComplete="off" error={errors.workOrder?.message} {...register('workOrder')} />
      </div>
      <TextAreaField label="Serial numbers" hint="One a line, or separated by commas" rows={3} spellCheck={false} error={errors.serialNumbers?.message} {...register('serialNumbers')} />

      {install && status === 'removed' && (
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Removed on" type="date" error={errors.removedDate?.message} {...register('removedDate')} />
          <TextField label="Why it was removed" autoComplete="off" error={errors.removedReason?.message} {...register('removedReason')} />
        </div>
      )}
      <input type="hidden" {...register('status')} />
      <FormButtons busy={save.isPending} busyLabel="Saving…" label={install ? 'Save changes' : 'Add to the planter'} onCancel={onCancel} />
    </form>
  );
}

/** Marks a part removed (with the date and why); the record stays, for the history. */
export function RemoveInstallForm({ planter, install, onDone, onCancel, onReload }: { planter: PlanterDetail; install: Install; onDone: () => void; onCancel: () => void; onReload: () => void }) {
  const save = useSaveInstallMutation(planter.id, planter.accountId);
  const form = useForm<InstallFormValues, unknown, InstallInput>({
    resolver,
    defaultValues: { ...startValues(planter, { kind: 'add' }, install), status: 'removed', removedDate: todayIso(), removedReason: '' },
  });
  const { register, handleSubmit, setError, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);
  const submit = handleSubmit((input) => {
    clearSaveError();
    save.mutate({ mode: 'update', id: install.id, input, version: install.version }, { onSuccess: onDone, onError: handleSaveError });
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={`Mark ${install.component?.name ?? 'this part'} removed`}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      {/* Other fields of the record are sent back unchanged; their messages (if any) show here. */}
      {(['componentId', 'scope', 'rowFrom', 'rowTo', 'toolbarId', 'installDate'] as const).map((f) =>
        errors[f]?.message ? (
          <p key={f} role="alert" className="font-semibold text-brick-700">
            {errors[f]?.message}
          </p>
        ) : null,
      )}
      <TextField label="Removed on" type="date" data-autofocus error={errors.removedDate?.message} {...register('removedDate')} />
      <TextField label="Why it was removed" hint="Worn out, replaced by an upgrade, moved to another planter…" autoComplete="off" error={errors.removedReason?.message} {...register('removedReason')} />
      <FormButtons busy={save.isPending} busyLabel="Saving…" label="Mark removed" onCancel={onCancel} />
    </form>
  );
}
