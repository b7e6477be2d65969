import type { MarkerShape, VisitState } from '../model/markers';
import { VISIT_STATE_STYLES } from '../model/markers';

function ShapePath({ shape, fill }: { shape: MarkerShape; fill: string }) {
  const stroke = { stroke: '#ffffff', strokeWidth: 2.5 };
  switch (shape) {
    case 'diamond':
      return <path d="M16 2 30 16 16 30 2 16Z" fill={fill} {...stroke} />;
    case 'triangle':
      return <path d="M16 2.5 30.5 28.5H1.5Z" fill={fill} {...stroke} strokeLinejoin="round" />;
    case 'square':
      return <rect x="3.5" y="3.5" width="25" height="25" rx="3" fill={fill} {...stroke} />;
    case 'circle':
      return <circle cx="16" cy="16" r="13" fill={fill} {...stroke} />;
  }
}

/** The map marker of a visit state, drawn inline (legend, filters, the account card). */
export function StateGlyph({ state, size = 28 }: { state: VisitState; size?: number }) {
  const style = VISIT_STATE_STYLES[state];
  return (
    <svg viewBox="0 0 32 32" width={size} height={size} aria-hidden="true" className="shrink-0 drop-shadow-sm">
      <ShapePath shape={style.shape} fill={style.fill} />
      <text x="16" y={style.shape === 'triangle' ? 24 : 21} textAnchor="middle" fontSize="15" fontWeight="800" fill={style.text}>
        {style.letter}
      </text>
    </svg>
  );
}

/** The "$" tab: roadmap value due this season. */
export function DueGlyph() {
  return (
    <span aria-hidden="true" className="inline-flex size-5 shrink-0 items-center justify-center rounded border-2 border-ink-950 bg-white text-xs font-extrabold text-ink-950">
      $
    </span>
  );
}
