import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { VisitCandidate, WeekPlanView } from '@shared/schemas/visits';
import { Button, buttonClasses } from '@/components/ui/button';
import { FormAlert, inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { useLiveSearchParams } from '@/features/visits/hooks/use-live-search-params';
import { Notice } from '@/features/fleet/components/form-bits';
import { useCreateVisitsMutation } from '@/features/visits/api/create-visits';
import { useSpecialistChoices } from '@/features/visits/api/specialists';
import { candidatesQueryOptions } from '@/features/visits/api/visits';
import { PURPOSE_SHORT } from '@/features/visits/model/labels';
import { addDaysIso, clockText, durationText, mondayOf, shortDateText, todayAtDealership } from '@/features/visits/model/zone-time';
import { isIsoDate } from '@/features/calendar/model/events';
import { isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { streamWeekPlan, useCommitWeekPlanMutation, type PlanProgressEvent } from '../api/week-plans';
import { PlanResult } from './plan-result';

const PLAN_DAYS = 5;
const KIND_TITLES: Record<VisitCandidate['kind'], { title: string; hint: string }> = {
  requested: { title: 'Requested', hint: 'Visits growers asked for, or added and not yet planned' },
  'checkup-due': { title: 'Check-up due', hint: 'No pre-season check-up since the last planting season' },
  'review-overdue': { title: 'Review overdue', hint: 'Undecided roadmap items for the coming season' },
};
const KINDS = Object.keys(KIND_TITLES) as VisitCandidate['kind'][];

/** A candidate's identity on screen: its visit, or its account and purpose until a visit exists. */
export const candidateKey = (c: Pick<VisitCandidate, 'visitId' | 'accountId' | 'purpose'>) => (c.visitId ? `v${c.visitId}` : `a${c.accountId}:${c.purpose}`);

const PHASE_WORDS: Record<PlanProgressEvent['phase'], string> = {
  placing: 'Placing visits on days',
  improving: 'Shortening the day routes',
  done: 'Done',
};

type Stage = { kind: 'idle' } | { kind: 'creating' } | { kind: 'planning'; progress: PlanProgressEvent } | { kind: 'planned' } | { kind: 'error'; messages: string[] };

/** /week-plan (staff): choose a week and its visits, plan day routes, save them to the calendar. */
export function WeekPlanPage() {
  const me = useCurrentUser();
  const [params, setParams] = useLiveSearchParams();
  const nextMonday = addDaysIso(mondayOf(todayAtDealership()), 7);
  const requestedWeek = params.get('week');
  const weekStart = isIsoDate(requestedWeek) ? mondayOf(requestedWeek) : nextMonday;
  const specialists = useSpecialistChoices();
  const specialistParam = Number(params.get('specialist')) || undefined;
  const specialistId = me.role === 'specialist' ? me.id : specialistParam;

  const candidates = useQuery({ ...candidatesQueryOptions({ weekStart, specialistId }), enabled: specialistId !== undefined });
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [stage, setStage] = useState<Stage>({ kind: 'idle' });
  const [plan, setPlan] = useState<WeekPlanView | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const createVisits = useCreateVisitsMutation();
  const commit = useCommitWeekPlanMutation();
  const abort = useRef<AbortController | null>(null);
  const resultRef = useRef<HTMLHeadingElement>(null);

  // A new week or specialist starts a new choice.
  useEffect(() => {
    setSelected(new Set());
    setPlan(null);
    setSaved(null);
    setStage({ kind: 'idle' });
    abort.current?.abort();
  }, [weekStart, specialistId]);
  useEffect(() => () => abort.current?.abort(), []);

  const items = useMemo(() => candidates.data?.items ?? [], [candidates.data]);
  const chosen = items.filter((c) => selected.has(candidateKey(c)));
  const withoutVisit = chosen.filter((c) => c.visitId === null);
  const busy = stage.kind === 'creating' || stage.kind === 'planning' || commit.isPending;

  const setWeek = (monday: string) => {
    const next = new URLSearchParams(params);
    next.set('week', monday);
    setParams(next);
  };
  const toggle = (key: string, on: boolean) =>
    setSelected((prev) => {
      const next = new Set(prev);
      if (on) next.add(key);
      else next.delete(key);
      return next;
    });

  /** Creates visits for the chosen candidates that have none; returns every chosen visit id. */
  async function ensureVisits(): Promise<number[] | null> {
    const existing = chosen.filter((c) => c.visitId !== null).map((c) => c.visitId!);
    if (!withoutVisit.length) return existing;
    setStage({ kind: 'creating' });
    try {
      const { visits } = await createVisits.mutateAsync(withoutVisit.map((c) => ({ accountId: c.accountId, purpose: c.purpose, specialistId: specialistId ?? null })));
      setSelected((prev) => {
        const next = new Set(prev);
        for (const c of withoutVisit) next.delete(candidateKey(c));
        for (const v of visits) next.add(`v${v.id}`);
        return next;
      });
      setStage({ kind: 'idle' });
      return [...existing, ...visits.map((v) => v.id)];
    } catch (err) {
      setStage({ kind: 'error', messages: messagesOf(err, withoutVisit.map((c) => c.accountName), 'visits') });
      return null;
    }
  }

  async function planWeek() {
    setSaved(null);
    setPlan(null);
    const visitIds = await ensureVisits();
    if (!visitIds) return;
    const controller = new AbortController();
    abort.current?.abort();
    abort.current = controller;
    setStage({ kind: 'planning', progress: { phase: 'placing', fraction: 0 } });
    try {
      const result = await streamWeekPlan({ weekStart, specialistId, visitIds, days: PLAN_DAYS }, (progress) => setStage({ kind: 'planning', progress }), controller.signal);
      setPlan(result);
      setStage({ kind: 'planned' });
      requestAnimationFrame(() => resultRef.current?.focus());
    } catch (err) {
      if (err instanceof DOMException && err.name === 'AbortError') return;
      const names = new Map(items.filter((c) => c.visitId).map((c) => [c.visitId!, c.accountName]));
      setStage({ kind: 'error', messages: messagesOf(err, visitIds.map((id) => names.get(id) ?? `Visit ${id}`), 'visitIds') });
    }
  }

  function save() {
    if (!plan) return;
    const assignments = plan.days.flatMap((day) => day.stops.filter((s) => !s.kept).map((s) => ({ visitId: s.visitId, date: day.date, startMin: s.startMin, version: s.version })));
    if (!assignments.length) return;
    commit.mutate(
      { specialistId: plan.specialistId, assignments },
      {
        onSuccess: ({ visits }) => {
          setSaved(`Saved ${visits.length} ${visits.length === 1 ? 'visit' : 'visits'} to the calendar for the week of ${shortDateText(plan.weekStart)}.`);
          setStage({ kind: 'idle' });
        },
        onError: (err) =>
          setStage({
            kind: 'error',
            messages:
              isApiError(err) && err.code === 'stale'
                ? ['Some of these visits changed since the plan was made, so nothing was saved. Plan the week again.']
                : messagesOf(err, [], 'assignments'),
          }),
      },
    );
  }

  return (
    <>
      <PageHeader
        title="Week plan"
        description="Choose the visits for a week; Rowpath puts them on days and orders each day's route from the dealership and back, keeping working hours, growers' time windows and fixed appointments."
      />

      <section aria-labelledby="week-choice-title" className="mb-5 rounded-xl border border-loam-300 bg-white p-4">
        <h2 id="week-choice-title" className="sr-only">
          Week and specialist
        </h2>
        <div className="flex flex-wrap items-end gap-4">
          <div>
            <label htmlFor="plan-week" className="mb-1 block font-semibold text-ink-900">
              Week starting
            </label>
            <div className="flex items-center gap-2">
              <Button variant="secondary" aria-label="Previous week" onClick={() => setWeek(addDaysIso(weekStart, -7))} disabled={busy}>
                ‹
              </Button>
              <input
                id="plan-week"
                type="date"
                className={cn(inputClasses, 'w-44')}
                value={weekStart}
                step={7}
                onChange={(e) => isIsoDate(e.target.value) && setWeek(mondayOf(e.target.value))}
                aria-describedby="plan-week-hint"
                disabled={busy}
              />
              <Button variant="secondary" aria-label="Next week" onClick={() => setWeek(addDaysIso(weekStart, 7))} disabled={busy}>
                ›
              </Button>
            </div>
            <p id="plan-week-hint" className="mt-1 text-sm text-loam-700">
              {shortDateText(weekStart)} to {shortDateText(addDaysIso(weekStart, PLAN_DAYS - 1))}
              {weekStart === nextMonday ? ' (next week)' : ''}
            </p>
          </div>
          {me.role !== 'specialist' && (
            <div className="min-w-64">
              <label htmlFor="plan-specialist" className="mb-1 block font-semibold text-ink-900">
                Specialist
              </label>
              <select
                id="plan-specialist"
                className={inputClasses}
                value={specialistParam ?? ''}
                disabled={busy}
                onChange={(e) => {
                  const next = new URLSearchParams(params);
                  if (e.target.value) next.set('specialist', e.target.value);
                  else next.delete('specialist');
                  setParams(next);
                }}
              >
                <option value="">{specialists.loading ? 'Loading…' : 'Choose a specialist'}</option>
                {specialists.choices.map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.name}
                  </option>
                ))}
              </select>
            </div>
          )}
        </div>
      </section>

      {specialistId === undefined ? (
        <EmptyState title="Choose a specialist">Week plans are made for one specialist at a time.</EmptyState>
      ) : candidates.isPending ? (
        <LoadingBlock label="Finding visits to plan…" />
      ) : candidates.isError ? (
        <ErrorState message={candidates.error.message} onRetry={() => void candidates.refetch()} retrying={candidates.isFetching} />
      ) : (
        <section aria-labelledby="candidates-title" className="mb-6">
          <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
            <h2 id="candidates-title" className="text-xl font-bold text-ink-900">
              Visits to plan <span className="tabular font-normal text-loam-700">({items.length})</span>
            </h2>
            <div className="flex flex-wrap gap-2">
              <Button variant="secondary" onClick={() => setSelected(new Set(items.map(candidateKey)))} disabled={busy || !items.length}>
                Select all
              </Button>
              <Button variant="ghost" onClick={() => setSelected(new Set())} disabled={busy || selected.size === 0}>
                Clear
              </Button>
            </div>
          </div>
          {items.length === 0 ? (
            <EmptyState title="Nothing waiting to be planned">No open requests, due check-ups or overdue reviews for this week.</EmptyState>
          ) : (
            <div className="space-y-4">
              {KINDS.map((kind) => {
                const group = items.filter((c) => c.kind === kind);
                if (!group.length) return null;
                return (
                  <fieldset key={kind} className="rounded-xl border border-loam-300 bg-white">
                    <legend className="sr-only">{KIND_TITLES[kind].title}</legend>
                    <div className="flex flex-wrap items-baseline gap-x-3 border-b border-loam-200 px-4 py-2" aria-hidden="true">
                      <span className="text-lg font-bold text-ink-900">
                        {KIND_TITLES[kind].title} <span className="tabular font-normal text-loam-700">({group.length})</span>
                      </span>
                      <span className="text-sm text-loam-700">{KIND_TITLES[kind].hint}</span>
                    </div>
                    <ul className="divide-y divide-loam-200">
                      {group.map((c) => (
                        <CandidateRow key={candidateKey(c)} candidate={c} checked={selected.has(candidateKey(c))} disabled={busy} onChange={(on) => toggle(candidateKey(c), on)} />
                      ))}
                    </ul>
                  </fieldset>
                );
              })}
            </div>
          )}

          <div className="sticky bottom-0 z-10 mt-4 flex flex-wrap items-center gap-3 rounded-xl border border-ink-200 bg-ink-50/95 p-3 shadow-sm backdrop-blur">
            <p className="tabular mr-auto font-semibold text-ink-900" role="status">
              {chosen.length} chosen
              {withoutVisit.length > 0 && <span className="font-normal text-loam-700"> · {withoutVisit.length} without a visit yet (created when you plan)</span>}
            </p>
            {withoutVisit.length > 0 && (
              <Button variant="secondary" onClick={() => void ensureVisits()} disabled={busy} busy={stage.kind === 'creating'}>
                Create {withoutVisit.length} {withoutVisit.length === 1 ? 'visit' : 'visits'}
              </Button>
            )}
            <Button onClick={() => void planWeek()} disabled={busy || chosen.length === 0} busy={stage.kind === 'planning'}>
              Plan the week
            </Button>
          </div>
        </section>
      )}

      {stage.kind === 'planning' && <PlanProgress progress={stage.progress} />}
      {stage.kind === 'planned' && <PlanProgress progress={{ phase: 'done', fraction: 1 }} />}
      {stage.kind === 'error' && (
        <div className="mb-4">
          <FormAlert>
            <p className="font-semibold">The week could not be planned as asked.</p>
            <ul className="mt-1 list-disc pl-5">
              {stage.messages.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          </FormAlert>
        </div>
      )}

      {plan && (
        <section aria-labelledby="plan-title" className="mb-8">
          <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
            <h2 id="plan-title" ref={resultRef} tabIndex={-1} className="text-xl font-bold text-ink-900 outline-none">
              Day routes for the week of {shortDateText(plan.weekStart)}
            </h2>
            <div className="flex flex-wrap gap-2">
              <Button variant="secondary" onClick={() => void planWeek()} disabled={busy}>
                Plan again
              </Button>
              <Button onClick={save} busy={commit.isPending} disabled={busy || !!saved || plan.totals.visits === 0}>
                Save to calendar
              </Button>
            </div>
          </div>
          <Notice message={saved} onDone={() => undefined} className="mb-3" />
          {saved && (
            <p className="mb-3">
              <Link className={buttonClasses('secondary')} to={`/calendar?view=work_week&date=${plan.weekStart}${me.role === 'specialist' ? '' : `&specialist=${plan.specialistId}`}`}>
                Open the calendar for that week
              </Link>
            </p>
          )}
          <PlanResult plan={plan} />
        </section>
      )}
    </>
  );
}

