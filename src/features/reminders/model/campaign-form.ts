// The campaign editor's values and the API's campaign body, both ways, checked by the shared
// schema so the browser refuses exactly what the server would. Messages from either side land
// on the field the person typed into (the offsets box, the territory list, the date box).
import { campaignSchema, type CampaignInput, type CampaignStatus } from '@shared/schemas/reminders';
import type { Crop } from '@shared/schemas/accounts';
import { formatOffsets, parseOffsetsText } from './offsets';

export interface CampaignFormValues {
  name: string;
  season: string;
  regionKey: string;
  crop: Crop;
  offsetsText: string;
  status: CampaignStatus;
  territoryIds: number[];
  growsCrop: boolean;
  hasRoadmapItems: boolean;
  /** YYYY-MM-DD or '' for "any time". */
  noCheckupSince: string;
  subject: string;
  body: string;
}

export type CampaignFormField = keyof CampaignFormValues;

export interface CampaignLike {
  name: string;
  season: number;
  regionKey: string;
  crop: string;
  offsetsDays: number[];
  status: CampaignStatus;
  audience: { territoryIds: number[]; growsCrop: boolean; hasRoadmapItems: boolean; noCheckupSince: string | null };
  subject: string;
  body: string;
}

export function formValuesFromCampaign(c: CampaignLike): CampaignFormValues {
  return {
    name: c.name,
    season: String(c.season),
    regionKey: c.regionKey,
    crop: c.crop as Crop,
    offsetsText: formatOffsets(c.offsetsDays),
    status: c.status,
    territoryIds: [...c.audience.territoryIds],
    growsCrop: c.audience.growsCrop,
    hasRoadmapItems: c.audience.hasRoadmapItems,
    noCheckupSince: c.audience.noCheckupSince ?? '',
    subject: c.subject,
    body: c.body,
  };
}

/** What the API is sent. Unreadable boxes pass through as-is so the schema names the problem. */
export function campaignBodyFromForm(v: CampaignFormValues): Record<string, unknown> {
  const offsets = parseOffsetsText(v.offsetsText);
  const season = /^\s*\d+\s*$/.test(v.season) ? Number(v.season) : v.season;
  return {
    name: v.name,
    season,
    regionKey: v.regionKey,
    crop: v.crop,
    offsetsDays: offsets ?? v.offsetsText,
    status: v.status,
    audience: {
      territoryIds: v.territoryIds,
      growsCrop: v.growsCrop,
      hasRoadmapItems: v.hasRoadmapItems,
      noCheckupSince: v.noCheckupSince || null,
    },
    subject: v.subject,
    body: v.body,
  };
}

/** A schema or server path ('audience.territoryIds', 'offsetsDays.1') → the editor's field. */
export function formFieldOfPath(path: string): CampaignFormField | null {
  const [head, second] = path.split('.');
  if (head === 'offsetsDays') return 'offsetsText';
  if (head === 'audience') {
    if (second === 'territoryIds' || second === 'growsCrop' || second === 'hasRoadmapItems' || second === 'noCheckupSince') return second;
    return 'territoryIds';
  }
  const direct: CampaignFormField[] = ['name', 'season', 'regionKey', 'crop', 'status', 'subject', 'body'];
  return (direct as string[]).includes(head) ? (head as CampaignFormField) : null;
}

export type FormErrors = Partial<Record<CampaignFormField, string>>;

/** Checks the form with the shared campaign schema: the parsed body, or one message per field. */
export function checkCampaignForm(v: CampaignFormValues): { ok: true; input: CampaignInput } | { ok: false; errors: FormErrors } {
  const body = campaignBodyFromForm(v);
  if (parseOffsetsText(v.offsetsText) === null) {
    const errors: FormErrors = { offsetsText: 'Write the days as whole numbers separated by commas, e.g. 60, 30, 10' };
    const rest = campaignSchema.safeParse({ ...body, offsetsDays: [1] });
    if (!rest.success) for (const issue of rest.error.issues) placeIssue(errors, issue.path.join('.'), issue.message);
    return { ok: false, errors };
  }
  const parsed = campaignSchema.safeParse(body);
  if (parsed.success) return { ok: true, input: parsed.data };
  const errors: FormErrors = {};
  for (const issue of parsed.error.issues) placeIssue(errors, issue.path.join('.'), issue.message);
  return { ok: false, errors };
}

function placeIssue(errors: FormErrors, path: string, message: string) {
  const field = formFieldOfPath(path);
  if (field && !errors[field]) errors[field] = message;
}

/**
 * A 400 answer's details.fields on the editor's fields; what has no field (a path the editor
 * does not show) comes back as text for the form-level alert.
 */
export function placeServerFields(fields: Record<string, string>): { errors: FormErrors; unplaced: string[] } {
  const errors: FormErrors = {};
  const unplaced: string[] = [];
  for (const [path, message] of Object.entries(fields)) {
    const field = formFieldOfPath(path);
    if (field && !errors[field]) errors[field] = message;
    else if (!field) unplaced.push(message);
  }
  return { errors, unplaced };
}

/** Only the fields that changed, for PATCH; the whole audience goes when any part of it changed. */
export function changedCampaignFields(before: CampaignInput, after: CampaignInput): Partial<CampaignInput> {
  const out: Partial<CampaignInput> = {};
  for (const key of Object.keys(after) as (keyof CampaignInput)[]) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) (out as Record<string, unknown>)[key] = after[key];
  }
  return out;
}
