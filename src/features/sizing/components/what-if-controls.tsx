import type { ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/form-field';
import { formatNumber } from '../model/format';
import {
  relevantFields,
  type PlanterSizingRecord,
  type SizingTractor,
  type WhatIfErrors,
  type WhatIfField,
  type WhatIfValues,
} from '../model/planter-what-if';

interface BoxDef {
  field: Exclude<WhatIfField, 'tractorId'>;
  label: string;
  unit: string;
  whole?: boolean;
}

const PLANTING: BoxDef[] = [
  { field: 'speedMph', label: 'Speed', unit: 'mph' },
  { field: 'populationPerAcre', label: 'Population', unit: 'seeds/ac', whole: true },
  { field: 'fieldEfficiencyPct', label: 'Field efficiency', unit: '%' },
  { field: 'fieldHoursPerDay', label: 'Field hours', unit: 'h/day' },
];
const SEED: BoxDef[] = [
  { field: 'cellsPerDisc', label: 'Cells per disc', unit: 'cells', whole: true },
  { field: 'seedCapacityUnits', label: 'Seed per fill', unit: 'units' },
  { field: 'seedStopMinutes', label: 'Seed stop', unit: 'min' },
];
const LIQUID: BoxDef[] = [
  { field: 'liquidTankCount', label: 'Tanks', unit: 'tanks', whole: true },
  { field: 'liquidTankGallons', label: 'Each tank', unit: 'gal' },
  { field: 'liquidGpa', label: 'Rate', unit: 'gal/ac' },
  { field: 'liquidStopMinutes', label: 'Liquid stop', unit: 'min' },
  { field: 'sectionRows', label: 'Rows per section', unit: 'rows', whole: true },
];
const DRY: BoxDef[] = [
  { field: 'dryLbPerAcre', label: 'Dry rate', unit: 'lb/ac' },
  { field: 'dryStopMinutes', label: 'Dry stop', unit: 'min' },
];

const seedSupplyWords = { 'row-hoppers': 'row hoppers', 'central-fill': 'central-fill tanks' } as const;

/** "40 gpm at 2,750 psi, 3 remotes, 180 hp PTO": what the hydraulic budget reads from a tractor. */
export function tractorFacts(t: SizingTractor): string {
  const pto = t.ptoHp ? `, ${formatNumber(t.ptoHp, 0)} hp PTO` : '';
  return `${formatNumber(t.hydraulicFlowGpm, 1)} gpm at ${formatNumber(t.hydraulicPressurePsi, 0)} psi, ${t.remoteValves} remote${t.remoteValves === 1 ? '' : 's'}${pto}`;
}

interface WhatIfControlsProps {
  planter: PlanterSizingRecord;
  values: WhatIfValues;
  stored: WhatIfValues;
  errors: WhatIfErrors;
  tractors: SizingTractor[];
  tractorsLoading: boolean;
  onChange: (field: WhatIfField, text: string) => void;
  onReset: () => void;
}

function Group({ legend, note, children }: { legend: string; note?: ReactNode; children: ReactNode }) {
  return (
    <fieldset className="min-w-0 rounded-lg border border-loam-200 p-3">
      <legend className="px-1 font-bold text-ink-900">{legend}</legend>
      {note && <p className="mb-2 text-sm text-loam-700">{note}</p>}
      <div className="grid grid-cols-2 gap-3">{children}</div>
    </fieldset>
  );
}

/**
 * The what-if boxes. Every change is checked at once with the server's own schemas and the
 * figures follow in the same frame; a box the server would refuse shows its message, and the
 * figures stay on the last good values until it is fixed.
 */
export function WhatIfControls({ planter, values, stored, errors, tractors, tractorsLoading, onChange, onReset }: WhatIfControlsProps) {
  const relevant = relevantFields(planter, values);
  const changed = (Object.keys(values) as WhatIfField[]).some((f) => values[f] !== stored[f]);
  const errorCount = Object.keys(errors).length;

  const box = (def: BoxDef) =>
    relevant[def.field] ? (
      <TextField
        key={def.field}
        name={def.field}
        label={
          <>
            {def.label} <span className="font-normal text-loam-700">({def.unit})</span>
          </>
        }
        inputMode={def.whole ? 'numeric' : 'decimal'}
        autoComplete="off"
        value={values[def.field]}
        onChange={(event) => onChange(def.field, event.target.value)}
        error={errors[def.field]}
        hint={values[def.field] !== stored[def.field] ? `As stored: ${stored[def.field] || 'none'} ${stored[def.field] ? def.unit : ''}`.trim() : undefined}
      />
    ) : null;

  const tankCount = Number(values.liquidTankCount);
  const chosen = tractors.find((t) => String(t.id) === values.tractorId);
  return (
    <form aria-label="What if" noValidate onSubmit={(event) => event.preventDefault()} className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 className="text-lg font-bold text-ink-900">What if…</h2>
        <Button variant="secondary" onClick={onReset} disabled={!changed}>
          Back to as stored
        </Button>
      </div>
      <p className="text-sm text-loam-700">Change any box: every figure follows at once, worked out in this browser.</p>
      <div aria-live="polite">
        {errorCount > 0 && (
          <p className="rounded-lg border border-brick-300 bg-brick-50 p-2 text-sm font-semibold text-brick-800">
            {errorCount === 1 ? 'One box needs' : `${errorCount} boxes need`} fixing; the figures show the last values that could be worked out.
          </p>
        )}
      </div>
      <div className="grid gap-3 md:grid-cols-2 xl:grid-cols-1">
        <Group legend="Planting">{PLANTING.map(box)}</Group>
        <Group legend="Seed meter and fill method" note={`Fitted: ${seedSupplyWords[planter.seedSupplyType] ?? planter.seedSupplyType}. Central fill carries more per stop; set what one fill carries and how long a stop takes.`}>
          {SEED.map(box)}
        </Group>
        <Group legend="Liquid starter" note={Number.isFinite(tankCount) && tankCount > 0 ? undefined : 'No liquid tanks: set a number of tanks to try liquid.'}>
          {LIQUID.map(box)}
        </Group>
        {planter.dryCapacityLb > 0 && (
          <Group legend="Dry fertilizer" note={`Box capacity ${formatNumber(planter.dryCapacityLb, 0)} lb.`}>
            {DRY.map(box)}
          </Group>
        )}
        <fieldset className="min-w-0 rounded-lg border border-loam-200 p-3">
          <legend className="px-1 font-bold text-ink-900">Tractor</legend>
          <SelectField
            name="tractorId"
            label="Pulled by"
            value={values.tractorId}
            onChange={(event) => onChange('tractorId', event.target.value)}
            error={errors.tractorId}
            hint={
              <>
                {chosen ? tractorFacts(chosen) : 'No tractor: the hydraulic budget is left out.'}
                {tractorsLoading && <span className="block">Loading this operation’s tractors…</span>}
                {values.tractorId !== stored.tractorId && <span className="block">A different tractor from the one stored.</span>}
              </>
            }
            options={[...tractors.map((t) => ({ value: String(t.id), label: t.name })), { value: '', label: 'No tractor' }]}
          />
        </fieldset>
      </div>
    </form>
  );
}
