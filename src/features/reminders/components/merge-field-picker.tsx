import { MERGE_FIELDS, type MergeField } from '@shared/calc/merge-template';
import { cn } from '@/lib/cn';

const groups: { title: string; fields: MergeField[] }[] = [
  { title: 'Grower and farm', fields: ['grower.firstName', 'grower.name', 'account.name', 'specialist.name', 'specialist.email'] },
  { title: 'Season', fields: ['season', 'crop', 'windowStart', 'daysBefore'] },
  { title: 'Lists (own paragraph)', fields: ['planters', 'roadmapItems', 'checklist'] },
  { title: 'Links (own paragraph)', fields: ['bookingLink', 'unsubscribeLink'] },
];

/**
 * Buttons that put a merge field where the cursor is, in the subject or the body (whichever was
 * last in use). A subject takes text fields only, so lists and links are offered for the body.
 */
export function MergeFieldPicker({ target, onInsert, used }: { target: 'subject' | 'body'; onInsert: (field: MergeField) => void; used: readonly MergeField[] }) {
  return (
    <div className="rounded-xl border border-loam-300 bg-loam-50 p-4" data-merge-field-picker>
      <p className="font-semibold text-ink-900" id="merge-picker-title">
        Insert a merge field into the {target === 'subject' ? 'subject line' : 'message'}
      </p>
      <p className="text-sm text-loam-700">Each grower’s own details are filled in when the message is made. Click a field, or type it as {'{{grower.firstName}}'}.</p>
      <div className="mt-3 grid gap-3 2xl:grid-cols-2">
        {groups.map((group) => (
          <fieldset key={group.title}>
            <legend className="mb-1 text-sm font-semibold text-loam-800">{group.title}</legend>
            <ul className="flex flex-wrap gap-1.5">
              {group.fields.map((field) => {
                const info = MERGE_FIELDS[field];
                const blocked = target === 'subject' && info.kind !== 'text';
                return (
                  <li key={field}>
                    <button
                      type="button"
                      data-merge-field={field}
                      disabled={blocked}
                      title={blocked ? 'A subject line takes text fields only' : info.description}
                      aria-label={`Insert {{${field}}}: ${info.description}`}
                      onMouseDown={(event) => event.preventDefault() /* keep the cursor where it is */}
                      onClick={() => onInsert(field)}
                      className={cn(
                        'inline-flex min-h-10 items-center gap-1 rounded-lg border px-2.5 font-mono text-sm',
                        'border-ink-200 bg-white text-ink-800 hover:border-ink-500 hover:bg-ink-50 disabled:cursor-not-allowed disabled:opacity-45',
                      )}
                    >
                      {used.includes(field) && <span aria-hidden="true" className="text-seedling-700">✓</span>}
                      {`{{${field}}}`}
                    </button>
                  </li>
                );
              })}
            </ul>
          </fieldset>
        ))}
      </div>
    </div>
  );
}
