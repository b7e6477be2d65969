// The reminder offsets are typed as one line ("60, 30, 10") because that is how a specialist
// says them; the line is read into whole days here and checked by the shared schema.

/** "60, 30 and 10 days" → [60, 30, 10]; words and units between the numbers are ignored. Null when a part is not a whole number. */
export function parseOffsetsText(text: string): number[] | null {
  const parts = text
    .replace(/\bdays?\b|\band\b/gi, ' ')
    .split(/[\s,;]+/)
    .map((p) => p.trim())
    .filter(Boolean);
  if (!parts.length) return [];
  const out: number[] = [];
  for (const part of parts) {
    if (!/^\d{1,4}$/.test(part)) return null;
    out.push(Number(part));
  }
  return out;
}

/** [60, 30, 10] → "60, 30, 10". */
export function formatOffsets(offsetsDays: readonly number[]): string {
  return offsetsDays.join(', ');
}
