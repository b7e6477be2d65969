import { useForm } from 'react-hook-form';
import { farmSiteSchema, type FarmSiteInput } from '@shared/schemas/fleet';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/form-field';
import { useSaveAccountChildMutation } from '../api/account-children';
import type { FarmSite } from '../api/types';
import { asText, numberOrUndefined, sharedResolver, textOrNull } from '../lib/forms';
import { formatCoordinate } from '../lib/labels';
import { useSaveError } from '../lib/use-save-error';
import { ChildFormPanel, DeleteChildDialog, RecordActions, useChildSection } from './child-panel';
import { FormButtons, SaveErrorAlert, TextAreaField } from './form-bits';
import { FleetSection } from './section';

interface FarmSiteFormValues {
  name: string;
  lat: string;
  lng: string;
  notes: string;
}
const fields = ['name', 'lat', 'lng', 'notes'] as const;
const toBody = (v: FarmSiteFormValues) => ({ name: v.name, lat: numberOrUndefined(v.lat), lng: numberOrUndefined(v.lng), notes: textOrNull(v.notes) });
const resolver = sharedResolver<FarmSiteFormValues, FarmSiteInput>(farmSiteSchema, toBody);

/** The yards where planters are kept: where a visit or an install actually happens. */
export function FarmSitesSection({ accountId, sites, canEdit }: { accountId: number; sites: FarmSite[]; canEdit: boolean }) {
  const s = useChildSection<FarmSite>('farm-sites', accountId);
  const editing = s.editing;
  // The form follows the record as the account reloads: a newer version (after a 409) starts it afresh.
  const fresh = editing?.mode === 'update' ? (sites.find((x) => x.id === editing.record.id) ?? editing.record) : null;
  return (
    <FleetSection
      id="farm-sites"
      title="Farm sites"
      count={sites.length}
      action={
        canEdit && (
          <Button variant="secondary" onClick={() => s.setEditing({ mode: 'create' })}>
            <span aria-hidden="true">+</span> Add a farm site
          </Button>
        )
      }
    >
      {sites.length === 0 ? (
        <p className="text-loam-700">No farm sites recorded yet.</p>
      ) : (
        <ul className="divide-y divide-loam-200">
          {sites.map((site) => (
            <li key={site.id} className="flex flex-wrap items-start justify-between gap-2 py-3 first:pt-0 last:pb-0">
              <div className="flex min-w-0 gap-3">
                <svg viewBox="0 0 20 24" className="mt-1 h-6 w-5 shrink-0 text-ink-600" aria-hidden="true">
                  <path d="M10 23s8-8.2 8-13.5A8 8 0 0 0 2 9.5C2 14.8 10 23 10 23Z" fill="currentColor" />
                  <circle cx="10" cy="9.5" r="3" fill="white" />
                </svg>
                <div className="min-w-0">
                  <p className="font-semibold text-ink-900">{site.name}</p>
                  <p className="text-ink-800 tabular">
                    {formatCoordinate(site.lat, 'N', 'S')}, {formatCoordinate(site.lng, 'E', 'W')}
                  </p>
                  {site.notes && <p className="whitespace-pre-line text-loam-800">{site.notes}</p>}
                </div>
              </div>
              {canEdit && <RecordActions name={site.name} onEdit={() => s.setEditing({ mode: 'update', record: site })} onDelete={() => s.setDeleting(site)} />}
            </li>
          ))}
        </ul>
      )}
      <ChildFormPanel
        open={editing !== null}
        title={editing?.mode === 'update' ? `Edit ${editing.record.name}` : 'Add a farm site'}
        description="The yard where equipment is kept, as decimal latitude and longitude."
        onClose={() => s.setEditing(null)}
      >
        {editing && (
          <FarmSiteForm
            key={fresh ? `${fresh.id}-${fresh.version}` : 'new'}
            accountId={accountId}
            site={fresh}
            onReload={s.reload}
            onDone={() => s.setEditing(null)}
          />
        )}
      </ChildFormPanel>
      <DeleteChildDialog kind="farm site" record={s.deleting} remove={s.remove} onClose={() => s.setDeleting(null)}>
        {s.deleting ? `This deletes the farm site ${s.deleting.name}. Planters kept there stay, without a site. It cannot be undone.` : null}
      </DeleteChildDialog>
    </FleetSection>
  );
}

function FarmSiteForm({ accountId, site, onReload, onDone }: { accountId: number; site: FarmSite | null; onReload: () => void; onDone: () => void }) {
  const save = useSaveAccountChildMutation('farm-sites', accountId);
  const form = useForm<FarmSiteFormValues, unknown, FarmSiteInput>({
    resolver,
    defaultValues: { name: site?.name ?? '', lat: asText(site?.lat), lng: asText(site?.lng), notes: site?.notes ?? '' },
  });
  const { register, handleSubmit, setError, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);
  const onSubmit = handleSubmit((input) => {
    clearSaveError();
    save.mutate(site ? { mode: 'update', id: site.id, input, version: site.version } : { mode: 'create', input }, { onSuccess: onDone, onError: handleSaveError });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label={site ? `Edit ${site.name}` : 'Add a farm site'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      <TextField label="Name" hint="For example: Home yard, North shop" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Latitude (°)" inputMode="decimal" autoComplete="off" hint="North is positive, e.g. 39.7871" error={errors.lat?.message} {...register('lat')} />
        <TextField label="Longitude (°)" inputMode="decimal" autoComplete="off" hint="West is negative, e.g. -98.2104" error={errors.lng?.message} {...register('lng')} />
      </div>
      <TextAreaField label="Notes" hint="Gate code, where the shop is, where to park a service truck" error={errors.notes?.message} {...register('notes')} />
      <FormButtons busy={save.isPending} busyLabel="Saving…" label={site ? 'Save farm site' : 'Add farm site'} onCancel={onDone} />
    </form>
  );
}
