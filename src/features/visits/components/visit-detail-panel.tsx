import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { VisitView } from '@shared/schemas/visits';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, inputClasses } from '@/components/ui/form-field';
import { StatusBadge } from '@/components/ui/status-badge';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { accountDetailQueryOptions } from '@/features/accounts/api/accounts';
import { canMove } from '@/features/calendar/model/events';
import { cn } from '@/lib/cn';
import { useUpdateVisitMutation } from '../api/update-visit';
import { visitDetailQueryOptions } from '../api/visits';
import { VISIT_PURPOSE_LABELS, VISIT_STATUS_BADGES } from '../model/labels';
import { clockText, durationText, fromZoneLocal, instantText, minutesFromClock, toZoneLocal } from '../model/zone-time';

interface VisitDetailPanelProps {
  /** The visit to show; null closes the panel. */
  visitId: number | null;
  /** The list's copy, shown at once while the panel fetches the latest. */
  initial?: VisitView;
  /** Staff may change the visit; growers read it. */
  canEdit: boolean;
  onClose: () => void;
  /** After a successful change, e.g. "Moved to Wed 9 Dec, 10:00"; moved says whether its time changed. */
  onChanged?: (message: string, visit: VisitView, moved: boolean) => void;
}

/** A visit's details: purpose, time, window, status, notes, checklist, planter; staff can change them. */
export function VisitDetailPanel({ visitId, initial, canEdit, onClose, onChanged }: VisitDetailPanelProps) {
  const visit = useQuery({ ...visitDetailQueryOptions(visitId ?? 0), enabled: visitId !== null, placeholderData: initial && initial.id === visitId ? { visit: initial } : undefined });
  const title = visit.data ? `${VISIT_PURPOSE_LABELS[visit.data.purpose]}: ${visit.data.accountName}` : 'Visit';
  return (
    <Dialog open={visitId !== null} onClose={onClose} title={title} variant="panel">
      {visitId !== null &&
        (visit.isPending ? (
          <LoadingBlock label="Loading the visit…" />
        ) : visit.isError ? (
          <ErrorState message={visit.error.message} onRetry={() => void visit.refetch()} retrying={visit.isFetching} />
        ) : (
          <VisitDetails key={visit.data.id} visit={visit.data} canEdit={canEdit} onChanged={onChanged} />
        ))}
    </Dialog>
  );
}

