import type { Roadmap } from '../api/types';
import { summariseCompare, STRATEGY_LABELS } from '../model/compare';
import { formatUsd } from '../model/format';
import { CheckIcon, WarnIcon } from './bits';

/**
 * What the roadmap throws away and which goals it misses, kept in view on every tab: the two
 * things a specialist answers for when a grower asks "why this order?".
 */
export function VerdictStrip({ roadmap }: { roadmap: Roadmap }) {
  const goalLabel = (goalId: string) => {
    const goal = roadmap.goals.find((g) => String(g.id) === goalId);
    return goal ? `${goal.label} (by ${goal.targetSeason})` : `Goal ${goalId}`;
  };
  const { worstNaive } = summariseCompare(roadmap.compare);
  const metOnTime = roadmap.goalOutcomes.filter((o) => o.status === 'met').length;
  const unmet = roadmap.feasible ? roadmap.unmetGoals : [];

  return (
    <section aria-label="What this roadmap wastes and misses" data-roadmap-verdict className="mb-5 space-y-3">
      {!roadmap.feasible && (
        <div role="alert" data-roadmap-problem className="flex items-start gap-3 rounded-xl border-2 border-brick-600 bg-brick-50 px-4 py-3 text-brick-900">
          <WarnIcon className="mt-0.5 size-6 text-brick-700" />
          <div>
            <p className="font-bold">This order does not work as it stands.</p>
            <p>{roadmap.problem}</p>
            <p className="mt-1 text-sm">Move the item back, or press “Plan again” to let Rowpath re-sequence the open items.</p>
          </div>
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-3">
        <div className="rounded-xl border border-loam-200 bg-white px-4 py-3 shadow-sm" data-waste-usd={roadmap.feasible ? (roadmap.wasteUsd ?? 0) : ''}>
          <p className="text-sm font-semibold text-loam-700">Thrown away by this roadmap</p>
          {roadmap.feasible ? (
            <p className="flex items-center gap-2 text-2xl font-bold text-ink-950 tabular">
              {(roadmap.wasteUsd ?? 0) > 0.5 ? <WarnIcon className="text-amber-600" /> : <CheckIcon className="text-seedling-600" />}
              {formatUsd((roadmap.wasteUsd ?? 0))}
            </p>
          ) : (
            <p className="font-semibold text-brick-800">Not valued until the order works</p>
          )}
          {roadmap.wasteItems.length > 0 && roadmap.feasible && <p className="text-sm text-loam-700">{roadmap.wasteItems.map((w) => w.partName).join(', ')} removed before the end of its life</p>}
        </div>
        <div className="rounded-xl border border-loam-200 bg-white px-4 py-3 shadow-sm">
          <p className="text-sm font-semibold text-loam-700">{worstNaive ? `${STRATEGY_LABELS[worstNaive.strategy]} would throw away` : 'A naive order'}</p>
          {worstNaive ? (
            <p className="text-2xl font-bold text-ink-950 tabular">{formatUsd(worstNaive.wasteUsd)}</p>
          ) : (
            <p className="text-loam-700">Record a goal to compare orders.</p>
          )}
        </div>
        <div className="rounded-xl border border-loam-200 bg-white px-4 py-3 shadow-sm">
          <p className="text-sm font-semibold text-loam-700">Goals</p>
          {roadmap.goals.length === 0 ? (
            <p className="text-loam-700">No goals recorded yet.</p>
          ) : roadmap.feasible ? (
            <p className="flex items-center gap-2 text-2xl font-bold text-ink-950 tabular">
              {unmet.length === 0 ? <CheckIcon className="text-seedling-600" /> : <WarnIcon className="text-brick-700" />}
              {metOnTime} of {roadmap.goals.length} on time
            </p>
          ) : (
            <p className="font-semibold text-brick-800">Not checked until the order works</p>
          )}
        </div>
      </div>
      {unmet.length > 0 && (
        <div className="rounded-xl border border-amber-300 bg-amber-50 px-4 py-3 text-amber-900" data-unmet-goals>
          <p className="font-bold">Goals this roadmap does not meet on time</p>
          <ul className="mt-1 space-y-1">
            {unmet.map((g) => (
              <li key={g.goalId} className="flex items-start gap-2">
                <WarnIcon className="mt-0.5 size-4 text-amber-700" />
                <span>
                  <span className="font-semibold">{goalLabel(g.goalId)}</span> — {g.status === 'late' ? `late, met in ${g.metSeason}` : 'not met'}: {g.reason}
                </span>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
