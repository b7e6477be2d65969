import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { replacementSchema, type ReplacementInput } from '@shared/schemas/roadmap';
import { Button } from '@/components/ui/button';
import { FormAlert, SelectField, TextField } from '@/components/ui/form-field';
import { ConfirmDeleteDialog } from '@/features/fleet/components/confirm-delete-dialog';
import { applyServerErrors, formErrorMessage, numberOrUndefined, sharedResolver, textOrNull } from '@/features/fleet/lib/forms';
import type { Roadmap, RoadmapReplacement } from '../api/types';
import { useCreateReplacementMutation, useDeleteReplacementMutation } from '../api/replacements';
import { Panel } from './bits';

interface ReplacementForm {
  planterId: string;
  season: string;
  kind: 'toolbar' | 'planter';
  notes: string;
}

const toBody = (v: ReplacementForm) => ({ planterId: numberOrUndefined(v.planterId), season: numberOrUndefined(v.season), kind: v.kind, notes: textOrNull(v.notes) });

/**
 * Toolbars or whole planters the grower means to replace. Parts that cannot move to the new bar
 * are stranded then, so the planner avoids buying them for the old one.
 */
export function ReplacementsPanel({ accountId, roadmap, canEdit, onChanged }: { accountId: number; roadmap: Roadmap; canEdit: boolean; onChanged: (message: string) => void }) {
  const [adding, setAdding] = useState(false);
  const [removing, setRemoving] = useState<RoadmapReplacement | null>(null);
  const remove = useDeleteReplacementMutation(accountId);
  const planterName = (id: number) => roadmap.planters.find((p) => p.id === id)?.name ?? `Planter ${id}`;
  const describe = (r: RoadmapReplacement) => `the ${r.kind} replacement on ${planterName(r.planterId)} in ${r.season}`;

  return (
    <Panel
      id="replacements"
      title="Planned replacements"
      description="A new toolbar or planter strands the parts that cannot move to it."
      action={
        canEdit && !adding && roadmap.planters.length > 0 ? (
          <Button variant="secondary" onClick={() => setAdding(true)}>
            Add a replacement
          </Button>
        ) : undefined
      }
    >
      {roadmap.replacements.length === 0 ? (
        <p className="text-loam-700">None planned.</p>
      ) : (
        <ul className="divide-y divide-loam-200">
          {roadmap.replacements.map((r) => (
            <li key={r.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span>
                <span className="font-semibold tabular">{r.season}</span> — new {r.kind} for {planterName(r.planterId)}
                {r.notes && <span className="block text-sm text-loam-700">{r.notes}</span>}
              </span>
              {canEdit && (
                <Button variant="ghost" className="text-brick-700 hover:bg-brick-50" onClick={() => setRemoving(r)} aria-label={`Cancel it: ${describe(r)}`}>
                  Cancel it
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {adding && (
        <AddReplacementForm
          accountId={accountId}
          roadmap={roadmap}
          onDone={(message) => {
            setAdding(false);
            if (message) onChanged(message);
          }}
        />
      )}
      <ConfirmDeleteDialog
        what={removing ? describe(removing) : null}
        title="Cancel this replacement?"
        confirmLabel="Cancel the replacement"
        onConfirm={() => remove.mutateAsync(removing!.id)}
        onDeleted={() => onChanged(`Cancelled ${removing ? describe(removing) : 'the replacement'}. Plan again to use the old bar to the end.`)}
        onClose={() => setRemoving(null)}
      >
        {removing ? `This removes ${describe(removing)} from the grower’s plans.` : undefined}
      </ConfirmDeleteDialog>
    </Panel>
  );
}

function AddReplacementForm({ accountId, roadmap, onDone }: { accountId: number; roadmap: Roadmap; onDone: (message: string | null) => void }) {
  const create = useCreateReplacementMutation(accountId);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<ReplacementForm, unknown, ReplacementInput>({
    resolver: sharedResolver(replacementSchema, toBody),
    defaultValues: { planterId: String(roadmap.planters[0]?.id ?? ''), season: String(roadmap.firstSeason + 1), kind: 'toolbar', notes: '' },
  });
  const onSubmit = handleSubmit((body) => {
    setFormError(null);
    create.mutate(body, {
      onSuccess: () => onDone(`A ${body.kind} replacement is planned for ${body.season}. Plan again to fit the roadmap to it.`),
      onError: (err) => setFormError(formErrorMessage(err, applyServerErrors(err, ['planterId', 'season', 'kind', 'notes'], setError))),
    });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 space-y-3 rounded-lg border border-loam-300 p-4" aria-label="Add a planned replacement">
      {formError && <FormAlert>{formError}</FormAlert>}
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField label="Planter" options={roadmap.planters.map((p) => ({ value: String(p.id), label: `${p.name} (${p.rows} rows)` }))} error={errors.planterId?.message} {...register('planterId')} />
        <SelectField
          label="Replace"
          options={[
            { value: 'toolbar', label: 'The toolbar' },
            { value: 'planter', label: 'The whole planter' },
          ]}
          error={errors.kind?.message}
          {...register('kind')}
        />
        <TextField label="Season" inputMode="numeric" error={errors.season?.message} {...register('season')} />
      </div>
      <TextField label="Notes (optional)" error={errors.notes?.message} {...register('notes')} />
      <div className="flex gap-3">
        <Button type="submit" busy={create.isPending}>
          Add replacement
        </Button>
        <Button variant="secondary" onClick={() => onDone(null)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
