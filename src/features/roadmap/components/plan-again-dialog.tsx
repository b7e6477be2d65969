import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, SelectField } from '@/components/ui/form-field';
import { usePlanRoadmapMutation } from '../api/plan-roadmap';
import type { Roadmap } from '../api/types';

const FIXED_STAGES = ['quoted', 'accepted', 'ordered', 'installed'];

/**
 * "Plan again" re-sequences the open proposals from the goals, budgets and replacements. Items the
 * grower has been quoted or has committed to, and locked items, stay where they are.
 */
export function PlanAgainDialog({ accountId, roadmap, open, onClose, onDone }: { accountId: number; roadmap: Roadmap; open: boolean; onClose: () => void; onDone: (message: string) => void }) {
  const plan = usePlanRoadmapMutation(accountId);
  const [horizon, setHorizon] = useState(String(roadmap.horizonSeasons));
  const [error, setError] = useState<string | null>(null);
  const items = roadmap.seasons.flatMap((s) => s.items);
  const fixed = items.filter((i) => i.locked || FIXED_STAGES.includes(i.stage));
  const open_ = items.length - fixed.length;

  return (
    <Dialog open={open} onClose={onClose} title="Plan the roadmap again?">
      {open && (
        <form
          className="space-y-4"
          onSubmit={(event) => {
            event.preventDefault();
            setError(null);
            plan.mutate(Number(horizon), {
              onSuccess: (next) => {
                const count = next.seasons.reduce((n, s) => n + s.items.length, 0);
                onDone(`Planned again: ${count} items over ${next.horizonSeasons} seasons.`);
                onClose();
              },
              onError: (err) => setError(err.message),
            });
          }}
        >
          <p>
            Rowpath re-sequences the {open_} open {open_ === 1 ? 'item' : 'items'} from the goals, budgets and planned replacements.
            {fixed.length > 0 && ` The ${fixed.length} locked, quoted or committed ${fixed.length === 1 ? 'item stays' : 'items stay'} where ${fixed.length === 1 ? 'it is' : 'they are'}.`}
          </p>
          <SelectField
            label="Seasons to plan"
            value={horizon}
            onChange={(e) => setHorizon(e.target.value)}
            options={Array.from({ length: 10 }, (_, k) => ({ value: String(k + 1), label: `${k + 1} (${roadmap.firstSeason}–${roadmap.firstSeason + k})` }))}
          />
          {error && <FormAlert>{error}</FormAlert>}
          <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
            <Button type="submit" busy={plan.isPending}>
              Plan again
            </Button>
            <Button variant="secondary" onClick={onClose} data-autofocus>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </Dialog>
  );
}
