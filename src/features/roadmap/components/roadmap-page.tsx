import { useQuery } from '@tanstack/react-query';
import { useCallback, useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import type { RoadmapStageName } from '@shared/schemas/roadmap';
import { Button } from '@/components/ui/button';
import { FormAlert } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { accountDetailQueryOptions } from '@/features/accounts/api/accounts';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { GoalsPanel } from '@/features/goals/components/goals-panel';
import { CreateQuoteDialog, QuotesPanel, quotableItems } from '@/features/quotes/components/quotes-panel';
import { isApiError } from '@/lib/api';
import { roadmapQueryOptions, type Roadmap, type RoadmapItem } from '../api/roadmap';
import { useUpdateItemMutation } from '../api/update-item';
import { formatUsd } from '../model/format';
import { warningsAfterMove } from '../model/move-preview';
import { STAGE_META } from '../model/stages';
import { BudgetsPanel } from './budgets-panel';
import { CompareView } from './compare-view';
import { MoveDialog, type MoveRequest } from './move-dialog';
import { PlanAgainDialog } from './plan-again-dialog';
import { ReplacementsPanel } from './replacements-panel';
import { SeasonBoard, type BoardActions } from './season-board';
import { VersionsView } from './versions-view';
import { VerdictStrip } from './verdict-strip';
import { ViewTabs } from './view-tabs';

export function parseRoadmapAccountId(raw: string | undefined): number | null {
  return raw && /^[1-9]\d{0,9}$/.test(raw) ? Number(raw) : null;
}

const views = [
  { id: 'seasons', label: 'Seasons' },
  { id: 'compare', label: 'Against a naive order' },
  { id: 'versions', label: 'Saved versions' },
] as const;
type View = (typeof views)[number]['id'];
const isView = (v: string | null): v is View => views.some((x) => x.id === v);

export interface Outcome {
  tone: 'done' | 'error';
  message: string;
  warnings: string[];
}

/** What a change brought: a line of confirmation and, when there are any, the warnings, kept until dismissed. */
export function OutcomeNotice({ outcome, onDismiss }: { outcome: Outcome | null; onDismiss: () => void }) {
  return (
    <div role="status" aria-live="polite" className="empty:hidden" data-outcome>
      {outcome && (
        <div className="mb-4 flex items-start gap-2">
          <div className="flex-1 space-y-2">
            {outcome.tone === 'error' ? (
              <FormAlert>{outcome.message}</FormAlert>
            ) : (
              <p className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 font-semibold text-seedling-800">
                <span aria-hidden="true">✓ </span>
                {outcome.message}
              </p>
            )}
            {outcome.warnings.length > 0 && (
              <FormAlert tone="warning">
                <ul className="space-y-1" data-outcome-warnings>
                  {outcome.warnings.map((w) => (
                    <li key={w}>{w}</li>
                  ))}
                </ul>
              </FormAlert>
            )}
          </div>
          <Button variant="ghost" onClick={onDismiss} aria-label="Dismiss this message">
            Dismiss
          </Button>
        </div>
      )}
    </div>
  );
}

/** The upgrade roadmap of one account: seasons across, goals, budgets, replacements, quotes, the compare and versions. */
export function RoadmapPage() {
  const { accountId: raw } = useParams();
  const accountId = parseRoadmapAccountId(raw);
  if (accountId === null) {
    return (
      <>
        <PageHeader title="Roadmap not found" />
        <EmptyState title="That is not an account number" action={<Link to="/accounts">Back to the accounts</Link>} />
      </>
    );
  }
  return <RoadmapScreen accountId={accountId} />;
}

function RoadmapScreen({ accountId }: { accountId: number }) {
  const user = useCurrentUser();
  const canEdit = user.role !== 'grower';
  const roadmap = useQuery(roadmapQueryOptions(accountId));
  const account = useQuery(accountDetailQueryOptions(accountId));
  const name = account.data?.name ?? `Account #${accountId}`;

  return (
    <>
      <title>{`Roadmap · ${name} · Rowpath`}</title>
      <Link to={user.role === 'grower' ? '/' : `/accounts/${accountId}`} className="-ml-2 mb-2 inline-flex min-h-11 items-center gap-1 rounded px-2 font-semibold text-ink-700 hover:underline">
        <span aria-hidden="true">‹</span> {user.role === 'grower' ? 'Your operation' : name}
      </Link>
      {roadmap.isPending && (
        <>
          <PageHeader title={`Upgrade roadmap · ${name}`} />
          <LoadingBlock label="Loading the roadmap…" />
        </>
      )}
      {roadmap.isError && (
        <>
          <PageHeader title={`Upgrade roadmap · ${name}`} />
          <ErrorState
            title={isApiError(roadmap.error) && roadmap.error.status === 404 ? 'This roadmap is not in your territory, or the account does not exist' : 'The roadmap could not be loaded'}
            message={roadmap.error.message}
            onRetry={() => void roadmap.refetch()}
          />
        </>
      )}
      {roadmap.isSuccess && <RoadmapLoaded accountId={accountId} name={name} roadmap={roadmap.data} canEdit={canEdit} />}
    </>
  );
}

function RoadmapLoaded({ accountId, name, roadmap, canEdit }: { accountId: number; name: string; roadmap: Roadmap; canEdit: boolean }) {
  const [params, setParams] = useSearchParams();
  const view: View = isView(params.get('view')) ? (params.get('view') as View) : 'seasons';
  const [moveRequest, setMoveRequest] = useState<MoveRequest | null>(null);
  const [planning, setPlanning] = useState(false);
  const [quoteSeason, setQuoteSeason] = useState<number | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const update = useUpdateItemMutation(accountId);
  const goals = useMemo(() => new Map(roadmap.goals.map((g) => [g.id, g])), [roadmap.goals]);
  const last = roadmap.firstSeason + roadmap.horizonSeasons - 1;
  const itemCount = roadmap.seasons.reduce((n, s) => n + s.items.length, 0);
  const done = useCallback((message: string) => setOutcome({ tone: 'done', message, warnings: [] }), []);

  const patchItem = (item: RoadmapItem, patch: { stage?: RoadmapStageName; locked?: boolean }, message: string) => {
    update.mutate(
      { id: item.id, patch: { version: item.version, ...patch } },
      {
        onSuccess: (result) => setOutcome({ tone: 'done', message, warnings: warningsAfterMove(roadmap.feasible, result.warnings) }),
        onError: (err) =>
          setOutcome({
            tone: 'error',
            message: isApiError(err) && err.code === 'stale' ? 'Someone changed this item after the roadmap was loaded. It has been reloaded: make the change again.' : err.message,
            warnings: [],
          }),
      },
    );
  };

  const actions: BoardActions | null = canEdit
    ? {
        onMove: (item) => setMoveRequest({ item, toSeason: null }),
        onDrop: (item, toSeason) => setMoveRequest({ item, toSeason }),
        onStage: (item, stage) => patchItem(item, { stage }, `${item.partName} is now “${STAGE_META[stage].label}”.`),
        onLock: (item, locked) => patchItem(item, { locked }, locked ? `${item.partName} is locked in ${item.season}.` : `${item.partName} is unlocked: it can be moved or re-planned.`),
      }
    : null;

  return (
    <>
      <PageHeader
        title={`Upgrade roadmap · ${name}`}
        description={`Seasons ${roadmap.firstSeason}–${last} · ${itemCount} ${itemCount === 1 ? 'item' : 'items'} · labour at ${formatUsd(roadmap.shopRateUsdPerHour)}/h · waste valued ${roadmap.valuation === 'straight-line' ? 'straight-line' : 'by remaining-value curve'}`}
        actions={
          canEdit && (
            <Button onClick={() => setPlanning(true)} busy={false}>
              Plan again
            </Button>
          )
        }
      />
      <VerdictStrip roadmap={roadmap} />
      <OutcomeNotice outcome={outcome} onDismiss={() => setOutcome(null)} />

      <ViewTabs
        tabs={[...views]}
        current={view}
        label="Roadmap views"
        idPrefix="roadmap"
        onChange={(next) =>
          setParams(
            (prev) => {
              const p = new URLSearchParams(prev);
              if (next === 'seasons') p.delete('view');
              else p.set('view', next);
              return p;
            },
            { replace: true },
          )
        }
      />
      <div role="tabpanel" id={`roadmap-panel-${view}`} aria-labelledby={`roadmap-tab-${view}`}>
        {view === 'seasons' && (
          <div className="space-y-6">
            {itemCount === 0 && roadmap.goals.length > 0 && canEdit && (
              <EmptyState title="No roadmap planned yet" action={<Button onClick={() => setPlanning(true)}>Plan the roadmap</Button>}>
                Rowpath sequences the parts the goals need, season by season, within the budgets.
              </EmptyState>
            )}
            {canEdit && itemCount > 0 && <p className="text-loam-700">Drag a card by its grip to another season, or use “Move to season…”. Rowpath checks the move before saving it.</p>}
            <SeasonBoard
              roadmap={roadmap}
              goals={goals}
              actions={actions}
              seasonFooter={
                canEdit
                  ? (season) =>
                      quotableItems(roadmap, season.season).some((i) => i.stage !== 'quoted') ? (
                        <Button variant="secondary" className="w-full" onClick={() => setQuoteSeason(season.season)}>
                          Quote {season.season}…
                        </Button>
                      ) : null
                  : undefined
              }
            />
            <div className="grid items-start gap-6 xl:grid-cols-2">
              <GoalsPanel accountId={accountId} roadmap={roadmap} canEdit={canEdit} onChanged={done} />
              <div className="space-y-6">
                <BudgetsPanel accountId={accountId} roadmap={roadmap} canEdit={canEdit} onChanged={done} />
                <ReplacementsPanel accountId={accountId} roadmap={roadmap} canEdit={canEdit} onChanged={done} />
              </div>
            </div>
            <QuotesPanel accountId={accountId} roadmap={roadmap} canEdit={canEdit} onQuoteSeason={setQuoteSeason} />
          </div>
        )}
        {view === 'compare' && <CompareView roadmap={roadmap} />}
        {view === 'versions' && <VersionsView accountId={accountId} roadmap={roadmap} canEdit={canEdit} />}
      </div>

      <MoveDialog
        accountId={accountId}
        roadmap={roadmap}
        request={moveRequest}
        onClose={() => setMoveRequest(null)}
        onMoved={(result) => setOutcome({ tone: 'done', message: result.message, warnings: result.warnings })}
      />
      <PlanAgainDialog key={String(planning)} accountId={accountId} roadmap={roadmap} open={planning} onClose={() => setPlanning(false)} onDone={done} />
      <CreateQuoteDialog
        accountId={accountId}
        roadmap={roadmap}
        season={quoteSeason}
        onClose={() => setQuoteSeason(null)}
        onCreated={(q) => done(`Quote ${q.id} for ${q.season} is ready (${formatUsd(q.totalUsd)}, valid until ${q.validUntil}). The grower sees it in their portal.`)}
      />
    </>
  );
}
