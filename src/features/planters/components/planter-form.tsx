import { useEffect } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { planterSchema, type PlanterInput } from '@shared/schemas/fleet';
import { workingWidthFt } from '@shared/calc/sizing';
import { Button } from '@/components/ui/button';
import { ErrorMark, SelectField, TextField } from '@/components/ui/form-field';
import type { FarmSite, PlanterRecord, Toolbar, Tractor } from '@/features/fleet/api/types';
import { CheckboxField, FieldGroup, FormButtons, SaveErrorAlert } from '@/features/fleet/components/form-bits';
import { asText, numberOrNull, numberOrUndefined, sharedResolver, textOrNull } from '@/features/fleet/lib/forms';
import { foldTypeOptions, formatNumber, frameTypeOptions, seedSupplyOptions } from '@/features/fleet/lib/labels';
import { useSaveError } from '@/features/fleet/lib/use-save-error';

interface ToolbarValues {
  id: string;
  name: string;
  sizeFt: string;
  firstRow: string;
  lastRow: string;
}

export interface PlanterFormValues {
  name: string;
  maker: string;
  modelYear: string;
  rows: string;
  rowSpacingIn: string;
  frameType: string;
  foldType: string;
  seedSupplyType: string;
  seedCapacityUnits: string;
  liquidTankCount: string;
  liquidTankGallons: string;
  dryCapacityLb: string;
  markers: boolean;
  acresPerYear: string;
  tractorId: string;
  farmSiteId: string;
  toolbars: ToolbarValues[];
}

const fields = [
  'name', 'maker', 'modelYear', 'rows', 'rowSpacingIn', 'frameType', 'foldType', 'seedSupplyType', 'seedCapacityUnits',
  'liquidTankCount', 'liquidTankGallons', 'dryCapacityLb', 'markers', 'acresPerYear', 'tractorId', 'farmSiteId', 'toolbars',
] as const;

function toBody(v: PlanterFormValues) {
  return {
    name: v.name,
    maker: textOrNull(v.maker),
    modelYear: numberOrNull(v.modelYear),
    rows: numberOrUndefined(v.rows),
    rowSpacingIn: numberOrUndefined(v.rowSpacingIn),
    frameType: v.frameType,
    foldType: v.foldType,
    seedSupplyType: v.seedSupplyType,
    seedCapacityUnits: numberOrNull(v.seedCapacityUnits),
    liquidTankCount: numberOrNull(v.liquidTankCount) ?? 0,
    liquidTankGallons: numberOrNull(v.liquidTankGallons) ?? 0,
    dryCapacityLb: numberOrNull(v.dryCapacityLb) ?? 0,
    markers: v.markers,
    acresPerYear: numberOrNull(v.acresPerYear),
    tractorId: v.tractorId ? Number(v.tractorId) : null,
    farmSiteId: v.farmSiteId ? Number(v.farmSiteId) : null,
    toolbars: v.toolbars.map((t) => ({
      ...(t.id ? { id: Number(t.id) } : {}),
      name: t.name,
      sizeFt: numberOrUndefined(t.sizeFt),
      firstRow: numberOrUndefined(t.firstRow),
      lastRow: numberOrUndefined(t.lastRow),
    })),
  };
}
const resolver = sharedResolver<PlanterFormValues, PlanterInput>(planterSchema, toBody);

function defaults(planter: (PlanterRecord & { toolbars: Toolbar[] }) | null): PlanterFormValues {
  return {
    name: planter?.name ?? '',
    maker: planter?.maker ?? '',
    modelYear: asText(planter?.modelYear),
    rows: asText(planter?.rows),
    rowSpacingIn: asText(planter?.rowSpacingIn ?? 30),
    frameType: planter?.frameType ?? 'rigid',
    foldType: planter?.foldType ?? 'none',
    seedSupplyType: planter?.seedSupplyType ?? 'row-hoppers',
    seedCapacityUnits: asText(planter?.seedCapacityUnits),
    liquidTankCount: asText(planter?.liquidTankCount ?? 0),
    liquidTankGallons: asText(planter?.liquidTankGallons ?? 0),
    dryCapacityLb: asText(planter?.dryCapacityLb ?? 0),
    markers: planter?.markers ?? false,
    acresPerYear: asText(planter?.acresPerYear),
    tractorId: asText(planter?.tractorId),
    farmSiteId: asText(planter?.farmSiteId),
    toolbars: planter
      ? [...planter.toolbars].sort((a, b) => a.position - b.position).map((t) => ({ id: String(t.id), name: t.name, sizeFt: asText(t.sizeFt), firstRow: asText(t.firstRow), lastRow: asText(t.lastRow) }))
      : [{ id: '', name: 'Main bar', sizeFt: '', firstRow: '1', lastRow: '' }],
  };
}

