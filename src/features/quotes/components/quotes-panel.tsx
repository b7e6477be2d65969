import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, SelectField } from '@/components/ui/form-field';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import type { Roadmap, RoadmapItem } from '@/features/roadmap/api/types';
import { formatUsd } from '@/features/roadmap/model/format';
import { quotesQueryOptions, useCreateQuoteMutation, type Quote } from '../api/quotes';
import { QuoteCard } from './quote-card';

/** Items a new quote would carry: the season's items not yet committed or declined (as the server picks them). */
export function quotableItems(roadmap: Roadmap, season: number): RoadmapItem[] {
  return roadmap.seasons.find((s) => s.season === season)?.items.filter((i) => i.stage === 'idea' || i.stage === 'proposed' || i.stage === 'quoted') ?? [];
}

/** Seasons worth quoting: some item there has not been quoted yet. */
export function seasonsToQuote(roadmap: Roadmap): number[] {
  return roadmap.seasons.filter((s) => s.items.some((i) => i.stage === 'idea' || i.stage === 'proposed')).map((s) => s.season);
}

/** Staff: the account's quotes, newest first, and a new one for a season. */
export function QuotesPanel({ accountId, roadmap, canEdit, onQuoteSeason }: { accountId: number; roadmap: Roadmap; canEdit: boolean; onQuoteSeason: (season: number) => void }) {
  const quotes = useQuery(quotesQueryOptions(accountId));
  const seasons = seasonsToQuote(roadmap);
  const [season, setSeason] = useState<string>('');
  const chosen = season && seasons.includes(Number(season)) ? season : String(seasons[0] ?? '');

  return (
    <section id="quotes" aria-labelledby="quotes-title" className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm">
      <h2 id="quotes-title" className="text-xl font-bold text-ink-900">
        Quotes
      </h2>
      <p className="mt-0.5 text-loam-700">A season’s items as a printable quote; the grower accepts or declines it in their portal.</p>
      {canEdit &&
        (seasons.length > 0 ? (
          <form
            className="mt-3 flex flex-wrap items-end gap-3"
            onSubmit={(event) => {
              event.preventDefault();
              if (chosen) onQuoteSeason(Number(chosen));
            }}
          >
            <SelectField label="Season to quote" className="w-44" value={chosen} onChange={(e) => setSeason(e.target.value)} options={seasons.map((s) => ({ value: String(s), label: String(s) }))} />
            <Button type="submit">Prepare a quote…</Button>
          </form>
        ) : (
          <p className="mt-3 text-loam-700">Every season’s items are already quoted or decided.</p>
        ))}
      <div className="mt-4 space-y-4">
        {quotes.isPending && <LoadingBlock label="Loading quotes…" />}
        {quotes.isError && <ErrorState title="The quotes could not be loaded" message={quotes.error.message} onRetry={() => void quotes.refetch()} />}
        {quotes.isSuccess && quotes.data.length === 0 && <p className="text-loam-700">No quotes yet.</p>}
        {quotes.data?.map((q) => <QuoteCard key={q.id} quote={q} />)}
      </div>
    </section>
  );
}

/** Asks before quoting: the items, the total, and what happens to their stage. */
export function CreateQuoteDialog({ accountId, roadmap, season, onClose, onCreated }: { accountId: number; roadmap: Roadmap; season: number | null; onClose: () => void; onCreated: (quote: Quote) => void }) {
  const create = useCreateQuoteMutation(accountId);
  const [error, setError] = useState<string | null>(null);
  const items = season === null ? [] : quotableItems(roadmap, season);
  const total = items.reduce((s, i) => s + i.costUsd, 0);
  return (
    <Dialog
      open={season !== null}
      onClose={() => {
        setError(null);
        onClose();
      }}
      title={season !== null ? `Quote ${season} to the grower?` : ''}
    >
      {season !== null && (
        <div className="space-y-4">
          <ul className="divide-y divide-loam-200">
            {items.map((i) => (
              <li key={i.id} className="flex justify-between gap-3 py-1.5">
                <span>
                  {i.partName} <span className="text-sm text-loam-700">× {i.quantity}</span>
                </span>
                <span className="font-semibold tabular">{formatUsd(i.costUsd)}</span>
              </li>
            ))}
          </ul>
          <p className="text-lg">
            Total <strong className="tabular">{formatUsd(total)}</strong> for parts and labour. These items move to the stage “Quoted”, and the grower can accept or decline the quote in
            their portal until it expires.
          </p>
          {error && <FormAlert>{error}</FormAlert>}
          <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
            <Button
              busy={create.isPending}
              onClick={() =>
                create.mutate(season, {
                  onSuccess: ({ quote }) => {
                    setError(null);
                    onCreated(quote);
                    onClose();
                  },
                  onError: (err) => setError(err.message),
                })
              }
            >
              Create the quote
            </Button>
            <Button variant="secondary" onClick={onClose} data-autofocus>
              Not now
            </Button>
          </div>
        </div>
      )}
    </Dialog>
  );
}
