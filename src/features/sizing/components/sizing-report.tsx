import type { ReactNode } from 'react';
import { AUX_PUMP_RESERVE, CAUTIONS, TIGHT_UTILISATION, type HydraulicVerdict, type SizingDelta } from '@shared/calc/sizing';
import type { SizingInput } from '@shared/schemas/sizing';
import { StatusBadge, type BadgeShape, type BadgeTone } from '@/components/ui/status-badge';
import { cn } from '@/lib/cn';
import {
  AUX_PUMP_FIGURES,
  CAPACITY_FIGURES,
  HYDRAULIC_FIGURES,
  LIQUID_FIGURES,
  SEED_FIGURES,
  SUPPLY_KINDS,
  VERDICT_WORDS,
  limitingSupplyText,
  stopFigures,
  supplyName,
  viewFigure,
  type FigureDef,
  type FigureView,
} from '../model/figures';
import { formatNumber, formatWithUnit } from '../model/format';
import { ChangeNote, FigureCard, FigureGrid, FigureValue } from './figure-card';

export interface SizingReportProps {
  comparison: SizingDelta;
  baseInput: SizingInput;
  changedInput: SizingInput;
  /** How the comparison is named: "stored" (the planter as stored) or "pinned". */
  compareLabel: string;
  /** The installed meter (or delivery) whose rating sets the top speed. */
  meterName?: string | null;
  tractorName?: string | null;
  tractorPtoHp?: number | null;
}

type View = (def: FigureDef) => FigureView;

const VERDICT_BADGE: Record<HydraulicVerdict, { tone: BadgeTone; shape: BadgeShape }> = {
  ok: { tone: 'good', shape: 'dot' },
  tight: { tone: 'soon', shape: 'triangle' },
  over: { tone: 'bad', shape: 'cross' },
};

export function VerdictBadge({ verdict }: { verdict: HydraulicVerdict }) {
  const { tone, shape } = VERDICT_BADGE[verdict];
  return (
    <span data-hydraulic-verdict={verdict}>
      <StatusBadge tone={tone} shape={shape}>
        {VERDICT_WORDS[verdict].label}
      </StatusBadge>
    </span>
  );
}

function Section({ id, title, intro, children }: { id: string; title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="rounded-xl border border-loam-200 bg-white p-4 shadow-sm sm:p-5">
      <h2 id={id} className="text-lg font-bold text-ink-900">
        {title}
      </h2>
      {intro && <p className="mt-1 max-w-prose text-loam-700">{intro}</p>}
      <div className="mt-4 space-y-4">{children}</div>
    </section>
  );
}

/** A warning sign with a short list: safety notes, deferring to the manuals and local rules. */
export function Cautions({ title, items }: { title: string; items: readonly string[] }) {
  if (items.length === 0) return null;
  return (
    <aside aria-label={title} className="rounded-lg border border-amber-300 bg-amber-50 p-3 text-amber-900">
      <p className="flex items-center gap-2 font-semibold">
        <svg viewBox="0 0 20 20" className="size-5 shrink-0" aria-hidden="true">
          <path d="M10 2 19 18H1L10 2Z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
          <path d="M10 8v4" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
          <circle cx="10" cy="15" r="1.1" fill="currentColor" />
        </svg>
        {title}
      </p>
      <ul className="mt-1 list-disc space-y-1 pl-6 text-sm">
        {items.map((item) => (
          <li key={item}>{item}</li>
        ))}
      </ul>
    </aside>
  );
}

function Warnings({ items }: { items: string[] }) {
  if (items.length === 0) return null;
  return (
    <ul className="space-y-2" aria-label="Points to check">
      {items.map((item) => (
        <li key={item} className="flex items-start gap-2 rounded-lg border border-brick-300 bg-brick-50 p-3 font-semibold text-brick-800">
          <svg viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0" aria-hidden="true">
            <path d="M10 2 19 18H1L10 2Z" fill="currentColor" />
            <path d="M10 8v4.5" stroke="white" strokeWidth="2" strokeLinecap="round" />
            <circle cx="10" cy="15.2" r="1.1" fill="white" />
          </svg>
          <span>{item}</span>
        </li>
      ))}
    </ul>
  );
}