interface PlanterFormProps {
  planter: (PlanterRecord & { toolbars: Toolbar[] }) | null;
  tractors: Tractor[];
  farmSites: FarmSite[];
  busy: boolean;
  onSubmit: (input: PlanterInput, handleError: (error: unknown) => void) => void;
  onCancel: () => void;
  onReload?: () => void;
}

/**
 * A planter's record with its toolbars. A new planter starts with one bar, which follows the rows
 * and spacing (size = working width, rows × spacing) until the toolbar fields are edited by hand.
 */
export function PlanterForm({ planter, tractors, farmSites, busy, onSubmit, onCancel, onReload }: PlanterFormProps) {
  const form = useForm<PlanterFormValues, unknown, PlanterInput>({ resolver, defaultValues: defaults(planter) });
  const { register, handleSubmit, setError, watch, setValue, getFieldState, control, formState } = form;
  const errors = formState.errors;
  const toolbars = useFieldArray({ control, name: 'toolbars' });
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);

  const rows = watch('rows');
  const spacing = watch('rowSpacingIn');
  const rowCount = numberOrUndefined(rows);
  const spacingIn = numberOrUndefined(spacing);
  const widthFt = rowCount && spacingIn && rowCount > 0 && spacingIn > 0 ? workingWidthFt(rowCount, spacingIn) : null;

  useEffect(() => {
    if (planter || toolbars.fields.length !== 1 || !rowCount || !Number.isInteger(rowCount)) return;
    if (!getFieldState('toolbars.0.lastRow').isDirty) setValue('toolbars.0.lastRow', String(rowCount));
    if (widthFt !== null && !getFieldState('toolbars.0.sizeFt').isDirty) setValue('toolbars.0.sizeFt', String(Math.round(widthFt * 10) / 10));
  }, [rowCount, widthFt, planter, toolbars.fields.length, getFieldState, setValue]);

  const toolbarErrors = errors.toolbars as
    | (Array<Partial<Record<keyof ToolbarValues, { message?: string }>> | undefined> & { message?: string; root?: { message?: string } })
    | undefined;
  const toolbarsMessage = toolbarErrors?.message ?? toolbarErrors?.root?.message;

  const submit = handleSubmit((input) => {
    clearSaveError();
    onSubmit(input, handleSaveError);
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label={planter ? `Edit ${planter.name}` : 'Add a planter'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      <TextField label="Name" hint="How the grower calls it: 16-row planter, the split-row" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Maker" autoComplete="off" error={errors.maker?.message} {...register('maker')} />
        <TextField label="Model year" inputMode="numeric" autoComplete="off" error={errors.modelYear?.message} {...register('modelYear')} />
        <TextField label="Rows" inputMode="numeric" autoComplete="off" error={errors.rows?.message} {...register('rows')} />
        <TextField
          label="Row spacing (in)"
          inputMode="decimal"
          autoComplete="off"
          hint={widthFt !== null ? `Working width ${formatNumber(widthFt)} ft` : undefined}
          error={errors.rowSpacingIn?.message}
          {...register('rowSpacingIn')}
        />
        <SelectField label="Frame" options={frameTypeOptions} error={errors.frameType?.message} {...register('frameType')} />
        <SelectField label="Fold" options={foldTypeOptions} error={errors.foldType?.message} {...register('foldType')} />
        <SelectField label="Seed supply" options={seedSupplyOptions} error={errors.seedSupplyType?.message} {...register('seedSupplyType')} />
        <TextField label="Seed capacity (units)" inputMode="decimal" autoComplete="off" hint="Bulk fill or all row hoppers together" error={errors.seedCapacityUnits?.message} {...register('seedCapacityUnits')} />
        <TextField label="Liquid tanks" inputMode="numeric" autoComplete="off" error={errors.liquidTankCount?.message} {...register('liquidTankCount')} />
        <TextField label="Each tank (gal)" inputMode="decimal" autoComplete="off" error={errors.liquidTankGallons?.message} {...register('liquidTankGallons')} />
        <TextField label="Dry fertilizer capacity (lb)" inputMode="decimal" autoComplete="off" error={errors.dryCapacityLb?.message} {...register('dryCapacityLb')} />
        <TextField label="Acres planted a year (ac)" inputMode="decimal" autoComplete="off" error={errors.acresPerYear?.message} {...register('acresPerYear')} />
        <SelectField
          label="Pulled by"
          options={[{ value: '', label: 'No tractor recorded' }, ...tractors.map((t) => ({ value: String(t.id), label: t.name }))]}
          error={errors.tractorId?.message}
          {...register('tractorId')}
        />
        <SelectField
          label="Kept at"
          options={[{ value: '', label: 'No farm site recorded' }, ...farmSites.map((s) => ({ value: String(s.id), label: s.name }))]}
          error={errors.farmSiteId?.message}
          {...register('farmSiteId')}
        />
      </div>
      <CheckboxField label="Has row markers" {...register('markers')} />

      <div className="space-y-3">
        <h3 className="text-lg font-bold text-ink-900">Toolbars</h3>
        <p className="text-loam-700">The bars the row units hang on, with the rows each carries. A split-row planter has a front and a rear bar.</p>
        {toolbarsMessage && (
          <p role="alert" className="flex items-start gap-1.5 font-semibold text-brick-700">
            <ErrorMark />
            {toolbarsMessage}
          </p>
        )}
        {toolbars.fields.map((field, index) => {
          const e = toolbarErrors?.[index];
          return (
            <FieldGroup key={field.id} legend={`Toolbar ${index + 1}`}>
              <input type="hidden" {...register(`toolbars.${index}.id`)} />
              <div className="grid gap-3 sm:grid-cols-2">
                <TextField label="Name" autoComplete="off" error={e?.name?.message} {...register(`toolbars.${index}.name`)} />
                <TextField label="Size (ft)" inputMode="decimal" autoComplete="off" error={e?.sizeFt?.message} {...register(`toolbars.${index}.sizeFt`)} />
                <TextField label="First row" inputMode="numeric" autoComplete="off" error={e?.firstRow?.message} {...register(`toolbars.${index}.firstRow`)} />
                <TextField label="Last row" inputMode="numeric" autoComplete="off" error={e?.lastRow?.message ?? e?.id?.message} {...register(`toolbars.${index}.lastRow`)} />
              </div>
              {toolbars.fields.length > 1 && (
                <Button variant="ghost" className="mt-2 px-3 text-brick-700" onClick={() => toolbars.remove(index)}>
                  Remove toolbar {index + 1}
                </Button>
              )}
            </FieldGroup>
          );
        })}
        {toolbars.fields.length < 4 && (
          <Button
            variant="secondary"
            onClick={() => {
              const last = numberOrUndefined(watch(`toolbars.${toolbars.fields.length - 1}.lastRow`));
              toolbars.append({ id: '', name: toolbars.fields.length === 1 ? 'Rear bar' : `Bar ${toolbars.fields.length + 1}`, sizeFt: '', firstRow: last ? String(last + 1) : '', lastRow: rows });
            }}
          >
            <span aria-hidden="true">+</span> Add a toolbar
          </Button>
        )}
      </div>
      <FormButtons busy={busy} busyLabel="Saving…" label={planter ? 'Save planter' : 'Add planter'} onCancel={onCancel} />
    </form>
  );
}
