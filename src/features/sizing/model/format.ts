/**
 * Number formatting for the Sizing screens. Figures are computed unrounded by the shared
 * functions; only what is shown is rounded, here, so screen and API agree on the raw values.
 */

export type Rounding = 'nearest' | 'down';

const formatters = new Map<number, Intl.NumberFormat>();

function formatterFor(digits: number): Intl.NumberFormat {
  let formatter = formatters.get(digits);
  if (!formatter) {
    formatter = new Intl.NumberFormat('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
    formatters.set(digits, formatter);
  }
  return formatter;
}

/** Rounds to `digits` decimals; "down" is used for limits, since rounding a limit up would advise past it. */
export function roundTo(value: number, digits: number, rounding: Rounding = 'nearest'): number {
  const factor = 10 ** digits;
  // The small nudge keeps 6.3 × 10 = 62.99999… from flooring to 6.2.
  const rounded = rounding === 'down' ? Math.floor(value * factor + 1e-9) / factor : Math.round(value * factor) / factor;
  // Never show "-0".
  return Object.is(rounded, -0) ? 0 : rounded;
}

/** "1,234.5": en-US grouping, a fixed number of decimals. */
export function formatNumber(value: number, digits: number, rounding: Rounding = 'nearest'): string {
  return formatterFor(digits).format(roundTo(value, digits, rounding));
}

/** "1,234.5 ac/day": a number always travels with its unit. */
export function formatWithUnit(value: number, digits: number, unit: string, rounding: Rounding = 'nearest'): string {
  return unit ? `${formatNumber(value, digits, rounding)} ${unit}` : formatNumber(value, digits, rounding);
}

/**
 * A change as the screen shows it: "+42 ac/day", "−3.5 gpm". Returns null when the change
 * rounds to nothing at the figure's own precision, so "+0.0" never appears.
 */
export function formatDelta(delta: number, digits: number, unit: string): string | null {
  const rounded = roundTo(delta, digits);
  if (rounded === 0) return null;
  const sign = rounded > 0 ? '+' : '−';
  return `${sign}${formatWithUnit(Math.abs(rounded), digits, unit)}`;
}

/**
 * Reads a number typed by a person: thousands separators and spaces are ignored ("32,000"),
 * an empty box is `undefined`, anything else that is not a number is NaN (the schema then
 * answers with its own message).
 */
export function parseNumberText(text: string): number | undefined {
  const cleaned = text.replace(/[,\s]/g, '');
  if (cleaned === '') return undefined;
  // Number() accepts "0x10" and "1e3"; only plain decimals are numbers here.
  if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(cleaned)) return Number.NaN;
  return Number(cleaned);
}

/** The text a box starts with for a stored number: no grouping, no trailing zeros. */
export function numberText(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '';
  return String(roundTo(value, 4));
}
