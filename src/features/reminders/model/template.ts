// Editing a reminder template in the browser: the merge-field picker inserts a field where the
// cursor is, and the live check says the same as the server will when the template is saved.
import { checkTemplate, MERGE_FIELDS, templateProblems, type MergeField } from '@shared/calc/merge-template';

export interface Insertion {
  text: string;
  /** Where the cursor goes afterwards: just after the inserted field. */
  cursor: number;
}

/**
 * Puts {{field}} into `text` in place of the selection [start, end). List and link fields read
 * best as their own paragraph (the renderer makes a lone list a bulleted list and a lone link a
 * button), so those are set apart by blank lines.
 */
export function insertMergeField(text: string, start: number, end: number, field: MergeField): Insertion {
  const from = Math.max(0, Math.min(start, text.length));
  const to = Math.max(from, Math.min(end, text.length));
  const token = `{{${field}}}`;
  const before = text.slice(0, from);
  const after = text.slice(to);
  if (MERGE_FIELDS[field].kind === 'text') return { text: before + token + after, cursor: from + token.length };
  const lead = before.length === 0 || before.endsWith('\n\n') ? '' : before.endsWith('\n') ? '\n' : '\n\n';
  const trail = after.length === 0 || after.startsWith('\n\n') ? '' : after.startsWith('\n') ? '\n' : '\n\n';
  return { text: before + lead + token + trail + after, cursor: from + lead.length + token.length };
}

/** Fields a subject line may hold: text only (no lists, no links). */
export const SUBJECT_FIELDS = (Object.keys(MERGE_FIELDS) as MergeField[]).filter((f) => MERGE_FIELDS[f].kind === 'text');

export interface TemplateCheckResult {
  subject?: string;
  body?: string;
  /** Unknown field names across both parts, for the picker to flag. */
  unknownFields: string[];
}

/** The server's own template check, run as the specialist types. */
export function liveTemplateCheck(subject: string, body: string): TemplateCheckResult {
  const problems = templateProblems({ subject, body });
  const unknownFields = [...new Set([...checkTemplate(subject).unknownFields, ...checkTemplate(body).unknownFields])];
  return { ...problems, unknownFields };
}

/** The merge fields a template uses, in order of first use. */
export function usedMergeFields(template: string): MergeField[] {
  const out: MergeField[] = [];
  for (const m of template.matchAll(/\{\{\s*([^{}]*?)\s*\}\}/g)) {
    const name = m[1] as MergeField;
    if (name in MERGE_FIELDS && !out.includes(name)) out.push(name);
  }
  return out;
}
