import { useForm } from 'react-hook-form';
import { tractorSchema, type TractorInput } from '@shared/schemas/fleet';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/form-field';
import { useSaveAccountChildMutation } from '../api/account-children';
import type { Tractor } from '../api/types';
import { asText, numberOrNull, numberOrUndefined, sharedResolver } from '../lib/forms';
import { formatNumber } from '../lib/labels';
import { useSaveError } from '../lib/use-save-error';
import { ChildFormPanel, DeleteChildDialog, RecordActions, useChildSection } from './child-panel';
import { FormButtons, SaveErrorAlert } from './form-bits';
import { FactList, FleetSection } from './section';

interface TractorFormValues {
  name: string;
  modelYear: string;
  hydraulicFlowGpm: string;
  hydraulicPressurePsi: string;
  remoteValves: string;
  ptoHp: string;
}
const fields = ['name', 'modelYear', 'hydraulicFlowGpm', 'hydraulicPressurePsi', 'remoteValves', 'ptoHp'] as const;
const toBody = (v: TractorFormValues) => ({
  name: v.name,
  modelYear: numberOrNull(v.modelYear),
  hydraulicFlowGpm: numberOrUndefined(v.hydraulicFlowGpm),
  hydraulicPressurePsi: numberOrUndefined(v.hydraulicPressurePsi),
  remoteValves: numberOrUndefined(v.remoteValves),
  ptoHp: numberOrNull(v.ptoHp),
});
const resolver = sharedResolver<TractorFormValues, TractorInput>(tractorSchema, toBody);

/** Tractors, with what matters for a planter: hydraulic flow and pressure, remotes, PTO power. */
export function TractorsSection({ accountId, tractors, canEdit }: { accountId: number; tractors: Tractor[]; canEdit: boolean }) {
  const s = useChildSection<Tractor>('tractors', accountId);
  const editing = s.editing;
  // The form follows the record as the account reloads: a newer version (after a 409) starts it afresh.
  const fresh = editing?.mode === 'update' ? (tractors.find((x) => x.id === editing.record.id) ?? editing.record) : null;
  return (
    <FleetSection
      id="tractors"
      title="Tractors"
      count={tractors.length}
      action={
        canEdit && (
          <Button variant="secondary" onClick={() => s.setEditing({ mode: 'create' })}>
            <span aria-hidden="true">+</span> Add a tractor
          </Button>
        )
      }
    >
      {tractors.length === 0 ? (
        <p className="text-loam-700">No tractors recorded yet.</p>
      ) : (
        <ul className="divide-y divide-loam-200">
          {tractors.map((t) => (
            <li key={t.id} className="flex flex-wrap items-start justify-between gap-2 py-3 first:pt-0 last:pb-0">
              <div className="min-w-0">
                <p className="font-semibold text-ink-900">
                  {t.name}
                  {t.modelYear && <span className="font-normal text-loam-700"> · {t.modelYear}</span>}
                </p>
                <FactList
                  items={[
                    { label: 'Hydraulic flow', value: `${formatNumber(t.hydraulicFlowGpm)} gpm` },
                    { label: 'Pressure', value: `${formatNumber(t.hydraulicPressurePsi)} psi` },
                    { label: 'Remote valves', value: t.remoteValves },
                    { label: 'PTO', value: t.ptoHp !== null ? `${formatNumber(t.ptoHp)} hp` : '—' },
                  ]}
                />
              </div>
              {canEdit && <RecordActions name={t.name} onEdit={() => s.setEditing({ mode: 'update', record: t })} onDelete={() => s.setDeleting(t)} />}
            </li>
          ))}
        </ul>
      )}
      <ChildFormPanel open={editing !== null} title={editing?.mode === 'update' ? `Edit ${editing.record.name}` : 'Add a tractor'} onClose={() => s.setEditing(null)}>
        {editing && (
          <TractorForm
            key={fresh ? `${fresh.id}-${fresh.version}` : 'new'}
            accountId={accountId}
            tractor={fresh}
            onReload={s.reload}
            onDone={() => s.setEditing(null)}
          />
        )}
      </ChildFormPanel>
      <DeleteChildDialog kind="tractor" record={s.deleting} remove={s.remove} onClose={() => s.setDeleting(null)}>
        {s.deleting ? `This deletes the tractor ${s.deleting.name}. Planters it pulls stay, without a tractor. It cannot be undone.` : null}
      </DeleteChildDialog>
    </FleetSection>
  );
}

function TractorForm({ accountId, tractor, onReload, onDone }: { accountId: number; tractor: Tractor | null; onReload: () => void; onDone: () => void }) {
  const save = useSaveAccountChildMutation('tractors', accountId);
  const form = useForm<TractorFormValues, unknown, TractorInput>({
    resolver,
    defaultValues: {
      name: tractor?.name ?? '',
      modelYear: asText(tractor?.modelYear),
      hydraulicFlowGpm: asText(tractor?.hydraulicFlowGpm),
      hydraulicPressurePsi: asText(tractor?.hydraulicPressurePsi),
      remoteValves: asText(tractor?.remoteValves),
      ptoHp: asText(tractor?.ptoHp),
    },
  });
  const { register, handleSubmit, setError, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);
  const onSubmit = handleSubmit((input) => {
    clearSaveError();
    save.mutate(tractor ? { mode: 'update', id: tractor.id, input, version: tractor.version } : { mode: 'create', input }, { onSuccess: onDone, onError: handleSaveError });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label={tractor ? `Edit ${tractor.name}` : 'Add a tractor'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      <TextField label="Name" hint="How the grower calls it: Planting tractor, Big tractor" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
      <TextField label="Model year" inputMode="numeric" autoComplete="off" error={errors.modelYear?.message} {...register('modelYear')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Hydraulic flow (gpm)" inputMode="decimal" autoComplete="off" error={errors.hydraulicFlowGpm?.message} {...register('hydraulicFlowGpm')} />
        <TextField label="Hydraulic pressure (psi)" inputMode="numeric" autoComplete="off" error={errors.hydraulicPressurePsi?.message} {...register('hydraulicPressurePsi')} />
        <TextField label="Remote valves" inputMode="numeric" autoComplete="off" error={errors.remoteValves?.message} {...register('remoteValves')} />
        <TextField label="PTO power (hp)" inputMode="decimal" autoComplete="off" hint="Leave empty if not known" error={errors.ptoHp?.message} {...register('ptoHp')} />
      </div>
      <FormButtons busy={save.isPending} busyLabel="Saving…" label={tractor ? 'Save tractor' : 'Add tractor'} onCancel={onDone} />
    </form>
  );
}
