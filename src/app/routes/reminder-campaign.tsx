import type { LoaderFunctionArgs } from 'react-router-dom';
import { RequireRole } from '@/features/auth/components/require-auth';
import { campaignQueryOptions, seasonCalendarQueryOptions } from '@/features/reminders/api/reminders';
import { CampaignEditorPage, parseCampaignParam } from '@/features/reminders/components/campaign-editor-page';
import { comingSeason, todayUtcIso } from '@/features/reminders/model/season';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { currentUserForLoader, queryClient } from './prime';

export function Component() {
  return (
    <RequireRole roles={['admin', 'manager', 'specialist']}>
      <CampaignEditorPage />
    </RequireRole>
  );
}

export async function loader({ params }: LoaderFunctionArgs) {
  const user = await currentUserForLoader();
  if (!user || user.role === 'grower') return null;
  const id = parseCampaignParam(params.campaignId);
  if (typeof id === 'number') void queryClient.prefetchQuery(campaignQueryOptions(id));
  void queryClient.prefetchQuery(seasonCalendarQueryOptions(comingSeason(todayUtcIso())));
  void queryClient.prefetchQuery(territoriesQueryOptions());
  return null;
}
