import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { territoriesQueryOptions } from '@/features/territories/api/territories';
import { ComingNote, Panel, countFormat } from './cards';

export function ManagerHome() {
  const territories = useQuery(territoriesQueryOptions());
  const totalAccounts = territories.data?.reduce((sum, t) => sum + t.accountCount, 0) ?? 0;

  return (
    <>
      <title>Territories you manage · Rowpath</title>
      <PageHeader title="Territories you manage" description="Accounts per territory across your team." />

      <Panel title="Territories" titleId="manager-territories">
        {territories.isPending && <LoadingBlock label="Loading territories…" />}
        {territories.isError && (
          <ErrorState title="Territories could not be loaded" message={territories.error.message} onRetry={() => void territories.refetch()} />
        )}
        {territories.isSuccess && territories.data.length === 0 && (
          <EmptyState title="No territories assigned to you yet">Ask your Rowpath administrator to assign the territories you manage.</EmptyState>
        )}
        {territories.isSuccess && territories.data.length > 0 && (
          <div className="overflow-x-auto">
            <table className="w-full text-left">
              <caption className="sr-only">Territories you manage, with account counts</caption>
              <thead className="text-sm text-loam-700">
                <tr className="border-b border-loam-300">
                  <th scope="col" className="py-2 pr-4 font-semibold">Territory</th>
                  <th scope="col" className="py-2 pr-4 font-semibold">Region</th>
                  <th scope="col" className="py-2 text-right font-semibold">Accounts</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-loam-200">
                {territories.data.map((territory) => (
                  <tr key={territory.id}>
                    <th scope="row" className="py-1 pr-4 font-normal">
                      <Link
                        to={`/accounts?territoryId=${territory.id}`}
                        className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800"
                      >
                        {territory.name}
                      </Link>
                    </th>
                    <td className="py-1 pr-4 text-loam-800">{territory.region}</td>
                    <td className="py-1 text-right tabular">{countFormat.format(territory.accountCount)}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr className="border-t-2 border-loam-300">
                  <th scope="row" colSpan={2} className="pt-3 font-semibold">
                    All your territories
                  </th>
                  <td className="pt-3 text-right font-semibold tabular">{countFormat.format(totalAccounts)}</td>
                </tr>
              </tfoot>
            </table>
          </div>
        )}
      </Panel>

      <div className="mt-6">
        <ComingNote>Revenue forecasts, quotas and shop capacity before planting will show here as they are added to Rowpath.</ComingNote>
      </div>
    </>
  );
}