/** Which caution lists computeSizing attached to these figures (it decides where they belong). */
function cautionsFor(cautions: string[]) {
  const has = (list: readonly string[]) => list.length > 0 && cautions.includes(list[0]);
  return { hydraulic: has(CAUTIONS.hydraulic), starter: has(CAUTIONS.starter), raisedToolbar: has(CAUTIONS.raisedToolbar) };
}

const isMeterWarning = (text: string) => text.includes('seeds/s');

// ---------------------------------------------------------------------------------------------

export function SizingReport(props: SizingReportProps) {
  const { comparison, baseInput, changedInput, compareLabel } = props;
  const view: View = (def) => viewFigure(def, comparison, baseInput, changedInput);
  const result = comparison.changed;
  const cautions = cautionsFor(result.cautions);
  const meterWarnings = result.warnings.filter(isMeterWarning);
  const otherWarnings = result.warnings.filter((w) => !isMeterWarning(w));

  return (
    <div className="space-y-5">
      <Section id="sizing-capacity" title="Field capacity and acres per day" intro="How much ground the planter covers, and what refills cost the day.">
        <FigureGrid views={CAPACITY_FIGURES.map(view)} compareLabel={compareLabel} />
        <Warnings items={otherWarnings} />
        <RefillTable view={view} compareLabel={compareLabel} comparison={comparison} />
      </Section>
      <Section id="sizing-seed" title="Seed placement and the meter" intro={props.meterName ? `Installed meter limit from the catalog: ${props.meterName}.` : undefined}>
        <FigureGrid views={SEED_FIGURES.map(view)} compareLabel={compareLabel} />
        <Warnings items={meterWarnings} />
      </Section>
      <Section id="sizing-liquid" title="Liquid starter" intro="Flow the liquid system must pass at this speed, and how far one fill goes.">
        {changedInput.liquidGpa === undefined && comparison.base.gpmPerRow === undefined ? (
          <p className="text-loam-700">This set-up carries no liquid tanks. Add tanks in the what-if to see the flows.</p>
        ) : (
          <FigureGrid views={LIQUID_FIGURES.map(view)} compareLabel={compareLabel} />
        )}
        {cautions.starter && <Cautions title="Handling starter fertilizer" items={CAUTIONS.starter} />}
      </Section>
      <HydraulicSection {...props} view={view} cautions={cautions} />
    </div>
  );
}

// ---------------------------------------------------------------------------------------------

function HeadlineTile({ title, children, className }: { title: string; children: ReactNode; className?: string }) {
  return (
    <div className={cn('rounded-xl border border-loam-200 bg-white p-4 shadow-sm', className)}>
      <p className="text-sm font-semibold text-loam-700">{title}</p>
      <div className="mt-1">{children}</div>
    </div>
  );
}

