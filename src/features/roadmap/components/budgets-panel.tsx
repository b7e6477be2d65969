import { useState } from 'react';
import { budgetSchema } from '@shared/schemas/roadmap';
import { Button } from '@/components/ui/button';
import { ErrorMark, inputClasses } from '@/components/ui/form-field';
import { numberOrUndefined } from '@/features/fleet/lib/forms';
import { isApiError } from '@/lib/api';
import type { Roadmap } from '../api/types';
import { useSaveBudgetMutation } from '../api/save-budget';
import { formatUsd } from '../model/format';
import { Panel } from './bits';

/** What the grower will spend each season (parts and labour). Staff edit a season at a time. */
export function BudgetsPanel({ accountId, roadmap, canEdit, onChanged }: { accountId: number; roadmap: Roadmap; canEdit: boolean; onChanged: (message: string) => void }) {
  return (
    <Panel id="budgets" title="Budget per season" description="Parts and labour the grower will spend; the plan keeps within it.">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Budget and planned cost per season</caption>
        <thead className="text-sm text-loam-800">
          <tr>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Season
            </th>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Budget
            </th>
            <th scope="col" className="py-1 text-right font-semibold">
              Planned
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-loam-200">
          {roadmap.seasons.map((s) => (
            <BudgetRow key={`${s.season}-${s.budgetUsd}`} accountId={accountId} season={s.season} budgetUsd={s.budgetUsd} costUsd={s.costUsd} canEdit={canEdit} onChanged={onChanged} />
          ))}
        </tbody>
      </table>
    </Panel>
  );
}

function BudgetRow({ accountId, season, budgetUsd, costUsd, canEdit, onChanged }: { accountId: number; season: number; budgetUsd: number | null; costUsd: number; canEdit: boolean; onChanged: (message: string) => void }) {
  const [text, setText] = useState(budgetUsd === null ? '' : String(budgetUsd));
  const [error, setError] = useState<string | null>(null);
  const save = useSaveBudgetMutation(accountId);
  const inputId = `budget-${season}`;
  const dirty = text.trim() !== (budgetUsd === null ? '' : String(budgetUsd));

  const submit = () => {
    const parsed = budgetSchema.safeParse({ season, budgetUsd: numberOrUndefined(text) });
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? 'The budget must be a number of dollars');
      return;
    }
    setError(null);
    save.mutate(parsed.data, {
      onSuccess: () => onChanged(`The ${season} budget is now ${formatUsd(parsed.data.budgetUsd)}. Plan again to fit the roadmap to it.`),
      onError: (err) => setError(isApiError(err) ? (err.fields.budgetUsd ?? err.fields.season ?? err.message) : err.message),
    });
  };

  return (
    <tr>
      <th scope="row" className="py-2 pr-3 align-top font-semibold tabular">
        <label htmlFor={inputId} className="inline-flex min-h-11 items-center">
          {season}
        </label>
      </th>
      <td className="py-2 pr-3 align-top">
        {canEdit ? (
          <form
            className="flex gap-2"
            noValidate
            onSubmit={(event) => {
              event.preventDefault();
              submit();
            }}
          >
            <div className="relative w-32">
              <span className="pointer-events-none absolute inset-y-0 left-3 flex items-center text-loam-700" aria-hidden="true">
                $
              </span>
              <input
                id={inputId}
                inputMode="decimal"
                className={`${inputClasses} pl-6 tabular`}
                value={text}
                onChange={(e) => setText(e.target.value)}
                aria-invalid={error ? true : undefined}
                aria-describedby={error ? `${inputId}-error` : undefined}
                aria-label={`Budget for ${season}, US dollars`}
              />
            </div>
            <Button type="submit" variant="secondary" busy={save.isPending} disabled={!dirty}>
              Save
            </Button>
          </form>
        ) : (
          <span className="tabular">{budgetUsd === null ? 'Not set' : formatUsd(budgetUsd)}</span>
        )}
        {error && (
          <p id={`${inputId}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
            <ErrorMark />
            <span>{error}</span>
          </p>
        )}
      </td>
      <td className="py-2 text-right align-top tabular">
        <span className="inline-flex min-h-11 items-center">{formatUsd(costUsd)}</span>
      </td>
    </tr>
  );
}
