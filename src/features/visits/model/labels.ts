// Words and marks for visits, shared by the calendar, the week plan and the grower's page.
import { VISIT_PURPOSE_LABELS, type VisitPurpose, type VisitStatus } from '@shared/schemas/visits';
import type { BadgeShape, BadgeTone } from '@/components/ui/status-badge';

export { VISIT_PURPOSE_LABELS };

export const VISIT_STATUS_BADGES: Record<VisitStatus, { label: string; tone: BadgeTone; shape: BadgeShape }> = {
  requested: { label: 'Requested', tone: 'soon', shape: 'ring' },
  planned: { label: 'Planned', tone: 'info', shape: 'dot' },
  done: { label: 'Done', tone: 'good', shape: 'dot' },
  cancelled: { label: 'Cancelled', tone: 'neutral', shape: 'cross' },
};

/** One letter per purpose, printed on calendar events and route stops beside the word. */
export const PURPOSE_LETTERS: Record<VisitPurpose, string> = {
  'pre-season-checkup': 'C',
  install: 'I',
  troubleshooting: 'T',
  'roadmap-review': 'R',
  'post-season-review': 'P',
};

/** Short words for tight spaces (calendar events). */
export const PURPOSE_SHORT: Record<VisitPurpose, string> = {
  'pre-season-checkup': 'Check-up',
  install: 'Install',
  troubleshooting: 'Troubleshooting',
  'roadmap-review': 'Roadmap review',
  'post-season-review': 'Post-season review',
};

/** Purposes a grower may ask for; installs are arranged with the specialist. */
export const GROWER_REQUEST_PURPOSES: readonly VisitPurpose[] = ['pre-season-checkup', 'troubleshooting', 'roadmap-review', 'post-season-review'];
