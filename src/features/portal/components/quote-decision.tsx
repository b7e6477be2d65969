import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert } from '@/components/ui/form-field';
import { useDecideQuoteMutation, type Quote } from '@/features/quotes/api/quotes';
import { formatDate, formatUsdExact } from '@/features/roadmap/model/format';

type Decision = 'accept' | 'decline';

/**
 * The grower's answer to an open quote. Both answers ask once more, naming the season, the total
 * and what follows, because an acceptance commits the items (they are locked in their season).
 */
export function QuoteDecision({ quote, onDecided }: { quote: Quote; onDecided: (message: string) => void }) {
  const [asking, setAsking] = useState<Decision | null>(null);
  const [error, setError] = useState<string | null>(null);
  const decide = useDecideQuoteMutation(quote.accountId);

  const confirm = (decision: Decision) =>
    decide.mutate(
      { quoteId: quote.id, decision },
      {
        onSuccess: ({ quote: q }) => {
          setAsking(null);
          onDecided(
            q.status === 'accepted'
              ? `You accepted quote ${q.id} for ${q.season} (${formatUsdExact(q.totalUsd)}). Your planting specialist sees the items as accepted and will order the parts.`
              : `You declined quote ${q.id} for ${q.season}. Your planting specialist sees it and can suggest another way.`,
          );
        },
        onError: (err) => setError(err.message),
      },
    );

  return (
    <>
      <Button onClick={() => setAsking('accept')}>Accept quote {quote.id}…</Button>
      <Button variant="secondary" onClick={() => setAsking('decline')}>
        Decline…
      </Button>
      <Dialog
        open={asking !== null}
        onClose={() => {
          setAsking(null);
          setError(null);
        }}
        title={asking === 'accept' ? `Accept the ${quote.season} quote?` : `Decline the ${quote.season} quote?`}
      >
        {asking && (
          <div className="space-y-4">
            {asking === 'accept' ? (
              <p className="text-lg">
                You agree to buy these {quote.items.length} {quote.items.length === 1 ? 'item' : 'items'} for <strong className="tabular">{formatUsdExact(quote.totalUsd)}</strong>, parts and labour,
                as quoted (valid until {formatDate(quote.validUntil)}). They are then fixed in your {quote.season} season.
              </p>
            ) : (
              <p className="text-lg">
                You will not buy these {quote.items.length} {quote.items.length === 1 ? 'item' : 'items'} ({formatUsdExact(quote.totalUsd)}) as quoted. Your specialist is told and can
                plan another way.
              </p>
            )}
            <ul className="list-disc pl-6 text-loam-900">
              {quote.items.map((i) => (
                <li key={i.id}>
                  {i.partName} × {i.quantity}
                </li>
              ))}
            </ul>
            {error && <FormAlert>{error}</FormAlert>}
            <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
              <Button variant={asking === 'accept' ? 'primary' : 'danger'} busy={decide.isPending} onClick={() => confirm(asking)}>
                {asking === 'accept' ? 'Yes, accept the quote' : 'Yes, decline the quote'}
              </Button>
              <Button variant="secondary" onClick={() => setAsking(null)} data-autofocus>
                Not yet
              </Button>
            </div>
          </div>
        )}
      </Dialog>
    </>
  );
}