/** The four answers a grower asks first: acres a day, what limits it, the hydraulics, the meter. */
export function SizingHeadline({ comparison, baseInput, changedInput, compareLabel }: SizingReportProps) {
  const view: View = (def) => viewFigure(def, comparison, baseInput, changedInput);
  const result = comparison.changed;
  const acres = view(CAPACITY_FIGURES.find((f) => f.key === 'acresPerDay')!);
  const limiting = limitingSupplyText({ result, input: changedInput });
  const budget = result.hydraulic;
  const baseVerdict = comparison.base.hydraulic?.verdict;
  const speed = changedInput.speedMph;
  const top = result.maxSpeedMph;

  return (
    <div className="mb-6 grid gap-3 sm:grid-cols-2 xl:grid-cols-4" aria-label="Headline figures" role="group">
      <HeadlineTile title="Acres per day">
        <p className="flex flex-wrap items-baseline gap-x-2">
          <span className="text-3xl font-bold text-ink-900 tabular">{acres.text ?? '—'}</span>
        </p>
        <ChangeNote view={acres} compareLabel={compareLabel} />
      </HeadlineTile>
      <HeadlineTile title="Limiting supply">
        <p className="font-semibold text-ink-900" data-limiting-supply={result.limitingSupply ?? 'none'}>
          {limiting ?? 'Needs a speed, field efficiency and field hours.'}
        </p>
        {comparison.base.limitingSupply !== result.limitingSupply && comparison.base.acresPerDay !== undefined && (
          <p className="text-sm text-loam-700">
            As {compareLabel}: {comparison.base.limitingSupply ? `${supplyName(comparison.base.limitingSupply).toLowerCase()} refills` : 'no refill stops'}.
          </p>
        )}
      </HeadlineTile>
      <HeadlineTile title="Hydraulic budget">
        {budget ? (
          <>
            <VerdictBadge verdict={budget.verdict} />
            <p className="mt-1 text-sm text-ink-900">
              {formatWithUnit(budget.demandGpm, 1, 'gpm')} needed of {formatWithUnit(budget.supplyGpm, 1, 'gpm')} supplied
              {budget.recommendAuxPump ? `; an auxiliary pump of at least ${formatWithUnit(budget.auxPumpGpm, 1, 'gpm')} is advised.` : '.'}
            </p>
            {baseVerdict && baseVerdict !== budget.verdict && (
              <p className="text-sm text-loam-700">
                As {compareLabel}: {VERDICT_WORDS[baseVerdict].label}.
              </p>
            )}
          </>
        ) : (
          <p className="text-loam-700">Needs hydraulic loads and a tractor.</p>
        )}
      </HeadlineTile>
      <HeadlineTile title="Meter at this speed">
        {top !== undefined && speed !== undefined ? (
          speed <= top ? (
            <>
              <StatusBadge tone="good" shape="dot">
                Holds
              </StatusBadge>
              <p className="mt-1 text-sm text-ink-900">
                Up to {formatWithUnit(top, 1, 'mph', 'down')} at {formatNumber(changedInput.populationPerAcre ?? 0, 0)} seeds/ac; planting at{' '}
                {formatWithUnit(speed, 1, 'mph')}.
              </p>
            </>
          ) : (
            <>
              <StatusBadge tone="bad" shape="cross">
                Too fast
              </StatusBadge>
              <p className="mt-1 text-sm text-ink-900">
                {formatWithUnit(speed, 1, 'mph')} is above the meter’s {formatWithUnit(top, 1, 'mph', 'down')} at this population.
              </p>
            </>
          )
        ) : (
          <p className="text-loam-700">No installed meter has a rated seed rate.</p>
        )}
      </HeadlineTile>
    </div>
  );
}

// ---------------------------------------------------------------------------------------------

function StopCell({ view, compareLabel }: { view: FigureView; compareLabel: string }) {
  return (
    <td className="px-2 py-2 text-right align-top">
      <FigureValue view={view} className="font-semibold whitespace-nowrap text-ink-900" />
      <ChangeNote view={view} compareLabel={compareLabel} className="mt-0.5 block" compact />
    </td>
  );
}