function CandidateRow({ candidate: c, checked, disabled, onChange }: { candidate: VisitCandidate; checked: boolean; disabled: boolean; onChange: (on: boolean) => void }) {
  const windowText = c.windowStartMin !== null && c.windowEndMin !== null ? `window ${clockText(c.windowStartMin)}–${clockText(c.windowEndMin)}` : null;
  return (
    <li>
      <label className="flex min-h-12 cursor-pointer items-start gap-3 px-4 py-2.5 hover:bg-loam-50">
        <input type="checkbox" className="mt-1 size-5 shrink-0 accent-ink-700" checked={checked} disabled={disabled} onChange={(e) => onChange(e.target.checked)} />
        <span className="min-w-0 flex-1">
          <span className="font-semibold text-ink-900">{c.accountName}</span>
          <span className="text-loam-700">
            {' '}
            · {PURPOSE_SHORT[c.purpose]} · {durationText(c.durationMin)}
            {windowText && ` · ${windowText}`}
            {c.fixed && c.startsAt && ' · fixed appointment'}
            {c.town && ` · ${c.town}`}
          </span>
          <span className="block text-sm text-loam-700">
            {c.reason}
            {c.visitId === null && <span className="ml-2 rounded bg-loam-100 px-1.5 py-0.5 font-semibold text-loam-800">no visit yet</span>}
            {c.lat === null && <span className="ml-2 font-semibold text-brick-700">no map location</span>}
          </span>
        </span>
      </label>
    </li>
  );
}

