import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { GOAL_LABELS, goalKinds, goalSchema, type GoalInput, type GoalKindName } from '@shared/schemas/roadmap';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, SelectField, TextField } from '@/components/ui/form-field';
import { ConfirmDeleteDialog } from '@/features/fleet/components/confirm-delete-dialog';
import { SaveErrorAlert, TextAreaField } from '@/features/fleet/components/form-bits';
import { applyServerErrors, formErrorMessage, isStale, numberOrNull, numberOrUndefined, textOrNull, sharedResolver } from '@/features/fleet/lib/forms';
import type { Roadmap, RoadmapGoal } from '@/features/roadmap/api/types';
import { useCreateGoalMutation, useDeleteGoalMutation, useUpdateGoalMutation } from '../api/save-goal';

export const PRIORITY_LABELS: Record<number, string> = { 1: 'Low', 2: 'Normal', 3: 'High' };

interface GoalForm {
  kind: GoalKindName;
  label: string;
  targetSeason: string;
  priority: string;
  planterId: string;
  targetValue: string;
  notes: string;
}

const fieldNames = ['kind', 'label', 'targetSeason', 'priority', 'planterId', 'targetValue', 'notes'] as const;

const toBody = (v: GoalForm) => ({
  kind: v.kind,
  label: v.label,
  targetSeason: numberOrUndefined(v.targetSeason),
  priority: numberOrUndefined(v.priority),
  planterId: numberOrNull(v.planterId),
  targetValue: numberOrNull(v.targetValue),
  notes: textOrNull(v.notes),
});

function GoalStatus({ goal, roadmap }: { goal: RoadmapGoal; roadmap: Roadmap }) {
  if (!roadmap.feasible) return null;
  const outcome = roadmap.goalOutcomes.find((o) => o.goalId === String(goal.id));
  if (!outcome) return <span className="text-sm text-loam-700">Not planned yet</span>;
  if (outcome.status === 'met')
    return (
      <span className="text-sm font-semibold text-seedling-800">
        <span aria-hidden="true">✓ </span>Met in {outcome.metSeason}
      </span>
    );
  if (outcome.status === 'late')
    return (
      <span className="text-sm font-semibold text-amber-800">
        <span aria-hidden="true">▲ </span>Late: met in {outcome.metSeason}
      </span>
    );
  return (
    <span className="text-sm font-semibold text-brick-800">
      <span aria-hidden="true">✕ </span>Not met
    </span>
  );
}

/**
 * The grower's stated goals: what they want the planter to do, by which season, and how much it
 * matters. Specialists record them; growers read them.
 */
export function GoalsPanel({ accountId, roadmap, canEdit, onChanged }: { accountId: number; roadmap: Roadmap; canEdit: boolean; onChanged: (message: string) => void }) {
  const [editing, setEditing] = useState<RoadmapGoal | 'new' | null>(null);
  const [deleting, setDeleting] = useState<RoadmapGoal | null>(null);
  const remove = useDeleteGoalMutation(accountId);
  const planterName = (id: number | null) => (id === null ? 'Any planter' : (roadmap.planters.find((p) => p.id === id)?.name ?? `Planter ${id}`));

  return (
    <section id="goals" aria-labelledby="goals-title" className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm">
      <div className="mb-3 flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id="goals-title" className="text-xl font-bold text-ink-900">
            The grower’s goals
          </h2>
          <p className="mt-0.5 text-loam-700">What the planter should do, and by when.</p>
        </div>
        {canEdit && <Button onClick={() => setEditing('new')}>Add a goal</Button>}
      </div>
      {roadmap.goals.length === 0 ? (
        <p className="text-loam-700">No goals recorded yet.{canEdit ? ' Add one to plan a roadmap.' : ''}</p>
      ) : (
        <ul className="divide-y divide-loam-200" aria-label="Goals">
          {roadmap.goals.map((goal) => (
            <li key={goal.id} className="flex flex-wrap items-start justify-between gap-3 py-3" data-goal-id={goal.id}>
              <div className="min-w-0 flex-1">
                <p className="flex flex-wrap items-baseline gap-x-2">
                  <span className="rounded-md bg-ink-50 px-2 py-0.5 text-sm font-semibold text-ink-800">{GOAL_LABELS[goal.kind]}</span>
                  <span className="font-semibold text-ink-950">{goal.label}</span>
                </p>
                <p className="mt-1 flex flex-wrap gap-x-3 text-sm text-loam-800">
                  <span className="tabular">By {goal.targetSeason}</span>
                  <span>{PRIORITY_LABELS[goal.priority] ?? goal.priority} priority</span>
                  <span>{planterName(goal.planterId)}</span>
                  {goal.targetValue !== null && <span className="tabular">Target {goal.targetValue}</span>}
                  <GoalStatus goal={goal} roadmap={roadmap} />
                </p>
                {goal.notes && <p className="mt-1 text-sm text-loam-700">{goal.notes}</p>}
              </div>
              {canEdit && (
                <div className="flex gap-1">
                  <Button variant="ghost" onClick={() => setEditing(goal)} aria-label={`Edit the goal ${goal.label}`}>
                    Edit
                  </Button>
                  <Button variant="ghost" className="text-brick-700 hover:bg-brick-50" onClick={() => setDeleting(goal)} aria-label={`Delete the goal ${goal.label}`}>
                    Delete
                  </Button>
                </div>
              )}
            </li>
          ))}
        </ul>
      )}

      <Dialog open={editing !== null} onClose={() => setEditing(null)} variant="panel" title={editing === 'new' ? 'Add a goal' : 'Edit the goal'}>
        {editing !== null && (
          <GoalFormBody
            key={editing === 'new' ? 'new' : `${editing.id}-${editing.version}`}
            accountId={accountId}
            roadmap={roadmap}
            goal={editing === 'new' ? null : editing}
            onCancel={() => setEditing(null)}
            onSaved={(message) => {
              setEditing(null);
              onChanged(message);
            }}
          />
        )}
      </Dialog>
      <ConfirmDeleteDialog
        what={deleting ? `the goal “${deleting.label}”` : null}
        title="Delete this goal?"
        confirmLabel="Delete the goal"
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        onDeleted={() => onChanged(`Deleted the goal “${deleting?.label ?? ''}”. Plan again to drop the items only it needed.`)}
        onClose={() => setDeleting(null)}
      />
    </section>
  );
}

