import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { visitCreateSchema, type VisitPurpose, type VisitView } from '@shared/schemas/visits';
import { Button } from '@/components/ui/button';
import { FormAlert, inputClasses, SelectField, TextField } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { StatusBadge } from '@/components/ui/status-badge';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { isApiError } from '@/lib/api';
import { SubscribePanel } from '@/features/calendar/components/subscribe-panel';
import { Notice } from '@/features/fleet/components/form-bits';
import { useRequestVisitMutation } from '../api/create-visits';
import { visitListQueryOptions } from '../api/visits';
import { GROWER_REQUEST_PURPOSES, VISIT_PURPOSE_LABELS, VISIT_STATUS_BADGES } from '../model/labels';
import { clockText, durationText, instantText, minutesFromClock } from '../model/zone-time';
import { VisitDetailPanel } from './visit-detail-panel';

/** /visits (grower): their operation's visits, a form to ask for one, and their calendar address. */
export function GrowerVisitsPage() {
  const me = useCurrentUser();
  const visits = useQuery({ ...visitListQueryOptions({ accountId: me.accountId ?? undefined }), enabled: me.accountId !== null });
  const [open, setOpen] = useState<VisitView | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  if (me.accountId === null) {
    return (
      <>
        <PageHeader title="Visits" />
        <EmptyState title="No operation is linked to your sign-in">Ask your dealership to link your sign-in to your operation.</EmptyState>
      </>
    );
  }

  const items = visits.data?.items ?? [];
  const now = Date.now();
  const coming = items.filter((v) => v.status !== 'cancelled' && v.status !== 'done' && (!v.startsAt || new Date(v.startsAt).getTime() >= now - 86_400_000));
  const cancelled = items.filter((v) => v.status === 'cancelled').reverse();
  const past = items.filter((v) => !coming.includes(v) && v.status !== 'cancelled').reverse();

  return (
    <>
      <PageHeader title="Visits" description="Your specialist’s visits to your operation: check-ups, installs and reviews. Ask for a visit here; your specialist sets the time." />
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-4" />
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="space-y-6">
          <section aria-labelledby="coming-title">
            <h2 id="coming-title" className="mb-2 text-xl font-bold text-ink-900">
              Coming up
            </h2>
            {visits.isPending ? (
              <LoadingBlock label="Loading your visits…" />
            ) : visits.isError ? (
              <ErrorState message={visits.error.message} onRetry={() => void visits.refetch()} retrying={visits.isFetching} />
            ) : coming.length === 0 ? (
              <EmptyState title="No visits coming up">Ask for a pre-season check-up with the form on this page.</EmptyState>
            ) : (
              <VisitList visits={coming} onOpen={setOpen} />
            )}
          </section>
          <VisitSection id="past-title" title="Earlier visits" visits={past} onOpen={setOpen} />
          <VisitSection id="cancelled-title" title="Cancelled visits" visits={cancelled} onOpen={setOpen} />
        </div>
        <aside className="space-y-6">
          <section aria-labelledby="request-title" className="rounded-xl border border-loam-300 bg-white p-4">
            <h2 id="request-title" className="mb-3 text-lg font-bold text-ink-900">
              Request a visit
            </h2>
            <RequestForm accountId={me.accountId} onDone={setNotice} />
          </section>
          <section aria-labelledby="subscribe-title" className="rounded-xl border border-loam-300 bg-white p-4">
            <h2 id="subscribe-title" className="mb-3 text-lg font-bold text-ink-900">
              Your visit calendar
            </h2>
            <SubscribePanel />
          </section>
        </aside>
      </div>
      <VisitDetailPanel visitId={open?.id ?? null} initial={open ?? undefined} canEdit={false} onClose={() => setOpen(null)} />
    </>
  );
}

/** A titled list of visits, left out when there are none. */
function VisitSection({ id, title, visits, onOpen }: { id: string; title: string; visits: VisitView[]; onOpen: (v: VisitView) => void }) {
  if (visits.length === 0) return null;
  return (
    <section aria-labelledby={id}>
      <h2 id={id} className="mb-2 text-xl font-bold text-ink-900">
        {title}
      </h2>
      <VisitList visits={visits} onOpen={onOpen} />
    </section>
  );
}