function RefillTable({ view, compareLabel, comparison }: { view: View; compareLabel: string; comparison: SizingDelta }) {
  const result = comparison.changed;
  const kinds = SUPPLY_KINDS.filter((k) => result.acresPerFill?.[k] !== undefined || comparison.base.acresPerFill?.[k] !== undefined);
  if (kinds.length === 0) {
    return <p className="text-loam-700">No seed, liquid or dry capacity is recorded, so no refill stops are counted.</p>;
  }
  return (
    <div className="overflow-x-auto rounded-lg border border-loam-200" role="region" aria-label="Refill stops by supply" tabIndex={0}>
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Refill stops by supply</caption>
        <thead className="bg-loam-100 text-sm text-loam-800">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">
              Supply
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Acres per fill
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Stops per day
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Hours lost
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-loam-200">
          {kinds.map((kind) => {
            const figures = stopFigures(kind);
            const limits = result.limitingSupply === kind;
            return (
              <tr key={kind} className={limits ? 'bg-amber-50' : undefined}>
                <th scope="row" className="py-2 pr-2 pl-3 align-top font-semibold text-ink-900">
                  {supplyName(kind)}
                  {limits && (
                    <span className="mt-1 block">
                      <StatusBadge tone="soon" shape="triangle">
                        Limits the day
                      </StatusBadge>
                    </span>
                  )}
                </th>
                <StopCell view={view(figures.acresPerFill)} compareLabel={compareLabel} />
                <StopCell view={view(figures.stopsPerDay)} compareLabel={compareLabel} />
                <StopCell view={view(figures.hoursLost)} compareLabel={compareLabel} />
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="border-t border-loam-200 px-3 py-2 text-sm text-loam-700">
        Changes under each figure are against the {compareLabel} figures. Acres per fill: seed units × seeds per unit ÷ seeds per acre; tank gallons ÷ gallons per acre; box pounds ÷ pounds per acre (common
        practice). Stops per day: acres per day ÷ acres per fill. Hours lost: stops × minutes per stop ÷ 60. Each supply is filled on its own
        stop, which errs toward fewer acres.
      </p>
    </div>
  );
}

// ---------------------------------------------------------------------------------------------

function DemandBar({ demandGpm, supplyGpm, verdict }: { demandGpm: number; supplyGpm: number; verdict: HydraulicVerdict }) {
  // The scale reaches the larger of demand and supply, so an overload shows past the supply line.
  const scale = Math.max(demandGpm, supplyGpm) || 1;
  const demandPct = (demandGpm / scale) * 100;
  const supplyPct = (supplyGpm / scale) * 100;
  const tightPct = (supplyGpm * TIGHT_UTILISATION * 100) / scale;
  const fill = verdict === 'ok' ? 'bg-seedling-600' : verdict === 'tight' ? 'bg-amber-500' : 'bg-brick-600';
  return (
    <div>
      <div className="relative h-6 rounded bg-loam-100 ring-1 ring-loam-300 ring-inset" aria-hidden="true">
        <div className={cn('absolute inset-y-0 left-0 rounded-l', fill)} style={{ width: `${demandPct}%` }} />
        <div className="absolute inset-y-[-4px] w-0.5 bg-ink-900" style={{ left: `calc(${supplyPct}% - 1px)` }} />
        <div className="absolute inset-y-0 w-0 border-l-2 border-dashed border-ink-700" style={{ left: `${tightPct}%` }} />
      </div>
      <p className="mt-1 text-sm text-loam-700">
        Filled bar: demand. Solid line: the tractor’s {formatWithUnit(supplyGpm, 1, 'gpm')}. Dashed line: 85 % of it.
      </p>
    </div>
  );
}

function HydraulicSection({
  comparison,
  changedInput,
  compareLabel,
  tractorName,
  tractorPtoHp,
  view,
  cautions,
}: SizingReportProps & { view: View; cautions: ReturnType<typeof cautionsFor> }) {
  const result = comparison.changed;
  const budget = result.hydraulic;
  const loads = changedInput.hydraulicLoads ?? [];
  const auxViews = AUX_PUMP_FIGURES.map(view);
  const reasons = (budget?.reasons ?? []).filter((r) => !r.startsWith('An auxiliary'));
  const gapGpm = budget?.recommendAuxPump ? budget.auxPumpGpm / (1 + AUX_PUMP_RESERVE) : 0;

  return (
    <Section
      id="sizing-hydraulics"
      title="Hydraulic budget"
      intro={tractorName ? `The planter’s hydraulic loads against ${tractorName}.` : 'The planter’s hydraulic loads against the tractor’s flow and remote valves.'}
    >
      {budget ? (
        <div className="space-y-3">
          <div className="flex flex-wrap items-center gap-3">
            <VerdictBadge verdict={budget.verdict} />
            <p className="font-semibold text-ink-900">{VERDICT_WORDS[budget.verdict].detail}</p>
          </div>
          <DemandBar demandGpm={budget.demandGpm} supplyGpm={budget.supplyGpm} verdict={budget.verdict} />
          {reasons.length > 0 && (
            <ul className="list-disc space-y-1 pl-6 text-ink-900">
              {reasons.map((reason) => (
                <li key={reason}>{reason}</li>
              ))}
            </ul>
          )}
        </div>
      ) : loads.length === 0 ? (
        <p className="text-loam-700">No installed part draws hydraulic oil, by the catalog’s flows.</p>
      ) : (
        <p className="text-loam-700">Choose a tractor to weigh these loads against its flow and remote valves.</p>
      )}

      {(budget || loads.length > 0) && <FigureGrid views={HYDRAULIC_FIGURES.map(view)} compareLabel={compareLabel} />}

      {loads.length > 0 && (
        <div>
          <h3 className="font-semibold text-ink-900">Loads counted while planting</h3>
          <ul className="mt-1 divide-y divide-loam-200 rounded-lg border border-loam-200">
            {loads.map((load, index) => (
              <li key={`${load.name}-${index}`} className="flex justify-between gap-4 px-3 py-2">
                <span>
                  {load.name}
                  {load.circuit ? <span className="text-loam-700"> · circuit {load.circuit}</span> : null}
                </span>
                <span className="tabular">
                  {formatWithUnit(load.flowGpm, 1, 'gpm')}
                  {load.pressurePsi ? ` at ${formatWithUnit(load.pressurePsi, 0, 'psi')}` : ''}
                </span>
              </li>
            ))}
          </ul>
          <p className="mt-1 text-sm text-loam-700">The fold is left out: it does not run while planting.</p>
        </div>
      )}

      {budget &&
        (budget.recommendAuxPump ? (
          <div className="rounded-lg border-2 border-ink-300 p-3" data-aux-pump="recommended">
            <h3 className="flex items-center gap-2 font-bold text-ink-900">
              <StatusBadge tone="info" shape="ring">
                Advised
              </StatusBadge>
              An auxiliary PTO-driven hydraulic pump
            </h3>
            <p className="mt-1 text-ink-900">
              The tractor’s remotes cannot carry the load. A PTO-driven pump of at least {formatWithUnit(budget.auxPumpGpm, 1, 'gpm')} closes a gap
              of {formatWithUnit(gapGpm, 1, 'gpm')}, with a margin of {formatWithUnit(budget.auxPumpGpm - gapGpm, 1, 'gpm')} (
              {formatNumber(AUX_PUMP_RESERVE * 100, 0)} %) so it does not run at its limit.
              {tractorPtoHp ? ` The tractor’s PTO is rated ${formatWithUnit(tractorPtoHp, 0, 'hp')}.` : ''}
            </p>
            <dl className="mt-3 grid gap-3 sm:grid-cols-2">
              {auxViews.map((v) => (
                <FigureCard key={v.def.key} view={v} compareLabel={compareLabel} />
              ))}
            </dl>
          </div>
        ) : (
          <p className="text-ink-900" data-aux-pump="not-needed">
            No auxiliary pump is needed: the tractor’s flow and remote valves carry the load.
          </p>
        ))}

      {(cautions.hydraulic || cautions.raisedToolbar) && (
        <Cautions
          title="Hydraulic pressure and raised toolbars"
          items={[...(cautions.hydraulic ? CAUTIONS.hydraulic : []), ...(cautions.raisedToolbar ? CAUTIONS.raisedToolbar : [])]}
        />
      )}
    </Section>
  );
}
