import { roadmapStages, type RoadmapStageName } from '@shared/schemas/roadmap';

export type StageShape = 'open' | 'ring' | 'half' | 'check' | 'square' | 'dot' | 'cross';
export type StageTone = 'neutral' | 'info' | 'soon' | 'good' | 'bad';

/**
 * Each stage has a word, a shape and a tone, so it reads without colour: an idea is a dotted
 * circle, a proposal a ring, a quote half filled (waiting on the grower), an acceptance a tick,
 * an order a box, an install a full dot, a decline a cross.
 */
export const STAGE_META: Record<RoadmapStageName, { label: string; shape: StageShape; tone: StageTone; hint: string }> = {
  idea: { label: 'Idea', shape: 'open', tone: 'neutral', hint: 'Not yet put to the grower' },
  proposed: { label: 'Proposed', shape: 'ring', tone: 'info', hint: 'Shown to the grower, not yet quoted' },
  quoted: { label: 'Quoted', shape: 'half', tone: 'soon', hint: 'On a quote waiting for the grower' },
  accepted: { label: 'Accepted', shape: 'check', tone: 'good', hint: 'The grower accepted it' },
  ordered: { label: 'Ordered', shape: 'square', tone: 'good', hint: 'Parts ordered' },
  installed: { label: 'Installed', shape: 'dot', tone: 'good', hint: 'On the planter' },
  declined: { label: 'Declined', shape: 'cross', tone: 'bad', hint: 'The grower declined it' },
};

export const stageOptions = roadmapStages.map((stage) => ({ value: stage, label: STAGE_META[stage].label }));
