import { useSyncExternalStore } from 'react';
import { flushSync } from 'react-dom';
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { ForecastRow } from '../api/forecast';
import { formatUsd, formatUsdShort } from '../api/format';

/*
 * Pipeline (every open item at full value), weighted (× its stage's probability) and actual
 * (installed) side by side. Three hues from the palette, told apart also by the legend's words and
 * by the table below that carries the same figures. A click on any bar opens its items.
 */
export const seriesColours = {
  pipelineUsd: '#a99b89', // loam-400
  weightedUsd: '#363f68', // ink-700
  actualUsd: '#1f9383', // seedling-500
} as const;

const series = [
  { dataKey: 'pipelineUsd', name: 'Pipeline' },
  { dataKey: 'weightedUsd', name: 'Weighted' },
  { dataKey: 'actualUsd', name: 'Actual (installed)' },
] as const;

/*
 * On paper the chart gets a fixed size that fits a landscape letter sheet (about 960 CSS px
 * between 12 mm margins): a responsive chart keeps its screen width, since the browser lays the
 * page out for print without telling the chart in time. beforeprint is flushed synchronously so
 * the fixed-size chart is drawn before the sheet is.
 */
export const PRINT_CHART_WIDTH_PX = 900;
let printing = false;
function subscribePrint(onChange: () => void) {
  const set = (next: boolean) => {
    if (next === printing) return;
    printing = next;
    flushSync(onChange);
  };
  const before = () => set(true);
  const after = () => set(false);
  const media = window.matchMedia('print');
  const onMedia = (event: MediaQueryListEvent) => set(event.matches);
  window.addEventListener('beforeprint', before);
  window.addEventListener('afterprint', after);
  media.addEventListener('change', onMedia);
  return () => {
    window.removeEventListener('beforeprint', before);
    window.removeEventListener('afterprint', after);
    media.removeEventListener('change', onMedia);
  };
}
const printSnapshot = () => printing;

function Bars({ rows, onSelect, size }: { rows: ForecastRow[]; onSelect: (row: ForecastRow) => void; size?: { width: number; height: number } }) {
  // Long account or specialist names tilt so that a dozen bars stay legible at 1280 px.
  const tilt = rows.length > 6;
  return (
    <BarChart {...size} data={rows} margin={{ top: 8, right: 8, bottom: tilt ? 48 : 8, left: 8 }} barGap={2}>
      <CartesianGrid vertical={false} stroke="#e1dacf" />
      <XAxis
        dataKey="label"
        tick={{ fill: '#3e3730', fontSize: 13 }}
        interval={0}
        angle={tilt ? -30 : 0}
        textAnchor={tilt ? 'end' : 'middle'}
        height={tilt ? 70 : 30}
        tickFormatter={(value: string) => (value.length > 18 ? `${value.slice(0, 17)}…` : value)}
      />
      <YAxis tickFormatter={formatUsdShort} tick={{ fill: '#3e3730', fontSize: 13 }} width={64} />
      <Tooltip formatter={(value) => formatUsd(Number(value))} cursor={{ fill: '#efebe4' }} />
      <Legend wrapperStyle={{ fontSize: 14 }} itemSorter={null} formatter={(value) => <span style={{ color: '#2a2520' }}>{value}</span>} />
      {series.map((s) => (
        <Bar
          key={s.dataKey}
          dataKey={s.dataKey}
          name={s.name}
          fill={seriesColours[s.dataKey]}
          isAnimationActive={false}
          cursor="pointer"
          onClick={(_data, index) => {
            const row = rows[index];
            if (row) onSelect(row);
          }}
        />
      ))}
    </BarChart>
  );
}

export function ForecastChart({
  rows,
  onSelect,
  height = 320,
  label,
}: {
  rows: ForecastRow[];
  onSelect: (row: ForecastRow) => void;
  height?: number;
  /** Names the chart for assistive technology; the table beside it is the readable equivalent. */
  label: string;
}) {
  const onPaper = useSyncExternalStore(subscribePrint, printSnapshot, () => false);
  return (
    <figure className="forecast-chart" aria-label={label} data-forecast-chart>
      {onPaper ? (
        <Bars rows={rows} onSelect={onSelect} size={{ width: PRINT_CHART_WIDTH_PX, height: 260 }} />
      ) : (
        <div style={{ height }}>
          <ResponsiveContainer width="100%" height="100%">
            <Bars rows={rows} onSelect={onSelect} />
          </ResponsiveContainer>
        </div>
      )}
      <figcaption className="sr-only">{label}. The table below lists the same figures; choose a row to see its items.</figcaption>
    </figure>
  );
}
