import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { api } from '@/lib/api';
import { outboxHref } from '../api/outbox-params';
import { reminderKeys, type AudienceContact, type Campaign, type OutboxMessage, type RunResult } from '../api/reminders';
import { useRunCampaignMutation } from '../api/run-campaign';
import { daysBeforeLabel, plural } from '../model/labels';
import { estimateRun, type RunEstimate } from '../model/run-estimate';
import { formatIsoDay } from '../model/season';

const PAGE = 200;
const MAX_PAGES = 100;

/** Reads every page of a list (up to MAX_PAGES × PAGE rows). */
async function allPages<T>(path: string, query: Record<string, string | number>): Promise<T[]> {
  const rows: T[] = [];
  for (let page = 1; page <= MAX_PAGES; page++) {
    const { items, total } = await api.get<{ items: T[]; total: number }>(path, { ...query, page, pageSize: PAGE });
    rows.push(...items);
    if (rows.length >= total || items.length === 0) break;
  }
  return rows;
}

/** What a run would enqueue: the audience today, less those who already have today's reminder. */
async function loadEstimate(campaign: Campaign, dueOffsetDays: number | null): Promise<RunEstimate> {
  const audience = await allPages<AudienceContact>(`/api/campaigns/${campaign.id}/audience`, {});
  const queued = dueOffsetDays === null ? [] : await allPages<OutboxMessage>('/api/outbox', { campaignId: campaign.id });
  return estimateRun(
    audience.map((a) => a.contactId),
    queued,
    dueOffsetDays,
  );
}

/**
 * "Run now": says how many messages would go in the outbox and for which reminder, then enqueues
 * them on confirmation. Only the reminder due today is sent; a contact who has it already is skipped.
 */
export function RunDialog({ campaign, open, onClose, onDone, unsaved }: { campaign: Campaign; open: boolean; onClose: () => void; onDone: (result: RunResult) => void; unsaved: boolean }) {
  const due = campaign.schedule.find((s) => s.state === 'due') ?? null;
  const next = campaign.schedule.find((s) => s.state === 'upcoming') ?? null;
  const estimate = useQuery({
    queryKey: [...reminderKeys.campaign(campaign.id), 'run-estimate', due?.offsetDays ?? null, campaign.version],
    queryFn: () => loadEstimate(campaign, due?.offsetDays ?? null),
    enabled: open && due !== null && campaign.status !== 'paused',
    staleTime: 0,
    gcTime: 0,
  });
  const run = useRunCampaignMutation(campaign.id);
  const blocked = campaign.status === 'paused' ? 'This campaign is paused. Set it to active or draft, and save, before running it.' : due === null ? noneDueText(campaign, next) : null;

  return (
    <Dialog open={open} onClose={onClose} title={`Run “${campaign.name}” now?`} description="Puts today’s reminder in the outbox for everyone in the audience; the sender starts at once.">
      <div className="space-y-4" data-run-dialog>
        {unsaved && (
          <FormAlert tone="warning">
            <p>You have unsaved changes. A run uses the saved campaign.</p>
          </FormAlert>
        )}
        {blocked ? (
          <p className="rounded-lg bg-amber-50 px-4 py-3 text-amber-800" data-run-blocked>
            <span aria-hidden="true">▲ </span>
            {blocked}
          </p>
        ) : estimate.isPending ? (
          <LoadingBlock label="Counting who would be sent this reminder…" />
        ) : estimate.isError ? (
          <FormAlert>{estimate.error.message}</FormAlert>
        ) : (
          <div data-run-estimate={estimate.data.wouldEnqueue}>
            <p className="text-lg text-ink-950">
              {estimate.data.wouldEnqueue > 0 ? (
                <>
                  <strong className="tabular">{plural(estimate.data.wouldEnqueue, 'message')}</strong> would be put in the outbox: the reminder {daysBeforeLabel(due!.offsetDays)} the window (due{' '}
                  {formatIsoDay(due!.sendOn)}).
                </>
              ) : (
                <>Nothing would be enqueued: {estimate.data.audience === 0 ? 'nobody is in the audience.' : 'everyone in the audience already has this reminder.'}</>
              )}
            </p>
            <p className="mt-1 text-loam-800">
              {plural(estimate.data.audience, 'contact')} in the audience
              {estimate.data.alreadyQueued > 0 ? `; ${estimate.data.alreadyQueued} already ${estimate.data.alreadyQueued === 1 ? 'has' : 'have'} this reminder and ${estimate.data.alreadyQueued === 1 ? 'is' : 'are'} skipped` : ''}.
            </p>
          </div>
        )}
        {run.isError && <FormAlert>{run.error.message}</FormAlert>}
        <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
          <Button
            busy={run.isPending}
            disabled={blocked !== null || !estimate.data || estimate.data.wouldEnqueue === 0}
            onClick={() => run.mutate(undefined, { onSuccess: ({ run: result }) => onDone(result) })}
            data-autofocus
          >
            {run.isPending ? 'Enqueuing…' : estimate.data && estimate.data.wouldEnqueue > 0 ? `Enqueue ${plural(estimate.data.wouldEnqueue, 'message')}` : 'Run now'}
          </Button>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
        </div>
      </div>
    </Dialog>
  );
}

function noneDueText(campaign: Campaign, next: Campaign['schedule'][number] | null): string {
  if (!campaign.window) return 'The season calendar has no planting window for this region and crop, so no reminder can be dated.';
  if (campaign.schedule.every((s) => s.state === 'closed')) return 'The planting window has opened: this campaign sends nothing more this season.';
  if (next) return `No reminder is due today. The next, ${daysBeforeLabel(next.offsetDays)} the window, is due ${formatIsoDay(next.sendOn)}.`;
  return 'No reminder is due today.';
}

/** What a run did, in words, with a link to the messages. */
export function RunOutcome({ result }: { result: RunResult }) {
  return (
    <div role="status" className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 text-seedling-900" data-run-result={result.enqueued}>
      <p className="font-semibold">
        <span aria-hidden="true">✓ </span>
        {result.enqueued > 0 ? `${plural(result.enqueued, 'message')} put in the outbox` : 'Nothing was put in the outbox'}
        {result.alreadyQueued > 0 ? `; ${result.alreadyQueued} already had this reminder` : ''}.
      </p>
      {result.note && <p>{result.note}</p>}
      {result.enqueued > 0 && (
        <p>
          The sender is on it.{' '}
          <Link to={outboxHref({ campaignId: result.campaignId })} className="font-semibold underline underline-offset-4">
            Follow them in the outbox
          </Link>
        </p>
      )}
    </div>
  );
}
