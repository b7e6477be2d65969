// Words, tones and shapes for the reminder states: every state reads as a word and a shape,
// never by colour alone.
import type { ScheduleState } from '@shared/calc/season-calendar';
import type { CampaignStatus, OutboxStatus } from '@shared/schemas/reminders';
import type { BadgeShape, BadgeTone } from '@/components/ui/status-badge';

interface Look {
  label: string;
  tone: BadgeTone;
  shape: BadgeShape;
  /** One line on what the state means, for hints and titles. */
  meaning: string;
}

export const campaignStatusLooks: Record<CampaignStatus, Look> = {
  draft: { label: 'Draft', tone: 'neutral', shape: 'ring', meaning: 'Sends only when someone presses Run now.' },
  active: { label: 'Active', tone: 'good', shape: 'dot', meaning: 'Each reminder goes out by itself on its day.' },
  paused: { label: 'Paused', tone: 'soon', shape: 'dash', meaning: 'Nothing goes out; queued messages are held.' },
};

export const scheduleStateLooks: Record<ScheduleState, Look> = {
  upcoming: { label: 'Upcoming', tone: 'info', shape: 'ring', meaning: 'Goes out on this day.' },
  due: { label: 'Due now', tone: 'soon', shape: 'triangle', meaning: 'The reminder to send today.' },
  superseded: { label: 'Passed', tone: 'neutral', shape: 'dash', meaning: 'A later reminder is due, so this one is not sent any more.' },
  closed: { label: 'Window open', tone: 'neutral', shape: 'cross', meaning: 'Planting has begun; nothing more is sent.' },
};

export const outboxStatusLooks: Record<OutboxStatus, Look> = {
  pending: { label: 'Pending', tone: 'info', shape: 'ring', meaning: 'Waiting for the sender (or for its next attempt).' },
  sending: { label: 'Sending', tone: 'info', shape: 'dot', meaning: 'Being handed to the mail server now.' },
  sent: { label: 'Sent', tone: 'good', shape: 'dot', meaning: 'Accepted by the mail server.' },
  failed: { label: 'Failed', tone: 'bad', shape: 'triangle', meaning: 'Could not be delivered; see the error, then retry.' },
  held: { label: 'Held', tone: 'soon', shape: 'dash', meaning: 'The campaign is paused; it goes when the campaign resumes.' },
  cancelled: { label: 'Cancelled', tone: 'neutral', shape: 'cross', meaning: 'Not sent: the contact unsubscribed.' },
};

/** The order statuses are offered in, as the life of a message runs. */
export const outboxStatusOrder: OutboxStatus[] = ['pending', 'sending', 'sent', 'failed', 'held', 'cancelled'];

export function daysBeforeLabel(offsetDays: number): string {
  return offsetDays === 0 ? 'on the day the window opens' : `${offsetDays} ${offsetDays === 1 ? 'day' : 'days'} before`;
}

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${new Intl.NumberFormat('en-US').format(n)} ${n === 1 ? one : many}`;
}
