/** Whole dollars for aggregates (cents add nothing to a season's forecast). */
const usd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 0 });
const usdCents = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', minimumFractionDigits: 2, maximumFractionDigits: 2 });
const compact = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', notation: 'compact', maximumFractionDigits: 1 });
const hoursFormat = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });

export const formatUsd = (value: number) => usd.format(value);
export const formatUsdCents = (value: number) => usdCents.format(value);
/** Chart axis ticks: "$1.2M", "$45K". */
export const formatUsdShort = (value: number) => compact.format(value);
export const formatHours = (value: number) => `${hoursFormat.format(value)} h`;

/** 0.4213 → "42 %"; null (no quota) → "No quota". */
export function formatShare(share: number | null): string {
  return share === null ? 'No quota' : `${Math.round(share * 100)} %`;
}

/** "420,000" or "$420000.50" → 420000.5; empty → undefined; anything else → NaN (the schema words the error). */
export function parseUsdText(text: string): number | undefined {
  const cleaned = text.replace(/[$,\s]/g, '');
  if (cleaned === '') return undefined;
  return /^-?\d+(\.\d+)?$/.test(cleaned) ? Number(cleaned) : Number.NaN;
}
