/*
 * How the roadmap writes money, hours and chances. Summaries use whole dollars (a grower reads
 * "$1,848", not "$1,847.67"); a figure with cents keeps them where the exact amount matters.
 */

const wholeUsd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 0, minimumFractionDigits: 0 });
const centsUsd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', minimumFractionDigits: 2, maximumFractionDigits: 2 });
const hours = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });

/** "$1,848" — rounded to the dollar. */
export function formatUsd(valueUsd: number): string {
  return wholeUsd.format(Math.round(valueUsd) === 0 ? 0 : valueUsd);
}

/** "$4,880.67" when there are cents, "$4,880" when there are none. */
export function formatUsdExact(valueUsd: number): string {
  return Number.isInteger(Math.round(valueUsd * 100) / 100) ? wholeUsd.format(valueUsd) : centsUsd.format(valueUsd);
}

/** "+$1,240" / "−$1,240" / "$0": a change, with a real minus sign. */
export function formatUsdChange(deltaUsd: number): string {
  const rounded = Math.round(deltaUsd);
  if (rounded === 0) return '$0';
  return `${rounded > 0 ? '+' : '−'}${wholeUsd.format(Math.abs(rounded))}`;
}

/** "16 h", "9.6 h". */
export function formatHours(valueHours: number): string {
  return `${hours.format(valueHours)} h`;
}

/** 0.25 → "25%". */
export function formatProbability(probability: number): string {
  return `${Math.round(probability * 100)}%`;
}

/** "1 row unit" / "16 row units"-style counts are the planner's business; this is the plain "× 16". */
export function formatQuantity(quantity: number): string {
  return `× ${quantity}`;
}

export function formatDate(iso: string): string {
  const date = new Date(iso.length === 10 ? `${iso}T12:00:00Z` : iso);
  return date.toLocaleDateString('en-US', { year: 'numeric', month: 'short', day: 'numeric', timeZone: 'UTC' });
}

export function formatDateTime(iso: string): string {
  return new Date(iso).toLocaleString('en-US', { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });
}
