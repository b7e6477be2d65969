import { EmptyState } from '@/components/ui/states';
import { cn } from '@/lib/cn';
import type { Roadmap, StrategySummary } from '../api/types';
import { goalFate, STRATEGY_HINTS, STRATEGY_LABELS, summariseCompare } from '../model/compare';
import { formatUsd, formatUsdChange } from '../model/format';
import { CheckIcon, WarnIcon } from './bits';

const order = ['planner', 'cheapest-first', 'as-asked'] as const;

function GoalCell({ metSeason, targetSeason }: { metSeason: number | null | undefined; targetSeason: number }) {
  const fate = goalFate(metSeason, targetSeason);
  if (fate === 'on-time')
    return (
      <span className="inline-flex items-center gap-1.5 font-semibold text-seedling-800">
        <CheckIcon className="size-4" /> {metSeason} <span className="font-normal text-loam-700">on time</span>
      </span>
    );
  if (fate === 'late')
    return (
      <span className="inline-flex items-center gap-1.5 font-semibold text-amber-800">
        <WarnIcon className="size-4" /> {metSeason} <span className="font-normal">late</span>
      </span>
    );
  return (
    <span className="inline-flex items-center gap-1.5 font-semibold text-brick-800">
      <svg viewBox="0 0 12 12" className="size-3.5" aria-hidden="true">
        <path d="M2 2l8 8M10 2 2 10" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />
      </svg>
      not met
    </span>
  );
}

/**
 * Rowpath's order beside the naive ones (cheapest part first; the goals in the order asked): the
 * money each throws away, what each costs, the season each goal is met, and why the waste happens.
 */