function VisitList({ visits, onOpen }: { visits: VisitView[]; onOpen: (v: VisitView) => void }) {
  return (
    <ul className="divide-y divide-loam-200 rounded-xl border border-loam-300 bg-white">
      {visits.map((v) => {
        const badge = VISIT_STATUS_BADGES[v.status];
        return (
          <li key={v.id}>
            <button type="button" onClick={() => onOpen(v)} className="flex min-h-14 w-full flex-wrap items-center gap-x-4 gap-y-1 px-4 py-3 text-left hover:bg-loam-50">
              <span className="min-w-0 flex-1">
                <span className="block font-semibold text-ink-900">{VISIT_PURPOSE_LABELS[v.purpose]}</span>
                <span className="tabular block text-sm text-loam-700">
                  {v.startsAt ? instantText(v.startsAt) : 'Time to be set by your specialist'} · {durationText(v.durationMin)}
                  {v.windowStartMin !== null && v.windowEndMin !== null && ` · your window ${clockText(v.windowStartMin)}–${clockText(v.windowEndMin)}`}
                  {v.specialistName && ` · ${v.specialistName}`}
                </span>
              </span>
              <StatusBadge tone={badge.tone} shape={badge.shape}>
                {badge.label}
              </StatusBadge>
            </button>
          </li>
        );
      })}
    </ul>
  );
}

const WINDOW_CHOICES = [
  { value: '', label: 'Any time of day' },
  { value: 'morning', label: 'Mornings (08:00–12:00)' },
  { value: 'afternoon', label: 'Afternoons (13:00–17:00)' },
  { value: 'custom', label: 'Between times I choose' },
];
const PRESETS: Record<string, [number, number]> = { morning: [480, 720], afternoon: [780, 1020] };

/** A grower's request: purpose, the time of day that suits, a note. Checked with the API's own schema. */
function RequestForm({ accountId, onDone }: { accountId: number; onDone: (message: string) => void }) {
  const request = useRequestVisitMutation();
  const [purpose, setPurpose] = useState<VisitPurpose>('pre-season-checkup');
  const [windowChoice, setWindowChoice] = useState('');
  const [from, setFrom] = useState('08:00');
  const [until, setUntil] = useState('12:00');
  const [notes, setNotes] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    let windowStartMin: number | null = null;
    let windowEndMin: number | null = null;
    const found: Record<string, string> = {};
    if (windowChoice === 'custom') {
      windowStartMin = minutesFromClock(from);
      windowEndMin = minutesFromClock(until);
      if (windowStartMin === null) found.windowStartMin = 'Give a time like 08:00';
      if (windowEndMin === null) found.windowEndMin = 'Give a time like 12:00';
    } else if (PRESETS[windowChoice]) {
      [windowStartMin, windowEndMin] = PRESETS[windowChoice];
    }
    const body = { accountId, purpose, status: 'requested' as const, windowStartMin, windowEndMin, notes: notes.trim() || null };
    const parsed = visitCreateSchema.safeParse(body);
    if (!parsed.success) for (const issue of parsed.error.issues) found[String(issue.path[0])] ??= issue.message;
    setErrors(found);
    if (Object.keys(found).length) return;
    request.mutate(body, {
      onSuccess: () => {
        onDone(`Your ${VISIT_PURPOSE_LABELS[purpose].toLowerCase()} request is sent. Your specialist will set the time.`);
        setNotes('');
      },
      onError: (err) => {
        setErrors(isApiError(err) ? err.fields : {});
        setFormError(err.message);
      },
    });
  };

  return (
    <form className="space-y-4" onSubmit={submit} noValidate>
      <SelectField
        label="What do you need?"
        value={purpose}
        onChange={(e) => setPurpose(e.target.value as VisitPurpose)}
        options={GROWER_REQUEST_PURPOSES.map((p) => ({ value: p, label: VISIT_PURPOSE_LABELS[p] }))}
        error={errors.purpose}
      />
      <SelectField label="When suits you?" value={windowChoice} onChange={(e) => setWindowChoice(e.target.value)} options={WINDOW_CHOICES} />
      {windowChoice === 'custom' && (
        <div className="grid grid-cols-2 gap-3">
          <TextField label="From" type="time" value={from} onChange={(e) => setFrom(e.target.value)} error={errors.windowStartMin} />
          <TextField label="Until" type="time" value={until} onChange={(e) => setUntil(e.target.value)} error={errors.windowEndMin ?? errors.durationMin} />
        </div>
      )}
      <div>
        <label htmlFor="request-notes" className="mb-1 block font-semibold text-ink-900">
          Notes for your specialist <span className="font-normal text-loam-700">(optional)</span>
        </label>
        <textarea
          id="request-notes"
          rows={3}
          className={inputClasses}
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          aria-invalid={errors.notes ? true : undefined}
          placeholder="For example: the left wing's seed sensors drop out"
        />
        {errors.notes && <p className="mt-1 text-sm font-semibold text-brick-700">{errors.notes}</p>}
      </div>
      {formError && <FormAlert>{formError}</FormAlert>}
      <Button type="submit" busy={request.isPending}>
        Send the request
      </Button>
    </form>
  );
}