function VisitDetails({ visit, canEdit, onChanged }: { visit: VisitView; canEdit: boolean; onChanged?: VisitDetailPanelProps['onChanged'] }) {
  const update = useUpdateVisitMutation();
  const [error, setError] = useState<string | null>(null);
  const [note, setNote] = useState<string | null>(null);
  // The checklist as the user just set it, shown while the change is saved (null: as stored).
  const [checklistDraft, setChecklistDraft] = useState<VisitView['checklist'] | null>(null);
  const checklist = checklistDraft ?? visit.checklist;
  const badge = VISIT_STATUS_BADGES[visit.status];
  const account = useQuery({ ...accountDetailQueryOptions(visit.accountId), enabled: canEdit || visit.planterId !== null });
  const planters = account.data?.planters ?? [];
  const planterName = visit.planterId ? (planters.find((p) => p.id === visit.planterId)?.name ?? `Planter ${visit.planterId}`) : null;

  const change = (changes: Parameters<typeof update.mutate>[0]['changes'], done: (v: VisitView) => string) => {
    setError(null);
    setNote(null);
    update.mutate(
      { id: visit.id, changes, version: visit.version },
      {
        onSuccess: ({ visit: next }) => {
          const message = done(next);
          setChecklistDraft(null);
          setNote(message);
          onChanged?.(message, next, next.startsAt !== visit.startsAt);
        },
        onError: (err) => {
          setChecklistDraft(null);
          setError(`${err.message} Nothing was changed.`);
        },
      },
    );
  };

  const when = visit.startsAt ? `${instantText(visit.startsAt)}–${clockText(toZoneLocal(new Date(visit.endsAt ?? visit.startsAt)).minute)}` : 'Not scheduled yet';
  const windowText = visit.windowStartMin !== null && visit.windowEndMin !== null ? `${clockText(visit.windowStartMin)}–${clockText(visit.windowEndMin)}` : 'Any time of day';

  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-center gap-2">
        <StatusBadge tone={badge.tone} shape={badge.shape}>
          {badge.label}
        </StatusBadge>
        {visit.fixed && (
          <StatusBadge tone="info" shape="dash">
            Fixed appointment
          </StatusBadge>
        )}
      </div>

      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2">
        <dt className="text-loam-700">When</dt>
        <dd className="tabular font-semibold text-ink-900">{when}</dd>
        <dt className="text-loam-700">Purpose</dt>
        <dd className="font-semibold text-ink-900">{VISIT_PURPOSE_LABELS[visit.purpose]}</dd>
        <dt className="text-loam-700">Duration</dt>
        <dd className="tabular font-semibold text-ink-900">{durationText(visit.durationMin)}</dd>
        <dt className="text-loam-700">Grower’s window</dt>
        <dd className="tabular font-semibold text-ink-900">{windowText}</dd>
        <dt className="text-loam-700">Specialist</dt>
        <dd className="font-semibold text-ink-900">{visit.specialistName ?? 'Unassigned'}</dd>
        <dt className="text-loam-700">Account</dt>
        <dd>
          {canEdit ? (
            <Link to={`/accounts/${visit.accountId}`} className="font-semibold text-ink-800 underline underline-offset-4">
              {visit.accountName}
            </Link>
          ) : (
            <span className="font-semibold text-ink-900">{visit.accountName}</span>
          )}
          {visit.town && <span className="text-loam-700"> · {visit.town}</span>}
        </dd>
        {!canEdit && (
          <>
            <dt className="text-loam-700">Planter</dt>
            <dd className="font-semibold text-ink-900">{planterName ?? 'None linked'}</dd>
          </>
        )}
      </dl>

      {error && <FormAlert>{error}</FormAlert>}
      {note && (
        <p role="status" className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-2 font-semibold text-seedling-800">
          <span aria-hidden="true">✓ </span>
          {note}
        </p>
      )}

      {canEdit && canMove(visit) && <MoveForm visit={visit} busy={update.isPending} onMove={(startsAt) => change({ startsAt }, (v) => `Moved to ${instantText(v.startsAt!)}.`)} />}

      {canEdit && (
        <div>
          <label htmlFor={`visit-planter-${visit.id}`} className="mb-1 block font-semibold text-ink-900">
            Linked planter
          </label>
          <div className="flex items-center gap-2">
            <select
              id={`visit-planter-${visit.id}`}
              className={inputClasses}
              value={visit.planterId ?? ''}
              disabled={update.isPending || account.isPending}
              onChange={(e) => change({ planterId: e.target.value ? Number(e.target.value) : null }, (v) => (v.planterId ? 'Planter linked.' : 'Planter unlinked.'))}
            >
              <option value="">None</option>
              {planters.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} ({p.rows} rows)
                </option>
              ))}
            </select>
            {visit.planterId && (
              <Link to={`/planters/${visit.planterId}`} className="shrink-0 font-semibold text-ink-800 underline underline-offset-4">
                Open planter
              </Link>
            )}
          </div>
        </div>
      )}

      <section aria-labelledby={`visit-checklist-${visit.id}`}>
        <h3 id={`visit-checklist-${visit.id}`} className="mb-1 font-semibold text-ink-900">
          Checklist{' '}
          <span className="tabular font-normal text-loam-700">
            ({checklist.filter((i) => i.done).length} of {checklist.length} done)
          </span>
        </h3>
        {checklist.length === 0 ? (
          <p className="text-loam-700">No checklist for this visit.</p>
        ) : (
          <ul className="divide-y divide-loam-200 rounded-lg border border-loam-300 bg-white">
            {checklist.map((item, k) => (
              <li key={`${k}-${item.label}`}>
                <label className={cn('flex min-h-11 items-center gap-3 px-3 py-2', canEdit && 'cursor-pointer hover:bg-loam-50')}>
                  <input
                    type="checkbox"
                    className="size-5 accent-seedling-700"
                    checked={item.done}
                    disabled={!canEdit || update.isPending}
                    onChange={(e) => {
                      const done = e.target.checked;
                      const next = checklist.map((it, j) => (j === k ? { ...it, done } : it));
                      setChecklistDraft(next);
                      change({ checklist: next }, () => `“${item.label}” marked ${done ? 'done' : 'not done'}.`);
                    }}
                  />
                  <span className={cn('text-ink-900', item.done && 'text-loam-700 line-through')}>{item.label}</span>
                  <span className="sr-only">{item.done ? '(done)' : '(not done)'}</span>
                </label>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby={`visit-notes-${visit.id}`}>
        <h3 id={`visit-notes-${visit.id}`} className="mb-1 font-semibold text-ink-900">
          Notes
        </h3>
        <p className="whitespace-pre-line text-ink-900">{visit.notes || <span className="text-loam-700">No notes.</span>}</p>
      </section>

      {canEdit && (visit.status === 'planned' || visit.status === 'requested') && (
        <div className="flex flex-wrap items-start gap-3 border-t border-loam-200 pt-4">
          {visit.status === 'planned' && (
            <Button variant="secondary" busy={update.isPending} onClick={() => change({ status: 'done' }, () => 'Marked as done.')}>
              Mark as done
            </Button>
          )}
          <CancelVisit visit={visit} busy={update.isPending} onCancel={() => change({ status: 'cancelled' }, () => 'Visit cancelled. It stays in the account’s history.')} />
        </div>
      )}
    </div>
  );
}

/** Calling a visit off takes a second, explicit step; the visit is kept, marked cancelled. */
function CancelVisit({ visit, busy, onCancel }: { visit: VisitView; busy: boolean; onCancel: () => void }) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="secondary" onClick={() => setAsking(true)}>
        Cancel visit…
      </Button>
    );
  }
  const what = visit.startsAt ? `the visit on ${instantText(visit.startsAt)}` : 'this visit request';
  return (
    <div role="group" aria-labelledby={`cancel-visit-${visit.id}`} className="w-full rounded-lg border border-brick-300 bg-brick-50 p-3">
      <p id={`cancel-visit-${visit.id}`} className="mb-2 font-semibold text-ink-900">
        Cancel {what} with {visit.accountName}? Its time is freed in the specialist’s diary; tell the grower yourself.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button variant="danger" busy={busy} onClick={onCancel}>
          Yes, cancel it
        </Button>
        {/* The safe answer takes the focus, so Enter on the next key press keeps the visit. */}
        <Button variant="secondary" disabled={busy} onClick={() => setAsking(false)} autoFocus>
          Keep the visit
        </Button>
      </div>
    </div>
  );
}

