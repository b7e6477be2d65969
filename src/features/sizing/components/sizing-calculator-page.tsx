import { useMemo, useState, type ReactNode } from 'react';
import { sizingDelta } from '@shared/calc/sizing';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { TextField } from '@/components/ui/form-field';
import {
  CALCULATOR_EXAMPLE,
  changeCalculator,
  emptyLoad,
  startCalculator,
  type CalculatorNumberField,
  type CalculatorValues,
  type LoadValues,
} from '../model/calculator-form';
import { SizingHeadline, SizingReport } from './sizing-report';

interface BoxDef {
  field: CalculatorNumberField;
  label: string;
  unit: string;
  whole?: boolean;
  hint?: string;
}

const GROUPS: { legend: string; note?: string; boxes: BoxDef[] }[] = [
  {
    legend: 'Planter',
    boxes: [
      { field: 'rows', label: 'Rows', unit: 'rows', whole: true },
      { field: 'rowSpacingIn', label: 'Row spacing', unit: 'in' },
    ],
  },
  {
    legend: 'Planting',
    boxes: [
      { field: 'speedMph', label: 'Speed', unit: 'mph' },
      { field: 'populationPerAcre', label: 'Population', unit: 'seeds/ac', whole: true },
      { field: 'fieldEfficiencyPct', label: 'Field efficiency', unit: '%' },
      { field: 'fieldHoursPerDay', label: 'Field hours', unit: 'h/day' },
    ],
  },
  {
    legend: 'Seed meter',
    boxes: [
      { field: 'cellsPerDisc', label: 'Cells per disc', unit: 'cells', whole: true },
      { field: 'meterMaxSeedsPerSecond', label: 'Meter limit', unit: 'seeds/s' },
    ],
  },
  {
    legend: 'Seed fill method',
    note: 'What one fill carries and how long a stop takes (central fill: more per stop).',
    boxes: [
      { field: 'seedCapacityUnits', label: 'Seed per fill', unit: 'units' },
      { field: 'seedsPerUnit', label: 'Seeds per unit', unit: 'seeds', whole: true },
      { field: 'seedStopMinutes', label: 'Seed stop', unit: 'min' },
    ],
  },
  {
    legend: 'Liquid starter',
    boxes: [
      { field: 'liquidGpa', label: 'Rate', unit: 'gal/ac' },
      { field: 'tankGallons', label: 'All tanks', unit: 'gal' },
      { field: 'liquidStopMinutes', label: 'Liquid stop', unit: 'min' },
      { field: 'sectionRows', label: 'Rows per section', unit: 'rows', whole: true },
    ],
  },
  {
    legend: 'Dry fertilizer',
    boxes: [
      { field: 'dryCapacityLb', label: 'Box capacity', unit: 'lb' },
      { field: 'dryLbPerAcre', label: 'Dry rate', unit: 'lb/ac' },
      { field: 'dryStopMinutes', label: 'Dry stop', unit: 'min' },
    ],
  },
  {
    legend: 'Tractor',
    boxes: [
      { field: 'tractorFlowGpm', label: 'Hydraulic flow', unit: 'gpm' },
      { field: 'tractorPressurePsi', label: 'Pressure', unit: 'psi' },
      { field: 'tractorRemoteValves', label: 'Remote valves', unit: 'remotes', whole: true },
    ],
  },
];

function Group({ legend, note, children }: { legend: string; note?: ReactNode; children: ReactNode }) {
  return (
    <fieldset className="min-w-0 rounded-lg border border-loam-200 p-3">
      <legend className="px-1 font-bold text-ink-900">{legend}</legend>
      {note && <p className="mb-2 text-sm text-loam-700">{note}</p>}
      <div className="grid grid-cols-2 gap-3">{children}</div>
    </fieldset>
  );
}

function unitLabel(label: string, unit: string) {
  return (
    <>
      {label} <span className="font-normal text-loam-700">({unit})</span>
    </>
  );
}

