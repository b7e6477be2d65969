import type { ScheduleState } from '@shared/calc/season-calendar';
import type { CampaignStatus, OutboxStatus } from '@shared/schemas/reminders';
import { StatusBadge } from '@/components/ui/status-badge';
import { campaignStatusLooks, outboxStatusLooks, scheduleStateLooks } from '../model/labels';

export function CampaignStatusBadge({ status }: { status: CampaignStatus }) {
  const look = campaignStatusLooks[status];
  return (
    <span title={look.meaning} data-campaign-status={status}>
      <StatusBadge tone={look.tone} shape={look.shape}>
        {look.label}
      </StatusBadge>
    </span>
  );
}

export function ScheduleStateBadge({ state }: { state: ScheduleState }) {
  const look = scheduleStateLooks[state];
  return (
    <span title={look.meaning}>
      <StatusBadge tone={look.tone} shape={look.shape}>
        {look.label}
      </StatusBadge>
    </span>
  );
}

export function OutboxStatusBadge({ status }: { status: OutboxStatus }) {
  const look = outboxStatusLooks[status];
  return (
    <span title={look.meaning} data-outbox-status={status}>
      <StatusBadge tone={look.tone} shape={look.shape}>
        {look.label}
      </StatusBadge>
    </span>
  );
}