/** The keyboard way to reschedule: a date and a time on the dealership's clock. */
function MoveForm({ visit, busy, onMove }: { visit: VisitView; busy: boolean; onMove: (startsAt: string) => void }) {
  const local = toZoneLocal(new Date(visit.startsAt!));
  const [date, setDate] = useState(local.date);
  const [time, setTime] = useState(clockText(local.minute));
  const [problem, setProblem] = useState<string | null>(null);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const minute = minutesFromClock(time);
    if (!/^\d{4}-\d{2}-\d{2}$/.test(date) || minute === null) {
      setProblem('Give a date and a time like 09:30.');
      return;
    }
    setProblem(null);
    onMove(fromZoneLocal(date, minute).toISOString());
  };
  return (
    <form onSubmit={submit} className="rounded-lg border border-loam-300 bg-loam-50 p-3" aria-labelledby={`move-title-${visit.id}`}>
      <h3 id={`move-title-${visit.id}`} className="mb-2 font-semibold text-ink-900">
        Move to…
      </h3>
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor={`move-date-${visit.id}`} className="mb-1 block text-sm font-semibold text-ink-900">
            New date
          </label>
          <input id={`move-date-${visit.id}`} type="date" className={cn(inputClasses, 'w-44')} value={date} onChange={(e) => setDate(e.target.value)} required />
        </div>
        <div>
          <label htmlFor={`move-time-${visit.id}`} className="mb-1 block text-sm font-semibold text-ink-900">
            New start time
          </label>
          <input id={`move-time-${visit.id}`} type="time" step={300} className={cn(inputClasses, 'w-32')} value={time} onChange={(e) => setTime(e.target.value)} required />
        </div>
        <Button type="submit" busy={busy}>
          Move visit
        </Button>
      </div>
      <p className="mt-1 text-sm text-loam-700">Times are the dealership’s local time. Rowpath refuses times outside working hours, outside the grower’s window, or over another visit.</p>
      {problem && <p className="mt-1 text-sm font-semibold text-brick-700">{problem}</p>}
    </form>
  );
}
