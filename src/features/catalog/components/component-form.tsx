import { useForm } from 'react-hook-form';
import { componentSchema, componentUnits, cropsHandled, type ComponentInput } from '@shared/schemas/fleet';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/form-field';
import type { CatalogComponent } from '@/features/fleet/api/types';
import { CheckboxField, FieldGroup, FormButtons, SaveErrorAlert } from '@/features/fleet/components/form-bits';
import { asText, numberOrNull, numberOrUndefined, sharedResolver, textOrNull } from '@/features/fleet/lib/forms';
import { categoryOptions, cropLabels, unitLabels } from '@/features/fleet/lib/labels';
import { useSaveError } from '@/features/fleet/lib/use-save-error';

interface ComponentFormValues {
  category: string;
  name: string;
  maker: string;
  partNumber: string;
  priceUsd: string;
  labourHours: string;
  expectedLifeYears: string;
  unit: string;
  hydraulicGpm: string;
  ratedMaxSpeedMph: string;
  maxSeedsPerSecond: string;
  crops: string[];
  movesToNewToolbar: boolean;
  active: boolean;
}

const fields = ['category', 'name', 'maker', 'partNumber', 'priceUsd', 'labourHours', 'expectedLifeYears', 'unit', 'hydraulicGpm', 'ratedMaxSpeedMph', 'maxSeedsPerSecond', 'crops', 'movesToNewToolbar', 'active'] as const;

const toBody = (v: ComponentFormValues) => ({
  category: v.category,
  name: v.name,
  maker: textOrNull(v.maker),
  partNumber: v.partNumber,
  priceUsd: numberOrUndefined(v.priceUsd),
  labourHours: numberOrUndefined(v.labourHours),
  expectedLifeYears: numberOrUndefined(v.expectedLifeYears),
  unit: v.unit,
  hydraulicGpm: numberOrNull(v.hydraulicGpm),
  ratedMaxSpeedMph: numberOrNull(v.ratedMaxSpeedMph),
  maxSeedsPerSecond: numberOrNull(v.maxSeedsPerSecond),
  crops: Array.isArray(v.crops) ? v.crops : [],
  movesToNewToolbar: v.movesToNewToolbar,
  active: v.active,
});
const resolver = sharedResolver<ComponentFormValues, ComponentInput>(componentSchema, toBody);

interface ComponentFormProps {
  component: CatalogComponent | null;
  busy: boolean;
  onSubmit: (input: ComponentInput, handleError: (error: unknown) => void) => void;
  onCancel: () => void;
  onReload?: () => void;
  /** Offered when changing a part that exists: asks for confirmation first. */
  onDelete?: () => void;
}

/** A catalog part: what it is, what it costs to buy and fit, how long it lasts, what it asks of the tractor. */
export function ComponentForm({ component, busy, onSubmit, onCancel, onReload, onDelete }: ComponentFormProps) {
  const form = useForm<ComponentFormValues, unknown, ComponentInput>({
    resolver,
    defaultValues: {
      category: component?.category ?? 'seed-meter',
      name: component?.name ?? '',
      maker: component?.maker ?? '',
      partNumber: component?.partNumber ?? '',
      priceUsd: asText(component?.priceUsd),
      labourHours: asText(component?.labourHours),
      expectedLifeYears: asText(component?.expectedLifeYears),
      unit: component?.unit ?? 'row',
      hydraulicGpm: asText(component?.hydraulicGpm),
      ratedMaxSpeedMph: asText(component?.ratedMaxSpeedMph),
      maxSeedsPerSecond: asText(component?.maxSeedsPerSecond),
      crops: component?.crops ?? [],
      movesToNewToolbar: component?.movesToNewToolbar ?? true,
      active: component?.active ?? true,
    },
  });
  const { register, handleSubmit, setError, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);
  const submit = handleSubmit((input) => {
    clearSaveError();
    // A duplicate part number comes back as a 409 with the server's message, shown above the form.
    onSubmit(input, handleSaveError);
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label={component ? `Edit ${component.partNumber}` : 'Add a component'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      <SelectField label="Category" options={categoryOptions} data-autofocus error={errors.category?.message} {...register('category')} />
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Dealer part number" autoComplete="off" spellCheck={false} error={errors.partNumber?.message} {...register('partNumber')} />
        <TextField label="Maker" autoComplete="off" error={errors.maker?.message} {...register('maker')} />
        <TextField label="Price (USD)" inputMode="decimal" autoComplete="off" error={errors.priceUsd?.message} {...register('priceUsd')} />
        <TextField label="Install labour (h)" inputMode="decimal" autoComplete="off" hint="Shop hours to fit one unit" error={errors.labourHours?.message} {...register('labourHours')} />
        <TextField label="Expected life (years)" inputMode="decimal" autoComplete="off" error={errors.expectedLifeYears?.message} {...register('expectedLifeYears')} />
        <SelectField label="Sold" options={componentUnits.map((u) => ({ value: u, label: unitLabels[u] }))} error={errors.unit?.message} {...register('unit')} />
        <TextField label="Hydraulic demand (gpm)" inputMode="decimal" autoComplete="off" hint="Empty if it uses no oil" error={errors.hydraulicGpm?.message} {...register('hydraulicGpm')} />
        <TextField label="Rated maximum speed (mph)" inputMode="decimal" autoComplete="off" error={errors.ratedMaxSpeedMph?.message} {...register('ratedMaxSpeedMph')} />
        <TextField label="Rated seeds per second" inputMode="decimal" autoComplete="off" hint="Seed meters only" error={errors.maxSeedsPerSecond?.message} {...register('maxSeedsPerSecond')} />
      </div>
      <FieldGroup legend="Crops it handles">
        <div className="grid grid-cols-2 gap-x-4 sm:grid-cols-3">
          {cropsHandled.map((crop) => (
            <label key={crop} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="checkbox" value={crop} className="size-5 accent-ink-700" {...register('crops')} />
              {cropLabels[crop]}
            </label>
          ))}
        </div>
        <p className="mt-1 text-sm text-loam-700">Leave all empty for parts that do not depend on the crop.</p>
        {errors.crops?.message && <p className="mt-1 text-sm font-semibold text-brick-700">{errors.crops.message}</p>}
      </FieldGroup>
      <CheckboxField label="Can move to a new toolbar" hint="Row-unit parts usually move with the row unit; some bar-mounted parts cannot." {...register('movesToNewToolbar')} />
      <CheckboxField label="Active (offered when recording installs)" {...register('active')} />
      <FormButtons busy={busy} busyLabel="Saving…" label={component ? 'Save component' : 'Add component'} onCancel={onCancel} />
      {component && onDelete && (
        <div className="border-t border-loam-200 pt-4">
          <Button variant="ghost" className="px-3 text-brick-700 hover:bg-brick-50" onClick={onDelete}>
            Delete {component.partNumber} from the catalog
          </Button>
          <p className="mt-1 text-sm text-loam-700">Only parts no planter carries can be deleted; mark others inactive.</p>
        </div>
      )}
    </form>
  );
}