function GoalFormBody({ accountId, roadmap, goal, onCancel, onSaved }: { accountId: number; roadmap: Roadmap; goal: RoadmapGoal | null; onCancel: () => void; onSaved: (message: string) => void }) {
  const create = useCreateGoalMutation(accountId);
  const update = useUpdateGoalMutation(accountId);
  const [saveError, setSaveError] = useState<{ message: string; stale: boolean } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    formState: { errors },
  } = useForm<GoalForm, unknown, GoalInput>({
    resolver: sharedResolver(goalSchema, toBody),
    defaultValues: goal
      ? {
          kind: goal.kind,
          label: goal.label,
          targetSeason: String(goal.targetSeason),
          priority: String(goal.priority),
          planterId: goal.planterId === null ? '' : String(goal.planterId),
          targetValue: goal.targetValue === null ? '' : String(goal.targetValue),
          notes: goal.notes ?? '',
        }
      : { kind: 'planting-speed', label: GOAL_LABELS['planting-speed'], targetSeason: String(roadmap.firstSeason + 1), priority: '2', planterId: String(roadmap.planters[0]?.id ?? ''), targetValue: '', notes: '' },
  });
  const kindField = register('kind');

  const handleError = (err: Error) => {
    const unplaced = applyServerErrors(err, fieldNames, setError);
    const message = formErrorMessage(err, unplaced);
    setSaveError(message ? { message, stale: isStale(err) } : null);
  };

  const onSubmit = handleSubmit((body) => {
    setSaveError(null);
    if (goal) {
      update.mutate({ id: goal.id, changes: { ...body, version: goal.version } }, { onSuccess: () => onSaved(`Saved the goal “${body.label}”. Plan again to fit the roadmap to it.`), onError: handleError });
    } else {
      create.mutate(body, { onSuccess: () => onSaved(`Added the goal “${body.label}”. Plan again to fit the roadmap to it.`), onError: handleError });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={goal ? 'Edit the goal' : 'Add a goal'}>
      {saveError && <SaveErrorAlert message={saveError.message} stale={saveError.stale} onReload={onCancel} />}
      {Object.keys(errors).length > 1 && <FormAlert>Some boxes need fixing.</FormAlert>}
      <SelectField
        label="Kind of goal"
        options={goalKinds.map((k) => ({ value: k, label: GOAL_LABELS[k] }))}
        error={errors.kind?.message}
        data-autofocus
        {...kindField}
        onChange={(event) => {
          // A label still reading like the old kind follows the new kind.
          const before = getValues('label');
          void kindField.onChange(event);
          if (!before.trim() || (goalKinds as readonly string[]).some((k) => GOAL_LABELS[k as GoalKindName] === before)) setValue('label', GOAL_LABELS[event.target.value as GoalKindName]);
        }}
      />
      <TextField label="In the grower’s words" hint="E.g. “Plant at 9–10 mph”." error={errors.label?.message} {...register('label')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Wanted by season" inputMode="numeric" hint={`${roadmap.firstSeason} or later`} error={errors.targetSeason?.message} {...register('targetSeason')} />
        <SelectField label="Priority" options={[3, 2, 1].map((p) => ({ value: String(p), label: PRIORITY_LABELS[p] }))} error={errors.priority?.message} {...register('priority')} />
      </div>
      <SelectField
        label="Planter"
        options={[{ value: '', label: 'Any planter' }, ...roadmap.planters.map((p) => ({ value: String(p.id), label: `${p.name} (${p.rows} rows)` }))]}
        error={errors.planterId?.message}
        {...register('planterId')}
      />
      <TextField label="Target figure (optional)" inputMode="decimal" hint="E.g. 10 for 10 mph, 400 for 400 ac/day." error={errors.targetValue?.message} {...register('targetValue')} />
      <TextAreaField label="Notes (optional)" error={errors.notes?.message} {...register('notes')} />
      <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
        <Button type="submit" busy={create.isPending || update.isPending}>
          {goal ? 'Save the goal' : 'Add the goal'}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
