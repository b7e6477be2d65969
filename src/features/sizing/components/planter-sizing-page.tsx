import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { DEFAULT_ASSUMPTIONS, meterLimitSeedsPerSecond } from '@shared/calc/planter-sizing';
import { sizingDelta } from '@shared/calc/sizing';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock, Skeleton } from '@/components/ui/states';
import { isApiError } from '@/lib/api';
import { accountTractorsQueryOptions, planterForSizingQueryOptions } from '../api/sizing-queries';
import { formatNumber } from '../model/format';
import {
  DEFAULT_CELLS_PER_DISC,
  changeWhatIf,
  initialWhatIf,
  startWhatIf,
  storedInput,
  tractorChoices,
  type PlanterSizingRecord,
  type WhatIfField,
  type WhatIfState,
} from '../model/planter-what-if';
import { SizingHeadline, SizingReport } from './sizing-report';
import { WhatIfControls } from './what-if-controls';

export function parsePlanterId(raw: string | undefined): number | null {
  return raw && /^\d{1,9}$/.test(raw) && Number(raw) > 0 ? Number(raw) : null;
}

function BackLink({ planterId }: { planterId: number | null }) {
  return (
    <Link
      to={planterId ? `/planters/${planterId}` : '/accounts'}
      className="-ml-2 mb-2 inline-flex min-h-11 items-center gap-1 rounded px-2 font-semibold text-ink-700 hover:underline"
    >
      <span aria-hidden="true">←</span> {planterId ? 'The planter' : 'All accounts'}
    </Link>
  );
}

/** /planters/:id/sizing — the Sizing panel of one stored planter. */
export function PlanterSizingPage() {
  const params = useParams();
  const planterId = parsePlanterId(params.id);
  const planter = useQuery({ ...planterForSizingQueryOptions(planterId ?? 0), enabled: planterId !== null });

  if (planterId === null || (planter.isError && isApiError(planter.error) && planter.error.status === 404)) {
    return (
      <>
        <title>Planter not found · Rowpath</title>
        <BackLink planterId={null} />
        <PageHeader title="Planter not found" />
        <EmptyState title="There is no planter at this address that you can open">
          It may have been removed, or it belongs to an operation outside your territory.
        </EmptyState>
      </>
    );
  }
  if (planter.isError) {
    return (
      <>
        <BackLink planterId={planterId} />
        <PageHeader title="Sizing" />
        <ErrorState title="This planter could not be loaded" message={planter.error.message} onRetry={() => void planter.refetch()} retrying={planter.isFetching} />
      </>
    );
  }
  if (planter.isPending) {
    return (
      <>
        <BackLink planterId={planterId} />
        <h1 tabIndex={-1} data-page-title className="sr-only">
          Sizing
        </h1>
        <Skeleton className="mb-6 h-9 w-80" />
        <LoadingBlock label="Loading the planter…" />
      </>
    );
  }
  return <PlanterSizing key={planter.data.id} planter={planter.data} />;
}

function limitingMeterName(planter: PlanterSizingRecord): string | null {
  const limit = meterLimitSeedsPerSecond(planter);
  if (limit === undefined) return null;
  const part = planter.installs.find((i) => i.status === 'installed' && i.component?.maxSeedsPerSecond === limit)?.component;
  return part ? `${part.name}, rated ${formatNumber(limit, 0)} seeds/s per row` : null;
}

