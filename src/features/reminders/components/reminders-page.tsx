import { useQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState } from '@/components/ui/states';
import { CAMPAIGN_LIST, campaignListQueryOptions, messagesInFlight } from '../api/reminders';
import { comingSeason, todayUtcIso } from '../model/season';
import { CampaignsTable } from './campaigns-table';
import { RemindersNav } from './reminders-nav';
import { SeasonCalendar } from './season-calendar';

/** Staff: the campaigns for the coming season(s), and the planting windows they count back from. */
export function RemindersPage() {
  const [params, setParams] = useSearchParams();
  const paramSeason = Number(params.get('season'));
  const season = Number.isInteger(paramSeason) && paramSeason >= 2000 && paramSeason <= 2100 ? paramSeason : comingSeason(todayUtcIso());
  const campaigns = useQuery({
    ...campaignListQueryOptions(CAMPAIGN_LIST),
    // While messages are on their way, the counts follow the sender.
    refetchInterval: (query) => (query.state.data?.items.some((c) => messagesInFlight(c.outbox) > 0) ? 4000 : false),
  });

  return (
    <>
      <title>Reminders · Rowpath</title>
      <PageHeader
        title="Pre-season reminders"
        description="E-mails that go to growers a set number of days before planting opens: check-up booking, wear parts, calibration, early orders."
        actions={
          <ButtonLink to="/reminders/campaigns/new" variant="primary">
            <span aria-hidden="true" className="text-xl leading-none">+</span> New campaign
          </ButtonLink>
        }
      />
      <RemindersNav />
      <section aria-labelledby="campaigns-title">
        <h2 id="campaigns-title" className="mb-3 text-xl font-bold text-ink-900">
          Campaigns
        </h2>
        {campaigns.isError ? (
          <ErrorState title="Campaigns could not be loaded" message={campaigns.error.message} onRetry={() => void campaigns.refetch()} retrying={campaigns.isFetching} />
        ) : (
          <CampaignsTable campaigns={campaigns.data?.items ?? []} isLoading={campaigns.isPending} isRefreshing={campaigns.isPlaceholderData} />
        )}
      </section>
      <SeasonCalendar
        season={season}
        onSeasonChange={(next) =>
          setParams(
            (current) => {
              const p = new URLSearchParams(current);
              p.set('season', String(next));
              return p;
            },
            { replace: true },
          )
        }
      />
    </>
  );
}