/** /sizing — the calculator on explicit inputs, for a planter not (yet) in Rowpath. */
export function SizingCalculatorPage() {
  const [state, setState] = useState(() => startCalculator());
  const comparison = useMemo(() => sizingDelta(state.baseInput, state.input), [state.baseInput, state.input]);
  const { values, errors } = state;
  const errorCount = Object.keys(errors).length;

  const setValues = (next: CalculatorValues) => setState((prev) => changeCalculator(prev, next));
  const setNumber = (field: CalculatorNumberField, text: string) => setState((prev) => changeCalculator(prev, { ...prev.values, [field]: text }));
  const setLoad = (index: number, key: keyof LoadValues, text: string) =>
    setState((prev) =>
      changeCalculator(prev, { ...prev.values, hydraulicLoads: prev.values.hydraulicLoads.map((l, i) => (i === index ? { ...l, [key]: text } : l)) }),
    );
  const pinned = state.baseInput === state.input;

  return (
    <>
      <title>Sizing calculator · Rowpath</title>
      <PageHeader
        title="Sizing calculator"
        description="Size a planter that is not in Rowpath from explicit figures. An empty box leaves its figures out. Worked out in this browser with the same functions as each planter’s Sizing panel."
      />
      <SizingHeadline comparison={comparison} baseInput={state.baseInput} changedInput={state.input} compareLabel="pinned" />
      <div className="grid gap-6 xl:grid-cols-[22rem_minmax(0,1fr)] xl:items-start">
        <form
          aria-label="Calculator inputs"
          noValidate
          onSubmit={(event) => event.preventDefault()}
          className="space-y-3 rounded-xl border border-loam-200 bg-white p-4 shadow-sm xl:sticky xl:top-6 xl:max-h-[calc(100dvh-3rem)] xl:overflow-y-auto"
        >
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => setState((prev) => ({ ...prev, baseInput: prev.input }))} disabled={pinned || errorCount > 0}>
              Compare with these
            </Button>
            <Button variant="ghost" onClick={() => setState(startCalculator(CALCULATOR_EXAMPLE))}>
              Start from the example
            </Button>
          </div>
          <p className="text-sm text-loam-700">Changes are shown against the pinned figures; “Compare with these” pins the current ones.</p>
          <div aria-live="polite">
            {errorCount > 0 && (
              <p className="rounded-lg border border-brick-300 bg-brick-50 p-2 text-sm font-semibold text-brick-800">
                {errorCount === 1 ? 'One box needs' : `${errorCount} boxes need`} fixing; the figures show the last values that could be worked out.
              </p>
            )}
          </div>
          <div className="grid gap-3 md:grid-cols-2 xl:grid-cols-1">
            {GROUPS.map((group) => (
              <Group key={group.legend} legend={group.legend} note={group.note}>
                {group.boxes.map((box) => (
                  <TextField
                    key={box.field}
                    name={box.field}
                    label={unitLabel(box.label, box.unit)}
                    inputMode={box.whole ? 'numeric' : 'decimal'}
                    autoComplete="off"
                    value={values[box.field]}
                    onChange={(event) => setNumber(box.field, event.target.value)}
                    error={errors[box.field]}
                  />
                ))}
              </Group>
            ))}
            <fieldset className="min-w-0 rounded-lg border border-loam-200 p-3 md:col-span-2 xl:col-span-1">
              <legend className="px-1 font-bold text-ink-900">Hydraulic loads while planting</legend>
              <p className="mb-2 text-sm text-loam-700">Fan, downforce, drives… Leave out the fold. Loads naming the same circuit share a remote.</p>
              <ol className="space-y-3">
                {values.hydraulicLoads.map((load, index) => (
                  <li key={index} className="rounded-lg bg-loam-50 p-2">
                    <div className="grid grid-cols-2 gap-2">
                      <TextField
                        className="col-span-2"
                        label={`Load ${index + 1} name`}
                        autoComplete="off"
                        value={load.name}
                        onChange={(event) => setLoad(index, 'name', event.target.value)}
                        error={errors[`hydraulicLoads.${index}.name`]}
                      />
                      <TextField
                        label={unitLabel('Flow', 'gpm')}
                        inputMode="decimal"
                        autoComplete="off"
                        value={load.flowGpm}
                        onChange={(event) => setLoad(index, 'flowGpm', event.target.value)}
                        error={errors[`hydraulicLoads.${index}.flowGpm`]}
                      />
                      <TextField
                        label={unitLabel('Pressure', 'psi')}
                        inputMode="decimal"
                        autoComplete="off"
                        hint="Blank: the tractor’s"
                        value={load.pressurePsi}
                        onChange={(event) => setLoad(index, 'pressurePsi', event.target.value)}
                        error={errors[`hydraulicLoads.${index}.pressurePsi`]}
                      />
                      <TextField
                        label="Circuit"
                        autoComplete="off"
                        hint="Optional"
                        value={load.circuit}
                        onChange={(event) => setLoad(index, 'circuit', event.target.value)}
                        error={errors[`hydraulicLoads.${index}.circuit`]}
                      />
                      <div className="flex items-end">
                        <Button
                          variant="ghost"
                          aria-label={`Remove load ${index + 1}${load.name ? ` (${load.name})` : ''}`}
                          onClick={() => setValues({ ...values, hydraulicLoads: values.hydraulicLoads.filter((_, i) => i !== index) })}
                        >
                          Remove
                        </Button>
                      </div>
                    </div>
                  </li>
                ))}
              </ol>
              {errors.hydraulicLoads && <p className="mt-2 text-sm font-semibold text-brick-700">{errors.hydraulicLoads}</p>}
              <Button
                variant="secondary"
                className="mt-3"
                onClick={() => setValues({ ...values, hydraulicLoads: [...values.hydraulicLoads, emptyLoad()] })}
                disabled={values.hydraulicLoads.length >= 32}
              >
                Add a load
              </Button>
            </fieldset>
          </div>
        </form>
        <SizingReport comparison={comparison} baseInput={state.baseInput} changedInput={state.input} compareLabel="pinned" />
      </div>
    </>
  );
}