function PlanterSizing({ planter }: { planter: PlanterSizingRecord }) {
  const tractorsQuery = useQuery(accountTractorsQueryOptions(planter.accountId));
  const tractors = useMemo(() => tractorChoices(planter, tractorsQuery.data), [planter, tractorsQuery.data]);
  const stored = useMemo(() => initialWhatIf(planter), [planter]);
  const [setup] = useState(() => {
    try {
      return { state: startWhatIf(planter), error: null };
    } catch (error) {
      return { state: null, error: error instanceof Error ? error.message : String(error) };
    }
  });
  const [state, setState] = useState<WhatIfState | null>(setup.state);
  const baseInput = useMemo(() => (setup.state ? storedInput(planter) : null), [planter, setup.state]);
  // Worked out on every change, in the browser, with the functions the server uses.
  const comparison = useMemo(() => (state && baseInput ? sizingDelta(baseInput, state.input) : null), [baseInput, state]);

  const onChange = (field: WhatIfField, text: string) => setState((prev) => prev && changeWhatIf(prev, planter, tractors, field, text));
  const chosenTractor = state?.values.tractorId ? tractors.find((t) => String(t.id) === state.values.tractorId) : undefined;

  const header = (
    <>
      <title>{`Sizing · ${planter.name} · Rowpath`}</title>
      <BackLink planterId={planter.id} />
      <PageHeader
        title={`Sizing: ${planter.name}`}
        description={
          <>
            <Link to={`/accounts/${planter.accountId}`} className="font-semibold text-ink-700 underline underline-offset-4">
              {planter.accountName}
            </Link>{' '}
            · {planter.rows} rows × {formatNumber(planter.rowSpacingIn, 0)} in · {planter.tractor ? `pulled by ${planter.tractor.name}` : 'no tractor recorded'}
          </>
        }
      />
    </>
  );

  if (!state || !comparison || !baseInput) {
    return (
      <>
        {header}
        <ErrorState title="This planter’s record cannot be sized" message={setup.error ?? undefined} />
      </>
    );
  }

  return (
    <>
      {header}
      <SizingHeadline comparison={comparison} baseInput={baseInput} changedInput={state.input} compareLabel="stored" />
      <div className="grid gap-6 xl:grid-cols-[20rem_minmax(0,1fr)] xl:items-start">
        <div className="rounded-xl border border-loam-200 bg-white p-4 shadow-sm xl:sticky xl:top-6 xl:max-h-[calc(100dvh-3rem)] xl:overflow-y-auto">
          <WhatIfControls
            planter={planter}
            values={state.values}
            stored={stored}
            errors={state.errors}
            tractors={tractors}
            tractorsLoading={tractorsQuery.isPending}
            onChange={onChange}
            onReset={() => setState(startWhatIf(planter))}
          />
        </div>
        <SizingReport
          comparison={comparison}
          baseInput={baseInput}
          changedInput={state.input}
          compareLabel="stored"
          meterName={limitingMeterName(planter)}
          tractorName={chosenTractor?.name ?? null}
          tractorPtoHp={chosenTractor?.ptoHp ?? null}
        />
      </div>
      <Assumptions />
    </>
  );
}

function Assumptions() {
  const a = DEFAULT_ASSUMPTIONS;
  return (
    <section aria-labelledby="sizing-assumptions" className="mt-6 rounded-xl border border-dashed border-loam-400 p-4 text-sm text-loam-800">
      <h2 id="sizing-assumptions" className="font-bold text-ink-900">
        What “as stored” means
      </h2>
      <p className="mt-1 max-w-prose">
        The planter, its tractor and its installed parts as recorded, sized at Rowpath’s starting assumptions: {formatNumber(a.speedMph, 1)} mph,{' '}
        {formatNumber(a.populationPerAcre, 0)} seeds/ac, {formatNumber(a.fieldEfficiency * 100, 0)} % field efficiency (planters are tended
        machines; ASABE D497 gives a range, from memory 50–75 %), {formatNumber(a.fieldHoursPerDay, 0)} field hours a day,{' '}
        {formatNumber(a.liquidGpa, 1)} gal/ac liquid, {formatNumber(a.dryLbPerAcre, 0)} lb/ac dry, {formatNumber(a.seedStopMinutes, 0)}-minute seed,{' '}
        {formatNumber(a.liquidStopMinutes, 0)}-minute liquid and {formatNumber(a.dryStopMinutes, 0)}-minute dry stops, {DEFAULT_CELLS_PER_DISC} cells
        per disc (a common corn disc, from memory), and one liquid section per row with row clutches or per toolbar without. Hydraulic demand
        comes from the catalog flows of the installed parts. These figures are for planning: the planter and tractor makers’ manuals and local
        rules come first.
      </p>
    </section>
  );
}