function PlanProgress({ progress }: { progress: PlanProgressEvent }) {
  const percent = Math.round(Math.min(1, Math.max(0, progress.fraction)) * 100);
  return (
    <div className="mb-5 rounded-xl border border-ink-200 bg-white p-4">
      <p id="plan-progress-label" className="mb-2 flex justify-between font-semibold text-ink-900">
        <span>{progress.phase === 'done' ? 'Planned' : `${PHASE_WORDS[progress.phase]}…`}</span>
        <span className="tabular">{percent} %</span>
      </p>
      <div role="progressbar" aria-labelledby="plan-progress-label" aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} className="h-4 overflow-hidden rounded-full bg-loam-200">
        <div className="h-full rounded-full bg-seedling-600 transition-[width] duration-150" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}

/** The server's field messages (they name the account), else its message. */
function messagesOf(err: unknown, names: string[], prefix: string): string[] {
  if (!isApiError(err)) return ['Something went wrong. Try again.'];
  const fields = Object.entries(err.fields);
  if (!fields.length) return [err.message];
  return fields.map(([key, message]) => {
    const k = Number(key.split('.')[1]);
    const name = key.startsWith(`${prefix}.`) && Number.isInteger(k) ? names[k] : undefined;
    return name && !message.startsWith(name) ? `${name}: ${message}` : message;
  });
}
