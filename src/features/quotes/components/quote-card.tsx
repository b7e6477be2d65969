import type { ReactNode } from 'react';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDate, formatHours, formatUsd, formatUsdExact } from '@/features/roadmap/model/format';
import { quotePdfUrl, type Quote, type QuoteStatus } from '../api/quotes';

const statusBadge: Record<QuoteStatus, { tone: 'good' | 'soon' | 'bad' | 'neutral'; shape: 'dot' | 'ring' | 'dash' | 'cross'; label: string }> = {
  open: { tone: 'soon', shape: 'ring', label: 'Waiting for the grower' },
  accepted: { tone: 'good', shape: 'dot', label: 'Accepted' },
  declined: { tone: 'bad', shape: 'cross', label: 'Declined' },
  expired: { tone: 'neutral', shape: 'dash', label: 'Expired' },
};

export function QuoteStatusBadge({ status, growerView = false }: { status: QuoteStatus; growerView?: boolean }) {
  const b = statusBadge[status];
  return (
    <span data-quote-status={status}>
      <StatusBadge tone={b.tone} shape={b.shape}>
        {status === 'open' && growerView ? 'Waiting for your answer' : b.label}
      </StatusBadge>
    </span>
  );
}

/** One quote: its items with parts and labour, the totals, the validity date, the PDF. */
export function QuoteCard({ quote, growerView = false, children }: { quote: Quote; growerView?: boolean; children?: ReactNode }) {
  return (
    <article aria-labelledby={`quote-${quote.id}-title`} data-quote-id={quote.id} data-quote-season={quote.season} className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h3 id={`quote-${quote.id}-title`} className="text-lg font-bold text-ink-900">
            Quote {quote.id} · season {quote.season}
          </h3>
          <p className="text-loam-700">
            Issued {formatDate(quote.createdAt)} · valid until {formatDate(quote.validUntil)}
            {quote.decidedAt && ` · decided ${formatDate(quote.decidedAt)}`}
          </p>
        </div>
        <QuoteStatusBadge status={quote.status} growerView={growerView} />
      </div>
      <div className="mt-3 overflow-x-auto">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Items of quote {quote.id}</caption>
          <thead className="text-sm text-loam-800">
            <tr>
              <th scope="col" className="py-1 pr-3 font-semibold">
                Item
              </th>
              <th scope="col" className="py-1 pr-3 text-right font-semibold">
                Qty
              </th>
              <th scope="col" className="py-1 pr-3 text-right font-semibold">
                Parts
              </th>
              <th scope="col" className="py-1 pr-3 text-right font-semibold">
                Labour
              </th>
              <th scope="col" className="py-1 text-right font-semibold">
                Amount
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-loam-200 tabular">
            {quote.items.map((it) => (
              <tr key={it.id}>
                <td className="py-1.5 pr-3">
                  <span className="font-semibold text-ink-950">{it.partName}</span>
                  <span className="block text-sm text-loam-700">
                    <span className="font-mono">{it.partNumber}</span>
                    {it.planterName && ` · ${it.planterName}`}
                  </span>
                </td>
                <td className="py-1.5 pr-3 text-right">{it.quantity}</td>
                <td className="py-1.5 pr-3 text-right">{formatUsd(it.partsUsd)}</td>
                <td className="py-1.5 pr-3 text-right">
                  {formatUsd(it.labourUsd)} <span className="text-sm text-loam-700">({formatHours(it.labourHours)})</span>
                </td>
                <td className="py-1.5 text-right font-semibold">{formatUsd(it.partsUsd + it.labourUsd)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot className="tabular">
            <tr className="border-t-2 border-loam-300">
              <th scope="row" colSpan={2} className="pt-2 pr-3 text-left font-bold">
                Total
              </th>
              <td className="pt-2 pr-3 text-right">{formatUsdExact(quote.partsUsd)}</td>
              <td className="pt-2 pr-3 text-right">{formatUsdExact(quote.labourUsd)}</td>
              <td className="pt-2 text-right text-lg font-bold text-ink-950" data-quote-total={quote.totalUsd}>
                {formatUsdExact(quote.totalUsd)}
              </td>
            </tr>
          </tfoot>
        </table>
      </div>
      <div className="mt-4 flex flex-wrap items-center gap-3">
        <a
          href={quotePdfUrl(quote.id)}
          download={`rowpath-quote-${quote.id}.pdf`}
          className="inline-flex min-h-11 items-center gap-2 rounded-lg border border-loam-500 bg-white px-4 font-semibold text-ink-900 hover:bg-loam-100"
        >
          <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round">
            <path d="M10 3v9M6 8.5 10 12.5 14 8.5M4 16.5h12" />
          </svg>
          Download the PDF
        </a>
        {children}
      </div>
    </article>
  );
}
