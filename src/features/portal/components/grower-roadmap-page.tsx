import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { GoalsPanel } from '@/features/goals/components/goals-panel';
import { quotesQueryOptions } from '@/features/quotes/api/quotes';
import { QuoteCard } from '@/features/quotes/components/quote-card';
import { roadmapQueryOptions, type Roadmap } from '@/features/roadmap/api/roadmap';
import { SeasonBoard } from '@/features/roadmap/components/season-board';
import { formatUsd } from '@/features/roadmap/model/format';
import { QuoteDecision } from './quote-decision';

/**
 * The grower's side of the roadmap: quotes waiting for an answer first (accept or decline, with a
 * confirmation), then the roadmap season by season, read-only, and the goals it serves.
 */
export function GrowerRoadmapPage() {
  const user = useCurrentUser();
  if (user.accountId === null) {
    return (
      <>
        <PageHeader title="Your upgrade roadmap" />
        <EmptyState title="Your sign-in is not linked to a farm account yet">Ask your planting specialist or the dealership to link it.</EmptyState>
      </>
    );
  }
  return <GrowerRoadmap accountId={user.accountId} />;
}

/** The roadmap and open quotes of the grower's own account; usable on its own (e.g. on the grower's home). */
export function GrowerRoadmap({ accountId, headingLevel = 'h1' }: { accountId: number; headingLevel?: 'h1' | 'h2' }) {
  const roadmap = useQuery(roadmapQueryOptions(accountId));
  const quotes = useQuery(quotesQueryOptions(accountId));
  const [result, setResult] = useState<string | null>(null);
  const open = quotes.data?.filter((q) => q.status === 'open') ?? [];
  const decided = quotes.data?.filter((q) => q.status !== 'open') ?? [];

  return (
    <>
      <title>Your upgrade roadmap · Rowpath</title>
      {headingLevel === 'h1' ? (
        <PageHeader title="Your upgrade roadmap" description="What your planting specialist plans for your planters, season by season, and the quotes waiting for your answer." />
      ) : (
        <h2 className="mb-4 text-2xl font-bold text-ink-900">Your upgrade roadmap</h2>
      )}

      <div role="status" aria-live="polite" className="empty:hidden" data-decision-result>
        {result && <p className="mb-4 rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 text-lg font-semibold text-seedling-800">✓ {result}</p>}
      </div>

      <section aria-labelledby="open-quotes-title" className="mb-8">
        <h2 id="open-quotes-title" className="mb-3 text-xl font-bold text-ink-900">
          Quotes waiting for your answer
        </h2>
        {quotes.isPending && <LoadingBlock label="Loading your quotes…" />}
        {quotes.isError && <ErrorState title="Your quotes could not be loaded" message={quotes.error.message} onRetry={() => void quotes.refetch()} />}
        {quotes.isSuccess && open.length === 0 && <p className="text-loam-800">None right now.</p>}
        <div className="space-y-4">
          {open.map((q) => (
            <QuoteCard key={q.id} quote={q} growerView>
              <QuoteDecision quote={q} onDecided={setResult} />
            </QuoteCard>
          ))}
        </div>
      </section>

      {roadmap.isPending && <LoadingBlock label="Loading your roadmap…" />}
      {roadmap.isError && <ErrorState title="Your roadmap could not be loaded" message={roadmap.error.message} onRetry={() => void roadmap.refetch()} />}
      {roadmap.isSuccess && <GrowerSeasons accountId={accountId} roadmap={roadmap.data} />}

      {decided.length > 0 && (
        <section aria-labelledby="earlier-quotes-title" className="mt-8">
          <h2 id="earlier-quotes-title" className="mb-3 text-xl font-bold text-ink-900">
            Earlier quotes
          </h2>
          <div className="space-y-4">
            {decided.map((q) => (
              <QuoteCard key={q.id} quote={q} growerView />
            ))}
          </div>
        </section>
      )}
    </>
  );
}

function GrowerSeasons({ accountId, roadmap }: { accountId: number; roadmap: Roadmap }) {
  const goals = useMemo(() => new Map(roadmap.goals.map((g) => [g.id, g])), [roadmap.goals]);
  const total = roadmap.seasons.reduce((s, x) => s + x.costUsd, 0);
  const naive = roadmap.naive;
  return (
    <section aria-labelledby="grower-seasons-title" className="space-y-5">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="grower-seasons-title" className="text-xl font-bold text-ink-900">
            Season by season
          </h2>
          <p className="text-loam-800">
            {formatUsd(total)} over {roadmap.horizonSeasons} seasons.{' '}
            {roadmap.feasible && naive && naive.wasteUsd > (roadmap.wasteUsd ?? 0) + 0.5
              ? `In this order ${formatUsd((roadmap.wasteUsd ?? 0))} of parts is retired early; buying the cheapest parts first would throw away ${formatUsd(naive.wasteUsd)}.`
              : ''}
          </p>
        </div>
        <Link to={`/accounts/${accountId}/roadmap?view=compare`} className="inline-flex min-h-11 items-center rounded px-2 font-semibold text-ink-700 underline underline-offset-4">
          Why this order?
        </Link>
      </div>
      {roadmap.seasons.every((s) => s.items.length === 0) ? (
        <EmptyState title="No roadmap yet">Your planting specialist has not planned upgrades for you yet.</EmptyState>
      ) : (
        <SeasonBoard roadmap={roadmap} goals={goals} actions={null} />
      )}
      <GoalsPanel accountId={accountId} roadmap={roadmap} canEdit={false} onChanged={() => undefined} />
    </section>
  );
}
