import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, SelectField } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { useEvaluateMovesMutation } from '../api/evaluate-moves';
import type { MoveEvaluation, Roadmap, RoadmapItem } from '../api/types';
import { useUpdateItemMutation } from '../api/update-item';
import { formatUsd } from '../model/format';
import { describeMove, seasonSpendAfterMove, warningsAfterMove } from '../model/move-preview';
import { STAGE_META } from '../model/stages';
import { BudgetBar, CheckIcon, LockIcon, WarnIcon } from './bits';

export interface MoveRequest {
  item: RoadmapItem;
  /** Known when the card was dropped on a season; null when chosen in the dialog (keyboard). */
  toSeason: number | null;
}

export interface MoveOutcome {
  message: string;
  warnings: string[];
}

/**
 * Moving an item is never silent: the server's what-if runs first and the dialog says what the
 * move would throw away, which goals it would make late and what budgets it would break; only
 * "Move it" saves. A locked item is refused with the reason, without asking the server.
 */
export function MoveDialog({ accountId, roadmap, request, onClose, onMoved }: { accountId: number; roadmap: Roadmap; request: MoveRequest | null; onClose: () => void; onMoved: (outcome: MoveOutcome) => void }) {
  return (
    <Dialog
      open={request !== null}
      onClose={onClose}
      title={request ? (request.item.locked ? `${request.item.partName} is locked` : `Move ${request.item.partName}`) : ''}
      description={request && !request.item.locked ? `Now in ${request.item.season} · ${formatUsd(request.item.costUsd)}` : undefined}
    >
      {request && <MoveBody key={`${request.item.id}-${request.toSeason}`} accountId={accountId} roadmap={roadmap} request={request} onClose={onClose} onMoved={onMoved} />}
    </Dialog>
  );
}

function MoveBody({ accountId, roadmap, request, onClose, onMoved }: { accountId: number; roadmap: Roadmap; request: MoveRequest; onClose: () => void; onMoved: (outcome: MoveOutcome) => void }) {
  const { item } = request;
  const otherSeasons = roadmap.seasons.map((s) => s.season).filter((s) => s !== item.season);
  const [chosen, setChosen] = useState<number>(request.toSeason ?? otherSeasons[0] ?? item.season);
  const [checked, setChecked] = useState<{ season: number; evaluation: MoveEvaluation } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const evaluate = useEvaluateMovesMutation(accountId);
  const update = useUpdateItemMutation(accountId);
  const started = useRef(false);

  const check = (season: number) => {
    setError(null);
    setChecked(null);
    evaluate.mutate([{ itemId: item.id, season }], {
      onSuccess: (evaluation) => setChecked({ season, evaluation }),
      onError: (err) => setError(err.message),
    });
  };

  // A drop already names the season: check it straight away.
  useEffect(() => {
    if (request.toSeason !== null && !item.locked && !started.current) {
      started.current = true;
      check(request.toSeason);
    }
    // Runs once per opened dialog (the body is keyed by item and season).
  }, []);

  if (item.locked) {
    return (
      <div className="space-y-4" data-move-refused>
        <p className="flex items-start gap-2 text-lg text-ink-950">
          <LockIcon locked className="mt-1.5" />
          <span>
            {item.partName} is locked in {item.season}
            {['accepted', 'ordered', 'installed'].includes(item.stage) ? `: the grower committed to it (stage ${STAGE_META[item.stage].label}).` : '.'} A locked item stays in its
            season, so it was not moved.
          </span>
        </p>
        <p className="text-loam-800">If the plan truly has to change, unlock it from the card’s Stage menu first, then move it.</p>
        <Button onClick={onClose} data-autofocus>
          Keep it in {item.season}
        </Button>
      </div>
    );
  }

  const preview = checked ? describeMove({ partName: item.partName, toSeason: checked.season, currentFeasible: roadmap.feasible, evaluation: checked.evaluation }) : null;
  const spend = checked ? seasonSpendAfterMove(roadmap.seasons, item, checked.season) : [];

  const confirm = () => {
    if (!checked) return;
    setError(null);
    update.mutate(
      { id: item.id, patch: { version: item.version, season: checked.season } },
      {
        onSuccess: (result) => {
          onMoved({ message: `Moved ${item.partName} from ${item.season} to ${checked.season}.`, warnings: warningsAfterMove(roadmap.feasible, result.warnings) });
          onClose();
        },
        onError: (err) => {
          if (isApiError(err) && err.status === 409 && err.code === 'stale') setError('Someone changed this item after the roadmap was loaded. The roadmap has been reloaded: close this and try again.');
          else setError(err.message);
        },
      },
    );
  };

  return (
    <div className="space-y-4" data-move-dialog>
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(event) => {
          event.preventDefault();
          check(chosen);
        }}
      >
        <SelectField
          label="Move to season"
          className="min-w-40 flex-1"
          value={String(chosen)}
          onChange={(event) => {
            setChosen(Number(event.target.value));
            setChecked(null);
          }}
          options={otherSeasons.map((s) => ({ value: String(s), label: String(s) }))}
          data-autofocus={request.toSeason === null ? true : undefined}
        />
        <Button type="submit" variant="secondary" busy={evaluate.isPending}>
          {checked && checked.season === chosen ? 'Check again' : 'Check this move'}
        </Button>
      </form>

      {evaluate.isPending && <LoadingBlock label="Checking what the move would waste…" className="py-2" />}
      {error && <FormAlert>{error}</FormAlert>}

      {preview && checked && (
        <div
          data-move-verdict={preview.verdict}
          role="alert"
          className={cn('rounded-lg border-l-4 px-4 py-3', preview.harmful ? 'border-brick-600 bg-brick-50 text-brick-900' : 'border-seedling-600 bg-seedling-50 text-seedling-900')}
        >
          <p className="flex items-start gap-2 font-bold">
            {preview.harmful ? <WarnIcon className="mt-0.5" /> : <CheckIcon className="mt-0.5" />}
            <span data-move-headline>{preview.headline}</span>
          </p>
          {preview.warnings.length > 0 && (
            <ul className="mt-2 ml-7 list-disc space-y-1">
              {preview.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          )}
        </div>
      )}

      {checked && (
        <div className="grid gap-3 sm:grid-cols-2">
          {spend.map((s) => (
            <div key={s.season} className="rounded-lg border border-loam-200 p-3">
              <p className="font-semibold text-ink-900">
                {s.season} after the move <span className="font-normal text-loam-700 tabular">(now {formatUsd(s.beforeUsd)})</span>
              </p>
              <BudgetBar costUsd={s.afterUsd} budgetUsd={s.budgetUsd} compact />
            </div>
          ))}
        </div>
      )}

      <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
        <Button variant={preview?.harmful ? 'danger' : 'primary'} disabled={!checked || checked.season !== chosen} busy={update.isPending} onClick={confirm}>
          {checked ? `Move it to ${checked.season}` : 'Move it'}
        </Button>
        <Button variant="secondary" onClick={onClose} data-autofocus={request.toSeason !== null ? true : undefined}>
          Keep it in {item.season}
        </Button>
      </div>
    </div>
  );
}
