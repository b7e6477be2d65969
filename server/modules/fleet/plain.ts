import type { Model } from 'sequelize';

/** A model instance as a plain object, DECIMAL columns as numbers, no timestamps but updatedAt. */
export function plain(row: Model, numberFields: string[] = []): Record<string, unknown> {
  const out = row.get({ plain: true }) as Record<string, unknown>;
  delete out.createdAt;
  for (const f of numberFields) if (out[f] !== null && out[f] !== undefined) out[f] = Number(out[f]);
  return out;
}