export function CompareView({ roadmap }: { roadmap: Roadmap }) {
  if (roadmap.goals.length === 0 || roadmap.compare.length === 0) {
    return (
      <EmptyState title="Nothing to compare yet">
        Record the grower’s goals and budgets; Rowpath then sets its order beside a naive one.
      </EmptyState>
    );
  }
  const strategies = order.map((name) => roadmap.compare.find((c) => c.strategy === name)).filter((c): c is StrategySummary => Boolean(c));
  const { planner, worstNaive, avoidedUsd } = summariseCompare(roadmap.compare);
  const leastWaste = Math.min(...strategies.map((s) => s.wasteUsd));
  const leastCost = Math.min(...strategies.map((s) => s.totalCostUsd));

  return (
    <div className="space-y-5" data-compare-view>
      {planner && worstNaive && (
        <p className="rounded-xl border border-loam-200 bg-white px-5 py-4 text-lg text-ink-950 shadow-sm" data-compare-headline>
          Rowpath’s order throws away <strong className="tabular">{formatUsd(planner.wasteUsd)}</strong>.{' '}
          {STRATEGY_LABELS[worstNaive.strategy]} throws away <strong className="tabular">{formatUsd(worstNaive.wasteUsd)}</strong>
          {avoidedUsd > 0.5 ? (
            <>
              {' '}— <strong className="tabular">{formatUsd(avoidedUsd)}</strong> more, in parts the grower would pay for and pull off before the end of their life.
            </>
          ) : (
            '.'
          )}
        </p>
      )}
      {planner && Math.abs(planner.wasteUsd - (roadmap.wasteUsd ?? 0)) > 0.5 && roadmap.feasible && (
        <p className="text-loam-800">
          Rowpath’s order here is planned afresh from the goals and budgets. The roadmap as it stands (with its moves and commitments) throws away {formatUsd((roadmap.wasteUsd ?? 0))}.
        </p>
      )}

      <div className="overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm" role="region" aria-label="The orders compared" tabIndex={0}>
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Waste, cost and the season each goal is met, for Rowpath’s order and the naive orders</caption>
          <thead className="bg-loam-100 text-loam-800">
            <tr>
              <th scope="col" className="px-4 py-3 font-semibold">
                <span className="sr-only">Measure</span>
              </th>
              {strategies.map((s) => (
                <th key={s.strategy} scope="col" className={cn('px-4 py-3 align-bottom', s.strategy === 'planner' && 'bg-ink-50')} data-strategy={s.strategy}>
                  <span className="block text-lg font-bold text-ink-900">{STRATEGY_LABELS[s.strategy]}</span>
                  <span className="block max-w-64 text-sm font-normal text-loam-700">{STRATEGY_HINTS[s.strategy]}</span>
                </th>
              ))}
            </tr>
          </thead>
          <tbody className="divide-y divide-loam-200">
            <tr>
              <th scope="row" className="px-4 py-3 font-semibold text-ink-900">
                Thrown away
                <span className="block text-sm font-normal text-loam-700">value left in parts removed early</span>
              </th>
              {strategies.map((s) => (
                <td key={s.strategy} className={cn('px-4 py-3 tabular', s.strategy === 'planner' && 'bg-ink-50/60')} data-strategy-waste={s.strategy} data-waste-usd={s.wasteUsd}>
                  <span className="text-xl font-bold text-ink-950">{formatUsd(s.wasteUsd)}</span>
                  {s.wasteUsd === leastWaste ? (
                    <span className="ml-2 inline-flex items-center gap-1 text-sm font-semibold text-seedling-800">
                      <CheckIcon className="size-4" /> least
                    </span>
                  ) : (
                    planner && <span className="ml-2 text-sm font-semibold text-brick-800">{formatUsdChange(s.wasteUsd - planner.wasteUsd)} vs Rowpath</span>
                  )}
                </td>
              ))}
            </tr>
            <tr>
              <th scope="row" className="px-4 py-3 font-semibold text-ink-900">
                Total cost
                <span className="block text-sm font-normal text-loam-700">parts + labour over the roadmap</span>
              </th>
              {strategies.map((s) => (
                <td key={s.strategy} className={cn('px-4 py-3 tabular', s.strategy === 'planner' && 'bg-ink-50/60')}>
                  <span className="text-lg font-semibold text-ink-950">{formatUsd(s.totalCostUsd)}</span>
                  {s.totalCostUsd === leastCost && <span className="ml-2 text-sm text-loam-700">lowest</span>}
                </td>
              ))}
            </tr>
            {roadmap.goals.map((goal) => (
              <tr key={goal.id}>
                <th scope="row" className="px-4 py-3 font-semibold text-ink-900">
                  {goal.label}
                  <span className="block text-sm font-normal text-loam-700">wanted by {goal.targetSeason}</span>
                </th>
                {strategies.map((s) => (
                  <td key={s.strategy} className={cn('px-4 py-3 tabular', s.strategy === 'planner' && 'bg-ink-50/60')}>
                    <GoalCell metSeason={s.goalMetSeasons[String(goal.id)]} targetSeason={goal.targetSeason} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <div className="grid gap-4 lg:grid-cols-3">
        {strategies.map((s) => (
          <section key={s.strategy} aria-labelledby={`strategy-${s.strategy}`} className={cn('rounded-xl border bg-white p-4 shadow-sm', s.strategy === 'planner' ? 'border-ink-300' : 'border-loam-200')}>
            <h3 id={`strategy-${s.strategy}`} className="text-lg font-bold text-ink-900">
              {STRATEGY_LABELS[s.strategy]}
            </h3>
            <h4 className="mt-3 font-semibold text-ink-900">What it throws away</h4>
            {s.wasteItems.length === 0 ? (
              <p className="mt-1 flex items-center gap-2 text-seedling-800">
                <CheckIcon className="size-4" /> Nothing: every part serves to the end of the roadmap.
              </p>
            ) : (
              <ul className="mt-1 space-y-2" data-waste-items={s.strategy}>
                {s.wasteItems.map((w, i) => (
                  <li key={`${w.partId}-${w.season}-${i}`} className="flex items-start gap-2 text-loam-900">
                    <WarnIcon className="mt-0.5 size-4 text-amber-700" />
                    <span>
                      <span className="font-semibold">{formatUsd(w.remainingValueUsd)}</span> — {w.explanation}
                    </span>
                  </li>
                ))}
              </ul>
            )}
            <h4 className="mt-4 font-semibold text-ink-900">What it buys</h4>
            <ol className="mt-1 space-y-1.5">
              {s.seasons
                .filter((season) => season.items.length > 0)
                .map((season) => (
                  <li key={season.season} className="text-loam-900">
                    <span className="font-semibold tabular">{season.season}</span> <span className="text-loam-700 tabular">({formatUsd(season.costUsd)})</span>:{' '}
                    {season.items.map((it) => it.partName).join(', ')}
                  </li>
                ))}
            </ol>
          </section>
        ))}
      </div>
    </div>
  );
}
