import { StatusBadge, type BadgeShape, type BadgeTone } from '@/components/ui/status-badge';
import { accountStatusLabels, type AccountStatus } from '../api/accounts';

const look: Record<AccountStatus, { tone: BadgeTone; shape: BadgeShape }> = {
  active: { tone: 'good', shape: 'dot' },
  prospect: { tone: 'info', shape: 'ring' },
  inactive: { tone: 'neutral', shape: 'dash' },
};

export function AccountStatusBadge({ status }: { status: AccountStatus }) {
  const { tone, shape } = look[status] ?? look.inactive;
  return (
    <StatusBadge tone={tone} shape={shape}>
      {accountStatusLabels[status] ?? status}
    </StatusBadge>
  );
}
