import type { MapMarker } from '@shared/schemas/visits';
import { ButtonLink } from '@/components/ui/button';
import { accountStatusLabels } from '@/features/accounts/api/accounts';
import { instantText } from '@/features/visits/model/zone-time';
import { VISIT_STATE_STYLES } from '../model/markers';
import { DueGlyph, StateGlyph } from './state-glyph';

const usd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 0 });

function sinceText(days: number | null): string {
  if (days === null) return 'No visit on record';
  if (days === 0) return 'Today';
  return `${days.toLocaleString('en-US')} ${days === 1 ? 'day' : 'days'} ago`;
}

/** The selected account's summary beside the map, with the way into its record. */
export function AccountCard({ marker, season, onClose }: { marker: MapMarker; season: number; onClose: () => void }) {
  const state = VISIT_STATE_STYLES[marker.visitState];
  return (
    <section aria-labelledby="map-account-title" className="rounded-xl border-2 border-ink-700 bg-white p-4 shadow-sm">
      <div className="flex items-start justify-between gap-2">
        <div>
          <h2 id="map-account-title" className="text-lg font-bold text-ink-900">
            {marker.name}
          </h2>
          <p className="text-loam-700">
            {marker.town ?? 'No town recorded'} · {accountStatusLabels[marker.status]}
          </p>
        </div>
        <button
          type="button"
          onClick={onClose}
          aria-label="Close the account summary"
          className="-mt-1 -mr-2 inline-flex size-11 shrink-0 items-center justify-center rounded-lg text-ink-700 hover:bg-loam-100"
        >
          <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true">
            <path d="M5 5l10 10M15 5 5 15" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
          </svg>
        </button>
      </div>
      <p className="mt-3 flex items-center gap-2 font-semibold text-ink-900">
        <StateGlyph state={marker.visitState} size={24} />
        {state.label}
      </p>
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1.5 text-sm">
        <dt className="text-loam-700">Last visit</dt>
        <dd className="tabular font-semibold text-ink-900">{sinceText(marker.daysSinceLastVisit)}</dd>
        <dt className="text-loam-700">Open requests</dt>
        <dd className="tabular font-semibold text-ink-900">{marker.openRequests}</dd>
        <dt className="text-loam-700">Next visit</dt>
        <dd className="font-semibold text-ink-900">{marker.nextVisitAt ? instantText(marker.nextVisitAt) : 'None planned'}</dd>
        <dt className="text-loam-700">Roadmap due {season}</dt>
        <dd className="tabular flex items-center gap-1.5 font-semibold text-ink-900">
          {marker.roadmapDueThisSeasonUsd > 0 && <DueGlyph />}
          {usd.format(marker.roadmapDueThisSeasonUsd)}
        </dd>
      </dl>
      <div className="mt-4 flex flex-wrap gap-2">
        <ButtonLink to={`/accounts/${marker.id}`} variant="primary">
          Open the account
        </ButtonLink>
      </div>
    </section>
  );
}
