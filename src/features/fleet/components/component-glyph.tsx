import type { ComponentCategory } from '@shared/schemas/fleet';
import { categoryLabels } from '../lib/labels';

/*
 * Each catalog category has a glyph: a shape, a letter and a colour family (ink for seed handling,
 * loam for parts that work the soil, teal for liquid and fertilizer, slate for control and power).
 * Shape and letter carry the meaning on their own, so nothing depends on colour.
 */

type Shape = 'circle' | 'square' | 'diamond' | 'tri-down' | 'tri-up' | 'hexagon' | 'drop' | 'capsule';

interface GlyphSpec {
  shape: Shape;
  letter: string;
  fill: string;
}

const seed = '#363f68'; // ink-700
const soil = '#564c41'; // loam-700
const liquid = '#145f56'; // seedling-700
const control = '#5a6592'; // ink-500

export const glyphSpecs: Record<ComponentCategory, GlyphSpec> = {
  'row-cleaner': { shape: 'tri-down', letter: 'R', fill: soil },
  downforce: { shape: 'square', letter: 'F', fill: soil },
  'seed-meter': { shape: 'circle', letter: 'M', fill: seed },
  'meter-drive': { shape: 'hexagon', letter: 'D', fill: seed },
  'seed-delivery': { shape: 'capsule', letter: 'S', fill: seed },
  'section-control': { shape: 'diamond', letter: 'X', fill: control },
  'in-furrow-liquid': { shape: 'drop', letter: 'L', fill: liquid },
  'liquid-monitoring': { shape: 'capsule', letter: 'Q', fill: liquid },
  'closing-system': { shape: 'tri-up', letter: 'C', fill: soil },
  'dry-fertilizer': { shape: 'square', letter: 'G', fill: liquid },
  'hydraulic-supply': { shape: 'hexagon', letter: 'H', fill: control },
  'harness-controller': { shape: 'diamond', letter: 'K', fill: control },
  display: { shape: 'capsule', letter: 'V', fill: control },
  other: { shape: 'circle', letter: 'O', fill: control },
};

function shapePath(shape: Shape, s: number): string {
  const h = s / 2;
  switch (shape) {
    case 'square':
      return `M1 1H${s - 1}V${s - 1}H1Z`;
    case 'diamond':
      return `M${h} 0L${s} ${h}L${h} ${s}L0 ${h}Z`;
    case 'tri-down':
      return `M0 1H${s}L${h} ${s}Z`;
    case 'tri-up':
      return `M${h} 0L${s} ${s - 1}H0Z`;
    case 'hexagon':
      return `M${s * 0.25} 0.5H${s * 0.75}L${s} ${h}L${s * 0.75} ${s - 0.5}H${s * 0.25}L0 ${h}Z`;
    case 'drop':
      return `M${h} 0C${s * 0.8} ${s * 0.35} ${s} ${s * 0.55} ${s} ${s * 0.68}A${h} ${s * 0.32} 0 0 1 0 ${s * 0.68}C0 ${s * 0.55} ${s * 0.2} ${s * 0.35} ${h} 0Z`;
    case 'capsule':
      return `M${s * 0.3} 1H${s * 0.7}A${s * 0.3} ${h - 1} 0 0 1 ${s * 0.7} ${s - 1}H${s * 0.3}A${s * 0.3} ${h - 1} 0 0 1 ${s * 0.3} 1Z`;
    case 'circle':
    default:
      return `M${h} 0A${h} ${h} 0 1 1 ${h} ${s}A${h} ${h} 0 1 1 ${h} 0Z`;
  }
}

/** The glyph drawn at (x, y) inside an SVG; decorative (the owner names the parts). */
export function GlyphShape({ category, x, y, size }: { category: ComponentCategory; x: number; y: number; size: number }) {
  const spec = glyphSpecs[category] ?? glyphSpecs.other;
  // Letters sit at the visual centre of each shape (a triangle's is a third of the way in from its base).
  const letterY = spec.shape === 'tri-down' ? size * 0.4 : spec.shape === 'tri-up' ? size * 0.7 : spec.shape === 'drop' ? size * 0.7 : size * 0.55;
  return (
    <g transform={`translate(${x} ${y})`} aria-hidden="true">
      <path d={shapePath(spec.shape, size)} fill={spec.fill} />
      <text
        x={size / 2}
        y={letterY}
        textAnchor="middle"
        dominantBaseline="middle"
        fill="#ffffff"
        fontSize={Math.max(7, size * (spec.shape === 'tri-down' || spec.shape === 'tri-up' ? 0.5 : 0.6))}
        fontWeight={700}
        style={{ pointerEvents: 'none' }}
      >
        {spec.letter}
      </text>
    </g>
  );
}

/** A stand-alone glyph for lists and the legend, with the category's name for screen readers. */
export function GlyphIcon({ category, size = 20, labelled = false }: { category: ComponentCategory; size?: number; labelled?: boolean }) {
  return (
    <svg
      viewBox={`0 0 ${size} ${size}`}
      width={size}
      height={size}
      className="shrink-0"
      role={labelled ? 'img' : undefined}
      aria-label={labelled ? categoryLabels[category] : undefined}
      aria-hidden={labelled ? undefined : true}
    >
      <GlyphShape category={category} x={0} y={0} size={size} />
    </svg>
  );
}
