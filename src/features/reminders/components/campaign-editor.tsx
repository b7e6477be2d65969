import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Controller, useForm, useWatch, type Resolver } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { MergeField } from '@shared/calc/merge-template';
import { reminderSchedule, windowStartIso } from '@shared/calc/season-calendar';
import { crops, type Crop } from '@shared/schemas/accounts';
import { campaignStatuses, type CampaignInput } from '@shared/schemas/reminders';
import { Button, buttonClasses } from '@/components/ui/button';
import { CheckboxGroup, ErrorMark, FormAlert, SelectField, TextField } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { CheckboxField, Notice, SaveErrorAlert, TextAreaField } from '@/features/fleet/components/form-bits';
import { cropLabels, labelOf } from '@/features/fleet/lib/labels';
import type { Territory } from '@/features/territories/api/territories';
import { isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { outboxHref } from '../api/outbox-params';
import { campaignQueryOptions, type CalendarEntry, type Campaign, type RunResult } from '../api/reminders';
import { useCreateCampaignMutation, useUpdateCampaignMutation } from '../api/save-campaign';
import {
  changedCampaignFields,
  checkCampaignForm,
  formValuesFromCampaign,
  placeServerFields,
  type CampaignFormField,
  type CampaignFormValues,
} from '../model/campaign-form';
import { campaignStatusLooks, daysBeforeLabel } from '../model/labels';
import { parseOffsetsText } from '../model/offsets';
import { formatIsoDay, todayUtcIso } from '../model/season';
import { insertMergeField, liveTemplateCheck, usedMergeFields } from '../model/template';
import { CampaignStatusBadge, ScheduleStateBadge } from './badges';
import { OutboxCountsCell } from './campaigns-table';
import { MergeFieldPicker } from './merge-field-picker';
import { PreviewPanel } from './preview-panel';
import { RunDialog, RunOutcome } from './run-dialog';

const STARTER_SUBJECT = '{{grower.firstName}}, time to get the planters ready for {{season}}';
const STARTER_BODY = `Hello {{grower.firstName}},

Planting opens around {{windowStart}}, {{daysBefore}} days from now. Let's get the planters at {{account.name}} ready before the rush.

On record for you:

{{planters}}

At the check-up we go through:

{{checklist}}

Pick a time that suits you:

{{bookingLink}}

{{specialist.name}}
{{specialist.email}}`;

const resolver: Resolver<CampaignFormValues> = async (values) => {
  const result = checkCampaignForm(values);
  if (result.ok) return { values, errors: {} };
  return {
    values: {},
    errors: Object.fromEntries(Object.entries(result.errors).map(([field, message]) => [field, { type: 'validation', message }])),
  };
};

/** The region the dealership's campaigns use most (its own country), else the first corn window. */
export function usualRegion(calendar: CalendarEntry[], campaignRegions: readonly string[]): CalendarEntry | undefined {
  const counts = new Map<string, number>();
  for (const r of campaignRegions) counts.set(r, (counts.get(r) ?? 0) + 1);
  const usual = [...counts].sort((a, b) => b[1] - a[1])[0]?.[0];
  return calendar.find((e) => e.regionKey === usual && e.crop === 'corn') ?? calendar.find((e) => e.regionKey === usual) ?? calendar.find((e) => e.crop === 'corn') ?? calendar[0];
}

function newCampaignValues(season: number, calendar: CalendarEntry[], territories: Territory[], campaignRegions: readonly string[]): CampaignFormValues {
  const first = usualRegion(calendar, campaignRegions);
  return {
    name: '',
    season: String(season),
    regionKey: first?.regionKey ?? '',
    crop: (first?.crop as Crop) ?? 'corn',
    offsetsText: '60, 30, 10',
    status: 'draft',
    territoryIds: territories.map((t) => t.id),
    growsCrop: true,
    hasRoadmapItems: false,
    noCheckupSince: '',
    subject: STARTER_SUBJECT,
    body: STARTER_BODY,
  };
}

const FIELD_ORDER: CampaignFormField[] = ['name', 'season', 'regionKey', 'crop', 'offsetsText', 'status', 'territoryIds', 'noCheckupSince', 'subject', 'body'];

export function CampaignEditor({
  campaign,
  calendar,
  territories,
  defaultSeason,
  campaignRegions,
  savedNotice,
  onCreated,
}: {
  campaign: Campaign | null;
  /** Regions of the existing campaigns: a new one starts in the usual region. */
  campaignRegions: readonly string[];
  calendar: CalendarEntry[];
  territories: Territory[];
  defaultSeason: number;
  savedNotice: string | null;
  onCreated: (campaign: Campaign) => void;
}) {
  const user = useCurrentUser();
  const queryClient = useQueryClient();
  const create = useCreateCampaignMutation();
  const update = useUpdateCampaignMutation(campaign?.id ?? 0);
  const initial = useMemo(() => (campaign ? formValuesFromCampaign(campaign) : newCampaignValues(defaultSeason, calendar, territories, campaignRegions)), []);
  // The version the form was filled from: a save made by someone else since then is a conflict, not overwritten.
  const [base, setBase] = useState<{ version: number; values: CampaignFormValues } | null>(campaign ? { version: campaign.version, values: initial } : null);
  const form = useForm<CampaignFormValues>({ resolver, defaultValues: initial, mode: 'onTouched' });
  const { register, control, handleSubmit, setError, setValue, getValues, reset, formState } = form;
  const { errors, isDirty } = formState;
  const [formError, setFormError] = useState<{ message: string; stale: boolean } | null>(null);
  const [notice, setNotice] = useState<string | null>(savedNotice);
  const [runOpen, setRunOpen] = useState(false);
  const [runResult, setRunResult] = useState<RunResult | null>(null);

  // Changing or running a campaign takes every one of its territories (the server says the same with 403).
  const canEdit = !campaign || user.role === 'admin' || campaign.audience.territoryIds.every((t) => user.territoryIds.includes(t));

  const subject = useWatch({ control, name: 'subject' }) ?? '';
  const body = useWatch({ control, name: 'body' }) ?? '';
  const regionKey = useWatch({ control, name: 'regionKey' });
  const crop = useWatch({ control, name: 'crop' });
  const season = useWatch({ control, name: 'season' });
  const offsetsText = useWatch({ control, name: 'offsetsText' });
  const status = useWatch({ control, name: 'status' });

  const live = liveTemplateCheck(subject, body);
  const templateOk = !live.subject && !live.body && subject.trim().length > 0 && body.trim().length > 0;

  // The merge-field picker writes into whichever template box was last in use.
  const [target, setTarget] = useState<'subject' | 'body'>('body');
  const subjectRef = useRef<HTMLInputElement | null>(null);
  const bodyRef = useRef<HTMLTextAreaElement | null>(null);
  const subjectReg = register('subject');
  const bodyReg = register('body');

  const insertField = (field: MergeField) => {
    const el = target === 'subject' ? subjectRef.current : bodyRef.current;
    const current = getValues(target);
    const start = el?.selectionStart ?? current.length;
    const end = el?.selectionEnd ?? current.length;
    const next = insertMergeField(current, start, end, field);
    setValue(target, next.text, { shouldDirty: true, shouldValidate: Boolean(formState.touchedFields[target]) });
    requestAnimationFrame(() => {
      el?.focus();
      el?.setSelectionRange(next.cursor, next.cursor);
    });
  };

  // Regions and crops come from the season calendar.
  const regions = useMemo(() => {
    const seen = new Map<string, string>();
    for (const e of calendar) if (!seen.has(e.regionKey)) seen.set(e.regionKey, e.regionLabel);
    return [...seen].map(([value, label]) => ({ value, label }));
  }, [calendar]);
  const planting = calendar.find((e) => e.regionKey === regionKey && e.crop === crop) ?? null;
  const seasonNumber = Number(season);
  const offsets = parseOffsetsText(offsetsText ?? '');
  const schedule = useMemo(() => {
    if (!planting || !Number.isInteger(seasonNumber) || seasonNumber < 2000 || seasonNumber > 2100 || !offsets?.length || offsets.some((o) => o > 365)) return null;
    const start = windowStartIso(seasonNumber, planting.windowStart);
    return { start, rows: reminderSchedule(start, offsets, todayUtcIso()) };
  }, [planting, seasonNumber, offsets?.join(',')]);

  useEffect(() => {
    // Saved elsewhere (another person, another tab): with nothing typed here, show the newer version;
    // with unsaved changes, the save answers 409 and offers to load it.
    if (campaign && base && campaign.version !== base.version && !isDirty) {
      const values = formValuesFromCampaign(campaign);
      reset(values);
      setBase({ version: campaign.version, values });
    }
  }, [campaign?.version]);

  const focusFirstError = (fields: CampaignFormField[]) => {
    const first = FIELD_ORDER.find((f) => fields.includes(f));
    if (first) form.setFocus(first);
  };

  const onSubmit = handleSubmit(
    (values) => {
      setFormError(null);
      const checked = checkCampaignForm(values);
      if (!checked.ok) return;
      const onError = (error: Error) => {
        if (isApiError(error) && error.status === 400 && Object.keys(error.fields).length) {
          const placed = placeServerFields(error.fields);
          for (const [field, message] of Object.entries(placed.errors)) setError(field as CampaignFormField, { type: 'server', message });
          if (placed.unplaced.length) setFormError({ message: placed.unplaced.join(' '), stale: false });
          focusFirstError(Object.keys(placed.errors) as CampaignFormField[]);
          return;
        }
        setFormError({ message: error.message, stale: isApiError(error) && error.status === 409 && error.code === 'stale' });
      };
      if (!campaign || !base) {
        create.mutate(checked.input, { onSuccess: ({ campaign: created }) => onCreated(created), onError });
        return;
      }
      const before = checkCampaignForm(base.values);
      const changes: Partial<CampaignInput> = before.ok ? changedCampaignFields(before.input, checked.input) : checked.input;
      if (!Object.keys(changes).length) {
        setNotice('Nothing has changed since the last save.');
        return;
      }
      update.mutate(
        { ...changes, version: base.version },
        {
          onSuccess: ({ campaign: saved }) => {
            const next = formValuesFromCampaign(saved);
            reset(next);
            setBase({ version: saved.version, values: next });
            setNotice(`Saved. The campaign is ${campaignStatusLooks[saved.status].label.toLowerCase()}.`);
          },
          onError,
        },
      );
    },
    (invalid) => focusFirstError(Object.keys(invalid) as CampaignFormField[]),
  );

  const [reloading, setReloading] = useState(false);
  const reloadLatest = async () => {
    if (!campaign) return;
    setReloading(true);
    try {
      const latest = await queryClient.fetchQuery({ ...campaignQueryOptions(campaign.id), staleTime: 0 });
      const values = formValuesFromCampaign(latest.campaign);
      reset(values);
      setBase({ version: latest.campaign.version, values });
      setFormError(null);
      setNotice('The latest version is loaded. Make your change again on top of it.');
    } catch (error) {
      setFormError({ message: (error as Error).message, stale: true });
    } finally {
      setReloading(false);
    }
  };

  const saving = create.isPending || update.isPending;
  const cropWord = labelOf(cropLabels, crop ?? 'corn').toLowerCase();

  return (
    <>
      <title>{`${campaign ? campaign.name : 'New campaign'} · Reminders · Rowpath`}</title>
      <PageHeader
        title={
          <span className="inline-flex flex-wrap items-center gap-3">
            {campaign ? campaign.name : 'New campaign'}
            {campaign && <CampaignStatusBadge status={campaign.status} />}
          </span>
        }
        description={
          campaign?.window
            ? `${labelOf(cropLabels, campaign.crop)} · ${campaign.window.regionLabel} · ${campaign.season} season · the window opens ${campaign.window.windowStartDate ? formatIsoDay(campaign.window.windowStartDate) : ''}`
            : 'Reminders to growers a set number of days before their planting window opens.'
        }
        actions={
          campaign && (
            <>
              <Link to={outboxHref({ campaignId: campaign.id })} className={buttonClasses('secondary')}>
                Outbox
              </Link>
              <Button onClick={() => setRunOpen(true)} disabled={!canEdit} data-run-now>
                Run now…
              </Button>
            </>
          )
        }
      />
      <div className="space-y-3">
        {!canEdit && (
          <FormAlert tone="warning">
            <p className="font-semibold">This campaign also reaches territories that are not yours.</p>
            <p>You can preview it for your growers and send yourself a test; an admin, or the manager of all its territories, changes and runs it.</p>
          </FormAlert>
        )}
        <Notice message={notice} onDone={() => setNotice(null)} />
        {runResult && <RunOutcome result={runResult} />}
        {campaign && (
          <div className="flex flex-wrap items-center gap-x-6 gap-y-2 rounded-xl border border-loam-200 bg-white px-4 py-3">
            <span className="font-semibold text-loam-800">In the outbox:</span>
            <OutboxCountsCell campaign={campaign} />
          </div>
        )}
      </div>
      {campaign && (
        <RunDialog
          campaign={campaign}
          open={runOpen}
          unsaved={isDirty}
          onClose={() => setRunOpen(false)}
          onDone={(result) => {
            setRunOpen(false);
            setRunResult(result);
          }}
        />
      )}

      <form onSubmit={onSubmit} noValidate aria-label={campaign ? `Edit ${campaign.name}` : 'New campaign'} className="mt-6 space-y-6" data-campaign-form>
        {formError && <SaveErrorAlert message={formError.message} stale={formError.stale} onReload={() => void reloadLatest()} reloading={reloading} />}

        <fieldset disabled={!canEdit} className="min-w-0 space-y-6">
          <div className="grid gap-6 lg:grid-cols-2">
            <Section title="Campaign">
              <TextField label="Name" autoComplete="off" placeholder="Pre-season check-up — corn 2027" error={errors.name?.message} {...register('name')} data-autofocus />
              <div className="grid gap-4 sm:grid-cols-2">
                <TextField label="Season" inputMode="numeric" error={errors.season?.message} {...register('season')} />
                <SelectField label="Crop" options={crops.map((c) => ({ value: c, label: cropLabels[c] }))} error={errors.crop?.message} {...register('crop')} />
              </div>
              <SelectField label="Region" options={regions} error={errors.regionKey?.message} hint="Regions come from the season calendar." {...register('regionKey')} />
              <fieldset>
                <legend className="mb-1 font-semibold text-ink-900">Status</legend>
                <div className="grid gap-2">
                  {campaignStatuses.map((s) => (
                    <label
                      key={s}
                      className={cn(
                        'flex min-h-11 cursor-pointer items-start gap-2 rounded-lg border px-3 py-2',
                        status === s ? 'border-ink-600 bg-ink-50' : 'border-loam-300 bg-white hover:bg-loam-50',
                      )}
                    >
                      <input type="radio" value={s} className="mt-1 size-5 accent-ink-700" {...register('status')} />
                      <span>
                        <span className="font-semibold text-ink-950">{campaignStatusLooks[s].label}</span>
                        <span className="text-loam-700"> — {campaignStatusLooks[s].meaning}</span>
                      </span>
                    </label>
                  ))}
                </div>
                {errors.status?.message && <FieldError message={errors.status.message} />}
            </fieldset>
          </Section>

          <Section title="When">
            <TextField
              label="Days before the window opens"
              hint="One reminder per number, e.g. 60, 30, 10. Only the latest one due is sent, so a late start sends one message, not a burst."
              inputMode="numeric"
              autoComplete="off"
              error={errors.offsetsText?.message}
              {...register('offsetsText')}
            />
            {!planting ? (
              <p className="flex items-start gap-2 font-semibold text-brick-700" data-no-window>
                <ErrorMark />
                The season calendar has no {cropWord} window for this region. Add it in the season calendar first.
              </p>
            ) : (
              <div className="rounded-lg bg-loam-50 px-4 py-3" data-editor-schedule>
                <p className="text-loam-800">
                  The {cropWord} window opens <strong className="text-ink-950">{schedule ? formatIsoDay(schedule.start) : '—'}</strong>{' '}
                  <span className="text-sm">({planting.isDefault ? 'published dates' : 'the dealership’s own dates'})</span>.
                </p>
                {schedule ? (
                  <ul className="mt-2 space-y-1">
                    {schedule.rows.map((row) => (
                      <li key={row.offsetDays} className="flex flex-wrap items-center gap-x-2">
                        <span className="font-semibold text-ink-950 tabular">{formatIsoDay(row.sendOn, true)}</span>
                        <span className="text-sm text-loam-700">{daysBeforeLabel(row.offsetDays)}</span>
                        <ScheduleStateBadge state={row.state} />
                      </li>
                    ))}
                  </ul>
                ) : (
                  <p className="mt-1 text-sm text-loam-700">Send dates show once the season and the days are valid.</p>
                )}
              </div>
            )}
          </Section>
        </div>

        <Section title="Who receives it" description="Contacts with an e-mail address who have not turned reminders off, on active and prospect accounts.">
          <div className="grid gap-6 lg:grid-cols-2">
            <Controller
              control={control}
              name="territoryIds"
              render={({ field }) => (
                <CheckboxGroup
                  ref={field.ref}
                  legend="Territories"
                  options={territories.map((t) => ({ value: t.id, label: t.name, description: `${t.accountCount} accounts` }))}
                  value={field.value}
                  onChange={field.onChange}
                  onBlur={field.onBlur}
                  error={errors.territoryIds?.message}
                  emptyText="You have no territories; ask an admin."
                />
              )}
            />
            <div className="space-y-2">
              <CheckboxField label={`Grows ${cropWord}`} hint={`Only accounts with ${cropWord} acres on record.`} {...register('growsCrop')} />
              <CheckboxField label="Has roadmap items this season" hint={`Only accounts with upgrades planned for ${Number.isInteger(seasonNumber) ? seasonNumber : 'the season'}.`} {...register('hasRoadmapItems')} />
              <TextField
                label="No pre-season check-up done since"
                type="date"
                hint="Leave empty to include growers whatever their last check-up."
                error={errors.noCheckupSince?.message}
                {...register('noCheckupSince')}
              />
            </div>
          </div>
        </Section>
        </fieldset>

        <div className="grid gap-6 xl:grid-cols-2">
          <Section title="Message">
            <fieldset disabled={!canEdit} className="min-w-0 space-y-4">
            <TextField
              label="Subject line"
              autoComplete="off"
              error={live.subject ?? errors.subject?.message}
              {...subjectReg}
              ref={(el) => {
                subjectReg.ref(el);
                subjectRef.current = el;
              }}
              onFocus={() => setTarget('subject')}
              data-template-subject
            />
            <TextAreaField
              label="Message"
              rows={18}
              hint="A blank line starts a new paragraph. A list or link field on its own paragraph becomes a bulleted list or a button. An unsubscribe link is added at the end when the message has none."
              error={live.body ?? errors.body?.message}
              className="[&_textarea]:font-mono [&_textarea]:text-[15px] [&_textarea]:leading-relaxed"
              {...bodyReg}
              ref={(el) => {
                bodyReg.ref(el);
                bodyRef.current = el;
              }}
              onFocus={() => setTarget('body')}
              data-template-body
            />
            <p className={cn('flex items-center gap-2 text-sm font-semibold', templateOk ? 'text-seedling-700' : 'text-brick-700')} role="status" data-template-check={templateOk ? 'ok' : 'problem'}>
              {templateOk ? (
                <>
                  <span aria-hidden="true">✓</span> Every merge field is known.
                </>
              ) : live.unknownFields.length ? (
                <>
                  <ErrorMark className="mt-0" /> Unknown: {live.unknownFields.map((f) => `{{${f}}}`).join(', ')}
                </>
              ) : (
                <>
                  <ErrorMark className="mt-0" /> The template needs attention.
                </>
              )}
            </p>
            <MergeFieldPicker target={target} onInsert={insertField} used={usedMergeFields(`${subject}\n${body}`)} />
            </fieldset>
          </Section>
          <div className="xl:sticky xl:top-4 xl:self-start">
            {campaign ? (
              <PreviewPanel campaign={campaign} subject={subject} body={body} templateOk={templateOk} dirty={isDirty} />
            ) : (
              <section className="rounded-xl border border-dashed border-loam-400 bg-white p-5">
                <h2 className="text-xl font-bold text-ink-900">Preview for a grower</h2>
                <p className="mt-1 text-loam-700">Save the campaign (as a draft is fine) to see each grower’s message as they will read it, and to send a test.</p>
              </section>
            )}
          </div>
        </div>

        {canEdit && (
          <div className="sticky bottom-0 z-10 -mx-4 flex flex-wrap items-center gap-3 border-t border-loam-200 bg-loam-50/95 px-4 py-4 backdrop-blur sm:-mx-6 sm:px-6 lg:-mx-10 lg:px-10">
            <Button type="submit" busy={saving}>
              {saving ? 'Saving…' : campaign ? 'Save changes' : 'Create the campaign'}
            </Button>
            {campaign && isDirty && (
              <Button variant="secondary" onClick={() => base && reset(base.values)}>
                Undo changes
              </Button>
            )}
            <span className="text-loam-700" aria-live="polite">
              {isDirty ? 'Unsaved changes' : campaign ? 'All changes saved' : ''}
            </span>
            {user.role !== 'admin' && <span className="text-sm text-loam-700">You can aim campaigns at your own territories.</span>}
          </div>
        )}
      </form>
    </>
  );
}

function Section({ title, description, children }: { title: string; description?: string; children: ReactNode }) {
  return (
    <section className="space-y-4 rounded-xl border border-loam-200 bg-white p-5 shadow-sm" aria-label={title}>
      <div>
        <h2 className="text-xl font-bold text-ink-900">{title}</h2>
        {description && <p className="text-loam-700">{description}</p>}
      </div>
      {children}
    </section>
  );
}

function FieldError({ message }: { message: string }) {
  return (
    <p className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
      <ErrorMark />
      <span>{message}</span>
    </p>
  );
}
