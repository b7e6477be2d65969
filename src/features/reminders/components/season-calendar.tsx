import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { crops, type Crop } from '@shared/schemas/accounts';
import { seasonWindowInputSchema } from '@shared/schemas/reminders';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, SelectField, TextField } from '@/components/ui/form-field';
import { StatusBadge } from '@/components/ui/status-badge';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { Notice } from '@/features/fleet/components/form-bits';
import { cropLabels, labelOf } from '@/features/fleet/lib/labels';
import { isApiError } from '@/lib/api';
import { seasonCalendarQueryOptions, type CalendarEntry } from '../api/reminders';
import { useSaveCalendarMutation } from '../api/save-calendar';
import { dateInputFromMonthDay, formatIsoDay, formatMonthDay, monthDayFromDateInput } from '../model/season';

/**
 * The season calendar: when planting opens and closes per region and crop. Each row shows the
 * published source beside the dates; a dealership's own dates show with the published ones next
 * to them. Admins and managers change it; everyone on staff reads it.
 */
export function SeasonCalendar({ season, onSeasonChange }: { season: number; onSeasonChange: (season: number) => void }) {
  const user = useCurrentUser();
  const canEdit = user.role === 'admin' || user.role === 'manager';
  const calendar = useQuery(seasonCalendarQueryOptions(season));
  const [editing, setEditing] = useState<CalendarEntry | 'new' | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  return (
    <section aria-labelledby="season-calendar-title" className="mt-10">
      <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="season-calendar-title" className="text-xl font-bold text-ink-900">
            Season calendar
          </h2>
          <p className="max-w-prose text-loam-700">
            Reminders are counted back from the day the planting window opens.{' '}
            {canEdit ? 'Set your own dates where the published ones do not fit your growers.' : 'Admins and managers can change these dates.'}
          </p>
        </div>
        <div className="flex flex-wrap items-end gap-2">
          <div>
            <label htmlFor="calendar-season" className="mb-1 block font-semibold text-ink-900">
              Season
            </label>
            <select id="calendar-season" className="min-h-11 rounded-lg border border-loam-500 bg-white px-3" value={season} onChange={(e) => onSeasonChange(Number(e.target.value))}>
              {[season - 1, season, season + 1].map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </div>
          {canEdit && (
            <Button variant="secondary" onClick={() => setEditing('new')}>
              <span aria-hidden="true" className="text-xl leading-none">+</span> Add a window
            </Button>
          )}
        </div>
      </div>
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-3" />
      {calendar.isPending ? (
        <LoadingBlock label="Loading the season calendar…" />
      ) : calendar.isError ? (
        <ErrorState title="The season calendar could not be loaded" message={calendar.error.message} onRetry={() => void calendar.refetch()} retrying={calendar.isFetching} />
      ) : (
        <div className="overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm" role="region" aria-label="Season calendar" tabIndex={0}>
          <table className="w-full border-collapse text-left" data-season-calendar>
            <caption className="sr-only">Planting windows for the {season} season</caption>
            <thead className="bg-loam-100 text-sm text-loam-800">
              <tr>
                <th scope="col" className="px-4 py-3 font-semibold">Region and crop</th>
                <th scope="col" className="px-4 py-3 font-semibold">Window {season}</th>
                <th scope="col" className="px-4 py-3 font-semibold">Source</th>
                {canEdit && (
                  <th scope="col" className="px-4 py-3 font-semibold">
                    <span className="sr-only">Actions</span>
                  </th>
                )}
              </tr>
            </thead>
            <tbody className="divide-y divide-loam-200">
              {calendar.data.map((entry) => (
                <tr key={`${entry.regionKey}|${entry.crop}`} className="align-top" data-calendar-row={`${entry.regionKey}|${entry.crop}`}>
                  <th scope="row" className="px-4 py-3 text-left font-normal">
                    <span className="block font-semibold text-ink-950">{entry.regionLabel}</span>
                    <span className="text-loam-700">{labelOf(cropLabels, entry.crop)}</span>
                  </th>
                  <td className="px-4 py-3 whitespace-nowrap">
                    <span className="block font-semibold text-ink-950 tabular" data-window-start={entry.windowStart}>
                      Opens {entry.windowStartDate ? formatIsoDay(entry.windowStartDate) : formatMonthDay(entry.windowStart)}
                    </span>
                    <span className="block text-loam-800 tabular">Closes {entry.windowEndDate ? formatIsoDay(entry.windowEndDate) : formatMonthDay(entry.windowEnd)}</span>
                  </td>
                  <td className="max-w-xl px-4 py-3">
                    <SourceCell entry={entry} />
                  </td>
                  {canEdit && (
                    <td className="px-4 py-3 text-right">
                      <Button variant="secondary" onClick={() => setEditing(entry)} aria-label={`Change the ${labelOf(cropLabels, entry.crop).toLowerCase()} window for ${entry.regionLabel}`}>
                        Change
                      </Button>
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canEdit && (
        <WindowDialog
          season={season}
          entry={editing}
          regions={uniqueRegions(calendar.data ?? [])}
          onClose={() => setEditing(null)}
          onSaved={(message) => {
            setEditing(null);
            setNotice(message);
          }}
        />
      )}
    </section>
  );
}

function SourceCell({ entry }: { entry: CalendarEntry }) {
  if (entry.isDefault) {
    return (
      <div data-source="published">
        <StatusBadge tone="info" shape="ring">
          Published dates
        </StatusBadge>
        <p className="mt-1 text-sm text-loam-800">{entry.sourceText}</p>
        <p className="mt-0.5 text-sm text-loam-700 italic">{entry.source}</p>
      </div>
    );
  }
  return (
    <div data-source="dealership">
      <StatusBadge tone="soon" shape="dash">
        Dealership’s own dates
      </StatusBadge>
      <p className="mt-1 text-sm text-loam-800">
        {entry.source}
        {entry.sourceText ? ` — ${entry.sourceText}` : ''}
      </p>
      {entry.published ? (
        <p className="mt-1 text-sm text-loam-700">
          Published: {formatMonthDay(entry.published.windowStart)} to {formatMonthDay(entry.published.windowEnd)} — <span className="italic">{entry.published.source}</span>
        </p>
      ) : (
        <p className="mt-1 text-sm text-loam-700">No published window for this region and crop.</p>
      )}
    </div>
  );
}

function uniqueRegions(entries: CalendarEntry[]): { key: string; label: string }[] {
  const seen = new Map<string, string>();
  for (const e of entries) if (!seen.has(e.regionKey)) seen.set(e.regionKey, e.regionLabel);
  return [...seen].map(([key, label]) => ({ key, label }));
}

type WindowErrors = Partial<Record<'regionKey' | 'regionLabel' | 'crop' | 'windowStart' | 'windowEnd' | 'sourceText', string>>;
const NEW_REGION = '__new__';

function WindowDialog({
  season,
  entry,
  regions,
  onClose,
  onSaved,
}: {
  season: number;
  entry: CalendarEntry | 'new' | null;
  regions: { key: string; label: string }[];
  onClose: () => void;
  onSaved: (message: string) => void;
}) {
  const isNew = entry === 'new';
  const title = entry === null ? 'Planting window' : isNew ? 'Add a planting window' : `${entry.regionLabel}: ${labelOf(cropLabels, entry.crop).toLowerCase()}`;
  return (
    <Dialog open={entry !== null} onClose={onClose} variant="panel" title={title} description="Reminders count back from the day the window opens.">
      {entry !== null && <WindowForm key={isNew ? 'new' : `${entry.regionKey}|${entry.crop}`} season={season} entry={isNew ? null : entry} regions={regions} onCancel={onClose} onSaved={onSaved} />}
    </Dialog>
  );
}

function WindowForm({ season, entry, regions, onCancel, onSaved }: { season: number; entry: CalendarEntry | null; regions: { key: string; label: string }[]; onCancel: () => void; onSaved: (message: string) => void }) {
  const save = useSaveCalendarMutation(season);
  const [regionChoice, setRegionChoice] = useState(entry?.regionKey ?? regions[0]?.key ?? NEW_REGION);
  const [regionKey, setRegionKey] = useState('');
  const [regionLabel, setRegionLabel] = useState('');
  const [crop, setCrop] = useState<Crop>((entry?.crop as Crop) ?? 'corn');
  const [opens, setOpens] = useState(entry ? dateInputFromMonthDay(season, entry.windowStart) : '');
  const [closes, setCloses] = useState(entry ? dateInputFromMonthDay(season, entry.windowEnd) : '');
  const [note, setNote] = useState(entry && !entry.isDefault ? (entry.sourceText ?? '') : '');
  const [errors, setErrors] = useState<WindowErrors>({});
  const [formError, setFormError] = useState<string | null>(null);

  const newRegion = !entry && regionChoice === NEW_REGION;
  const cropWord = labelOf(cropLabels, crop).toLowerCase();
  const regionName = entry?.regionLabel ?? (newRegion ? regionLabel.trim() : regions.find((r) => r.key === regionChoice)?.label) ?? '';

  const submit = (reset: boolean) => {
    setFormError(null);
    const body = {
      regionKey: entry?.regionKey ?? (newRegion ? regionKey.trim() : regionChoice),
      regionLabel: newRegion ? regionLabel.trim() || undefined : undefined,
      crop,
      windowStart: reset ? undefined : monthDayFromDateInput(opens) || undefined,
      windowEnd: reset ? undefined : monthDayFromDateInput(closes) || undefined,
      sourceText: reset ? undefined : note.trim() || null,
      reset,
    };
    const parsed = seasonWindowInputSchema.safeParse(body);
    if (!parsed.success) {
      const next: WindowErrors = {};
      for (const issue of parsed.error.issues) {
        const key = issue.path[0] as keyof WindowErrors;
        if (!next[key]) next[key] = issue.message;
      }
      setErrors(next);
      return;
    }
    setErrors({});
    save.mutate([parsed.data], {
      onSuccess: () =>
        onSaved(reset ? `${regionName}: the ${cropWord} window is back to the published dates.` : `${regionName}: the ${cropWord} window now opens ${monthDayLabel(body.windowStart)}; campaign send dates follow.`),
      onError: (error) => {
        if (isApiError(error) && error.status === 400 && Object.keys(error.fields).length) {
          const next: WindowErrors = {};
          for (const [path, message] of Object.entries(error.fields)) next[(path.split('.').pop() ?? 'regionKey') as keyof WindowErrors] = message;
          setErrors(next);
          return;
        }
        setFormError(error.message);
      },
    });
  };

  return (
    <form
      noValidate
      className="space-y-5"
      aria-label="Planting window"
      onSubmit={(event) => {
        event.preventDefault();
        submit(false);
      }}
    >
      {formError && <FormAlert>{formError}</FormAlert>}
      {!entry && (
        <>
          <SelectField
            label="Region"
            value={regionChoice}
            onChange={(e) => setRegionChoice(e.target.value)}
            options={[...regions.map((r) => ({ value: r.key, label: r.label })), { value: NEW_REGION, label: 'A new region…' }]}
            error={newRegion ? undefined : errors.regionKey}
          />
          {newRegion && (
            <>
              <TextField label="Region name" value={regionLabel} onChange={(e) => setRegionLabel(e.target.value)} placeholder="South-central Nebraska" error={errors.regionLabel} />
              <TextField
                label="Region key"
                hint="Lower-case letters, digits and dashes; campaigns refer to the region by it."
                value={regionKey}
                onChange={(e) => setRegionKey(e.target.value)}
                placeholder="ne-south-central"
                error={errors.regionKey}
              />
            </>
          )}
          <SelectField label="Crop" value={crop} onChange={(e) => setCrop(e.target.value as Crop)} options={crops.map((c) => ({ value: c, label: cropLabels[c] }))} error={errors.crop} />
        </>
      )}
      {entry?.published && (
        <p className="rounded-lg bg-loam-100 px-4 py-3 text-loam-800">
          Published: opens {formatMonthDay(entry.published.windowStart)}, closes {formatMonthDay(entry.published.windowEnd)}. <span className="italic">{entry.published.source}</span>
        </p>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Window opens" type="date" value={opens} onChange={(e) => setOpens(e.target.value)} error={errors.windowStart} hint={`Any year; the day recurs every season.`} data-autofocus />
        <TextField label="Window closes" type="date" value={closes} onChange={(e) => setCloses(e.target.value)} error={errors.windowEnd} />
      </div>
      <TextField label="Why these dates (optional)" value={note} onChange={(e) => setNote(e.target.value)} placeholder="Our river-bottom growers plant a week later" error={errors.sourceText} maxLength={2000} />
      <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-5">
        <Button type="submit" busy={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save the dates'}
        </Button>
        {entry && !entry.isDefault && entry.published && (
          <Button variant="secondary" onClick={() => submit(true)} disabled={save.isPending}>
            Use the published dates
          </Button>
        )}
        <Button variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function monthDayLabel(monthDay: string | undefined) {
  return monthDay ? formatMonthDay(monthDay) : '';
}
