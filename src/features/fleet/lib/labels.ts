import type { ComponentCategory, InstallScope } from '@shared/schemas/fleet';
import { componentCategories, cropsHandled, foldTypes, frameTypes, seedSupplyTypes } from '@shared/schemas/fleet';

/** How each catalog category is named on screen, in full and in a few letters for tight places. */
export const categoryLabels: Record<ComponentCategory, string> = {
  'seed-meter': 'Seed meter',
  'meter-drive': 'Meter drive',
  downforce: 'Downforce',
  'seed-delivery': 'Seed delivery and sensing',
  'row-cleaner': 'Row cleaner',
  'closing-system': 'Closing system',
  'in-furrow-liquid': 'In-furrow liquid',
  'liquid-monitoring': 'Liquid flow monitoring',
  'section-control': 'Section control',
  'dry-fertilizer': 'Dry fertilizer',
  'hydraulic-supply': 'Hydraulic supply',
  display: 'Display',
  'harness-controller': 'Harness or controller',
  other: 'Other',
};

export const categoryShortLabels: Record<ComponentCategory, string> = {
  'seed-meter': 'Meter',
  'meter-drive': 'Drive',
  downforce: 'Downforce',
  'seed-delivery': 'Delivery',
  'row-cleaner': 'Cleaner',
  'closing-system': 'Closing',
  'in-furrow-liquid': 'Liquid',
  'liquid-monitoring': 'Flow mon.',
  'section-control': 'Sections',
  'dry-fertilizer': 'Dry fert.',
  'hydraulic-supply': 'Hydraulics',
  display: 'Display',
  'harness-controller': 'Controller',
  other: 'Other',
};

/**
 * The order parts sit on a row unit from front to back (row cleaner ahead of the opener, closing
 * wheels last; common practice), so the drawing stacks them the way a specialist walks the unit.
 * Parts that are not on the row unit itself follow.
 */
export const categoryOrder: readonly ComponentCategory[] = [
  'row-cleaner',
  'downforce',
  'seed-meter',
  'meter-drive',
  'seed-delivery',
  'section-control',
  'in-furrow-liquid',
  'liquid-monitoring',
  'closing-system',
  'dry-fertilizer',
  'hydraulic-supply',
  'harness-controller',
  'display',
  'other',
];

export const categoryOptions = componentCategories.map((c) => ({ value: c, label: categoryLabels[c] }));

export const unitLabels: Record<'row' | 'toolbar' | 'planter', string> = {
  row: 'Per row',
  toolbar: 'Per toolbar',
  planter: 'Per planter',
};

export const scopeLabels: Record<InstallScope, string> = {
  'all-rows': 'Every row',
  rows: 'A range of rows',
  toolbar: 'One toolbar',
  planter: 'The whole planter',
};

export const frameTypeLabels: Record<(typeof frameTypes)[number], string> = {
  rigid: 'Rigid frame',
  'three-section-flex': 'Three-section flex',
  'five-section-flex': 'Five-section flex',
  'split-row': 'Split-row',
  'twin-row': 'Twin-row',
};

export const foldTypeLabels: Record<(typeof foldTypes)[number], string> = {
  none: 'No fold',
  stack: 'Stack fold',
  front: 'Front fold',
  vertical: 'Vertical fold',
  'rear-pivot': 'Rear-pivot fold',
};

export const seedSupplyLabels: Record<(typeof seedSupplyTypes)[number], string> = {
  'row-hoppers': 'Row hoppers',
  'central-fill': 'Central fill',
};

export const cropLabels: Record<(typeof cropsHandled)[number], string> = {
  corn: 'Corn',
  soybean: 'Soybeans',
  sorghum: 'Sorghum',
  wheat: 'Wheat',
  sunflower: 'Sunflower',
  cotton: 'Cotton',
};

export const frameTypeOptions = frameTypes.map((v) => ({ value: v, label: frameTypeLabels[v] }));
export const foldTypeOptions = foldTypes.map((v) => ({ value: v, label: foldTypeLabels[v] }));
export const seedSupplyOptions = seedSupplyTypes.map((v) => ({ value: v, label: seedSupplyLabels[v] }));

/** A label for a stored value that may be newer than this client's list. */
export function labelOf<K extends string>(labels: Record<K, string>, value: string): string {
  return (labels as Record<string, string>)[value] ?? value;
}

// ---- formatting: numbers always with their units ----

const number1 = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });
const number2 = new Intl.NumberFormat('en-US', { maximumFractionDigits: 2 });
const usd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });
const dateFormat = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'UTC' });
const dateTimeFormat = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

export const formatNumber = (value: number, digits: 1 | 2 = 1) => (digits === 1 ? number1 : number2).format(value);
export const formatUsd = (value: number) => usd.format(value);
/** A calendar date (YYYY-MM-DD) as "Mar 15, 2026"; read as UTC so it never shifts a day. */
export const formatDate = (iso: string) => dateFormat.format(new Date(`${iso.slice(0, 10)}T00:00:00Z`));
export const formatDateTime = (iso: string) => dateTimeFormat.format(new Date(iso));

export function formatCoordinate(value: number, positive: string, negative: string): string {
  return `${Math.abs(value).toFixed(4)}° ${value >= 0 ? positive : negative}`;
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} kB`;
  return `${number1.format(bytes / (1024 * 1024))} MB`;
}

/** Today's date in the browser's own time zone, as YYYY-MM-DD (the default install date). */
export function todayIso(): string {
  const now = new Date();
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}
