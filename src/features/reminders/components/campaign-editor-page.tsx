import { useQuery } from '@tanstack/react-query';
import { Link, useLocation, useNavigate, useParams } from 'react-router-dom';
import { buttonClasses } from '@/components/ui/button';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { isApiError } from '@/lib/api';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { CAMPAIGN_LIST, campaignListQueryOptions, campaignQueryOptions, messagesInFlight, seasonCalendarQueryOptions } from '../api/reminders';
import { comingSeason, todayUtcIso } from '../model/season';
import { CampaignEditor } from './campaign-editor';

/** 'new' or a positive id from the address; null for anything else. */
export function parseCampaignParam(value: string | undefined): number | 'new' | null {
  if (value === 'new') return 'new';
  if (!value || !/^\d{1,9}$/.test(value)) return null;
  const id = Number(value);
  return id >= 1 ? id : null;
}

function BackLink() {
  return (
    <Link to="/reminders" className="mb-3 inline-flex min-h-11 items-center gap-1 font-semibold text-ink-700 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800">
      <span aria-hidden="true">‹</span> All campaigns
    </Link>
  );
}

/** /reminders/campaigns/:campaignId — a campaign's settings, its message with a live preview, and Run now. */
export function CampaignEditorPage() {
  const param = parseCampaignParam(useParams().campaignId);
  const id = typeof param === 'number' ? param : null;
  const location = useLocation();
  const navigate = useNavigate();
  const season = comingSeason(todayUtcIso());
  const campaign = useQuery({
    ...campaignQueryOptions(id ?? 0),
    enabled: id !== null,
    refetchInterval: (query) => (messagesInFlight(query.state.data?.campaign.outbox) > 0 ? 4000 : false),
  });
  const calendar = useQuery(seasonCalendarQueryOptions(season));
  const territories = useQuery(territoriesQueryOptions());
  // Only for a new campaign's starting region; the editor does not wait for it.
  const campaigns = useQuery({ ...campaignListQueryOptions(CAMPAIGN_LIST), enabled: id === null });

  if (param === null) {
    return (
      <>
        <BackLink />
        <ErrorState title="There is no campaign at this address" message="Check the link, or open the campaign from the list." />
      </>
    );
  }
  const failed = (id !== null && campaign.isError && campaign.error) || (calendar.isError && calendar.error) || (territories.isError && territories.error);
  if (failed) {
    return (
      <>
        <BackLink />
        <ErrorState
          title={id !== null && campaign.isError && isApiError(campaign.error) && campaign.error.status === 404 ? 'That campaign was not found, or it is outside your territories' : 'The campaign could not be loaded'}
          message={failed.message}
          onRetry={() => {
            void campaign.refetch();
            void calendar.refetch();
            void territories.refetch();
          }}
        />
      </>
    );
  }
  if ((id !== null && campaign.isPending) || (id === null && campaigns.isPending) || calendar.isPending || territories.isPending) {
    return (
      <>
        <BackLink />
        <LoadingBlock label="Loading the campaign…" />
      </>
    );
  }
  return (
    <>
      <BackLink />
      <CampaignEditor
        key={id ?? 'new'}
        campaign={id !== null ? (campaign.data ?? null) : null}
        calendar={calendar.data}
        territories={territories.data}
        defaultSeason={season}
        campaignRegions={campaigns.data?.items.map((c) => c.regionKey) ?? []}
        savedNotice={(location.state as { notice?: string } | null)?.notice ?? null}
        onCreated={(created) => navigate(`/reminders/campaigns/${created.id}`, { replace: true, state: { notice: `Campaign “${created.name}” saved as ${created.status}.` } })}
      />
      <p className="mt-8">
        <Link to="/reminders" className={buttonClasses('ghost')}>
          <span aria-hidden="true">‹</span> Back to all campaigns
        </Link>
      </p>
    </>
  );
}
