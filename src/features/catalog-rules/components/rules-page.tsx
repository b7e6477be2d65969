import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import { ruleKinds, ruleSchema, GOAL_CAPABILITIES, type RuleInput } from '@shared/schemas/roadmap';
import { Button } from '@/components/ui/button';
import { ErrorMark, FormAlert, SelectField, TextField } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { cn } from '@/lib/cn';
import { RuleSetError, rulePartsQueryOptions, rulesQueryOptions, useSaveRulesMutation, type RuleKind, type RuleProblem } from '../api/rules';
import { describeRule, draftChanges, fromServer, groupByPart, RULE_KIND_HINTS, RULE_KIND_LABELS, toInput, type DraftRule, type PartRef } from '../model/rules';

let nextKey = 0;
const newKey = () => `new-${++nextKey}`;

/**
 * The catalog's rules between parts, listed by part. Changes are gathered in a draft and saved
 * as a whole set; a set with a cycle or a contradiction is refused and its problems name the parts.
 */
export function RulesPage() {
  const rules = useQuery(rulesQueryOptions());
  const parts = useQuery(rulePartsQueryOptions());

  return (
    <>
      <title>Part rules · Rowpath</title>
      <PageHeader
        title="Part rules"
        description="What each part requires, provides, supersedes, conflicts with and prepares for. The roadmap planner sequences purchases from these rules."
      />
      {(rules.isPending || parts.isPending) && <LoadingBlock label="Loading the rules…" />}
      {rules.isError && <ErrorState title="The rules could not be loaded" message={rules.error.message} onRetry={() => void rules.refetch()} />}
      {parts.isError && <ErrorState title="The catalog could not be loaded" message={parts.error.message} onRetry={() => void parts.refetch()} />}
      {rules.isSuccess && parts.isSuccess && (
        <RulesEditor saved={rules.data.map(fromServer)} parts={parts.data.map((p) => ({ id: p.id, partNumber: p.partNumber, name: p.name }))} />
      )}
    </>
  );
}

function RulesEditor({ saved, parts }: { saved: DraftRule[]; parts: PartRef[] }) {
  const [draft, setDraft] = useState<DraftRule[]>(saved);
  const [filter, setFilter] = useState('');
  const [problems, setProblems] = useState<RuleProblem[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [notice, setNotice] = useState<{ message: string; warnings: string[] } | null>(null);
  const save = useSaveRulesMutation();
  const partMap = useMemo(() => new Map(parts.map((p) => [p.id, p])), [parts]);
  const changes = draftChanges(saved, draft);
  const dirty = changes.added + changes.removed > 0;
  const savedSig = JSON.stringify(saved.map(toInput));

  // A fresh set from the server replaces the draft only when nothing is being edited.
  useEffect(() => {
    if (!dirty) setDraft(saved);
  }, [savedSig]);

  const needle = filter.trim().toLowerCase();
  const groups = groupByPart(draft, partMap).filter((g) => !needle || `${g.part.partNumber} ${g.part.name}`.toLowerCase().includes(needle));
  const capabilities = useMemo(
    () => [...new Set([...Object.values(GOAL_CAPABILITIES).flat(), ...draft.map((r) => r.capability).filter((c): c is string => Boolean(c))])].sort(),
    [draft],
  );

  const submit = () => {
    setError(null);
    setProblems([]);
    setNotice(null);
    save.mutate(draft.map(toInput), {
      onSuccess: (result) => {
        setDraft(result.rules.map(fromServer));
        setNotice({ message: `Saved ${result.rules.length} rules.`, warnings: result.warnings });
      },
      onError: (err) => {
        if (err instanceof RuleSetError && err.problems.length) setProblems(err.problems);
        else setError(err.message);
      },
    });
  };

  return (
    <div className="space-y-5">
      <div className="sticky top-16 z-10 flex flex-wrap items-center gap-3 rounded-xl border border-loam-200 bg-white/95 p-4 shadow-sm backdrop-blur lg:top-0">
        <p className="flex-1 text-loam-800" data-rules-status>
          {draft.length} rules for {new Set(draft.map((r) => r.componentId)).size} parts.{' '}
          {dirty ? (
            <strong className="text-amber-800">
              Not saved: {changes.added} added, {changes.removed} removed.
            </strong>
          ) : (
            'All saved.'
          )}
        </p>
        <Button onClick={submit} busy={save.isPending} disabled={!dirty}>
          Save the rule set
        </Button>
        <Button
          variant="secondary"
          disabled={!dirty}
          onClick={() => {
            setDraft(saved);
            setProblems([]);
            setError(null);
          }}
        >
          Discard changes
        </Button>
      </div>

      {problems.length > 0 && (
        <div role="alert" className="rounded-xl border-2 border-brick-600 bg-brick-50 px-5 py-4 text-brick-900" data-rule-problems>
          <p className="flex items-center gap-2 text-lg font-bold">
            <ErrorMark className="mt-0 size-5" />
            The rule set was refused: nothing was changed.
          </p>
          <ul className="mt-2 space-y-2">
            {problems.map((p, i) => (
              <li key={`${p.code}-${i}`}>
                <p>{p.message}</p>
                <p className="mt-1 flex flex-wrap gap-1.5">
                  {p.parts.map((name) => (
                    <span key={name} className="rounded-md bg-white px-2 py-0.5 text-sm font-semibold ring-1 ring-brick-300">
                      {name}
                    </span>
                  ))}
                </p>
              </li>
            ))}
          </ul>
          <p className="mt-2 text-sm">Remove or change the rules on those parts, then save again.</p>
        </div>
      )}
      {error && <FormAlert>{error}</FormAlert>}
      <div role="status" className="empty:hidden">
        {notice && (
          <div className="space-y-2">
            <p className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 font-semibold text-seedling-800">✓ {notice.message}</p>
            {notice.warnings.length > 0 && (
              <FormAlert tone="warning">
                <ul>
                  {notice.warnings.map((w) => (
                    <li key={w}>{w}</li>
                  ))}
                </ul>
              </FormAlert>
            )}
          </div>
        )}
      </div>

      <AddRuleForm
        parts={parts}
        capabilities={capabilities}
        onAdd={(rule) => {
          setDraft((d) => [...d, { ...rule, key: newKey() }]);
          setProblems([]);
        }}
      />

      <div className="flex flex-wrap items-end gap-3">
        <TextField label="Find a part" className="w-full max-w-sm" value={filter} onChange={(e) => setFilter(e.target.value)} placeholder="Part number or name" type="search" />
      </div>

      {groups.length === 0 ? (
        <EmptyState title={draft.length === 0 ? 'No rules yet' : 'No part matches'}>{draft.length === 0 ? 'Add the first rule above.' : 'Try another part number or name.'}</EmptyState>
      ) : (
        <ul className="grid items-start gap-4 lg:grid-cols-2" aria-label="Rules by part">
          {groups.map((g) => {
            const flagged = problems.some((p) => p.parts.includes(`${g.part.partNumber} ${g.part.name}`));
            return (
              <li key={g.componentId} data-rule-part={g.part.partNumber} className={cn('rounded-xl border bg-white p-4 shadow-sm', flagged ? 'border-2 border-brick-600' : 'border-loam-200')}>
                <h2 className="flex flex-wrap items-baseline gap-2 text-lg font-bold text-ink-900">
                  <span className="font-mono text-base">{g.part.partNumber}</span> {g.part.name}
                  {flagged && (
                    <span className="inline-flex items-center gap-1 text-sm font-semibold text-brick-700">
                      <ErrorMark className="mt-0" /> named in a problem
                    </span>
                  )}
                </h2>
                <ul className="mt-2 divide-y divide-loam-200">
                  {g.rules.map((r) => (
                    <li key={r.key} className="flex items-center justify-between gap-3 py-1.5" data-rule-key={r.key}>
                      <span className={cn(r.key.startsWith('new-') && 'font-semibold text-ink-800')}>
                        {describeRule(r, partMap)}
                        {r.key.startsWith('new-') && <span className="ml-2 rounded bg-amber-50 px-1.5 text-sm text-amber-800">new</span>}
                      </span>
                      <Button
                        variant="ghost"
                        className="shrink-0 text-brick-700 hover:bg-brick-50"
                        aria-label={`Remove the rule: ${g.part.partNumber} ${describeRule(r, partMap)}`}
                        onClick={() => setDraft((d) => d.filter((x) => x.key !== r.key))}
                      >
                        Remove
                      </Button>
                    </li>
                  ))}
                </ul>
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}

interface AddForm {
  componentId: string;
  kind: RuleKind;
  requiresWhat: 'part' | 'capability';
  targetComponentId: string;
  capability: string;
  labourHoursSavedPerUnit: string;
  partsUsdSavedPerUnit: string;
}

function AddRuleForm({ parts, capabilities, onAdd }: { parts: PartRef[]; capabilities: string[]; onAdd: (rule: RuleInput) => void }) {
  const empty: AddForm = { componentId: '', kind: 'requires', requiresWhat: 'part', targetComponentId: '', capability: '', labourHoursSavedPerUnit: '', partsUsdSavedPerUnit: '' };
  const [form, setForm] = useState<AddForm>(empty);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const set = (patch: Partial<AddForm>) => setForm((f) => ({ ...f, ...patch }));
  const usesTarget = form.kind === 'conflicts-with' || form.kind === 'supersedes' || form.kind === 'prepares-for' || (form.kind === 'requires' && form.requiresWhat === 'part');
  const usesCapability = form.kind === 'provides' || (form.kind === 'requires' && form.requiresWhat === 'capability');
  const partOptions = [{ value: '', label: 'Choose a part…' }, ...parts.map((p) => ({ value: String(p.id), label: `${p.partNumber} ${p.name}` }))];
  const num = (s: string) => (s.trim() === '' ? null : Number(s));

  return (
    <form
      aria-label="Add a rule"
      noValidate
      className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm"
      onSubmit={(event) => {
        event.preventDefault();
        const body = {
          componentId: form.componentId ? Number(form.componentId) : undefined,
          kind: form.kind,
          targetComponentId: usesTarget && form.targetComponentId ? Number(form.targetComponentId) : null,
          capability: usesCapability ? form.capability.trim() || null : null,
          labourHoursSavedPerUnit: form.kind === 'prepares-for' ? num(form.labourHoursSavedPerUnit) : null,
          partsUsdSavedPerUnit: form.kind === 'prepares-for' ? num(form.partsUsdSavedPerUnit) : null,
        };
        const parsed = ruleSchema.safeParse(body);
        const found: Record<string, string> = {};
        if (!parsed.success) for (const issue of parsed.error.issues) found[String(issue.path[0] ?? 'componentId')] ??= issue.message;
        if (usesCapability && !form.capability.trim()) found.capability = 'Name the capability';
        if (body.componentId && body.componentId === body.targetComponentId) found.targetComponentId = 'A rule joins two different parts';
        setErrors(found);
        if (Object.keys(found).length || !parsed.success) return;
        onAdd(parsed.data);
        setForm({ ...empty, componentId: form.componentId, kind: form.kind });
      }}
    >
      <h2 className="text-lg font-bold text-ink-900">Add a rule</h2>
      <p className="text-loam-700">{RULE_KIND_HINTS[form.kind]} It joins the draft; save the rule set to apply it.</p>
      <div className="mt-3 grid gap-3 md:grid-cols-3">
        <SelectField label="Part" options={partOptions} value={form.componentId} onChange={(e) => set({ componentId: e.target.value })} error={errors.componentId} />
        <SelectField label="Rule" options={ruleKinds.map((k) => ({ value: k, label: RULE_KIND_LABELS[k] }))} value={form.kind} onChange={(e) => set({ kind: e.target.value as RuleKind })} error={errors.kind} />
        {form.kind === 'requires' && (
          <SelectField
            label="Requires"
            options={[
              { value: 'part', label: 'A particular part' },
              { value: 'capability', label: 'Any part with a capability' },
            ]}
            value={form.requiresWhat}
            onChange={(e) => set({ requiresWhat: e.target.value as 'part' | 'capability' })}
          />
        )}
        {usesTarget && <SelectField label="Other part" options={partOptions} value={form.targetComponentId} onChange={(e) => set({ targetComponentId: e.target.value })} error={errors.targetComponentId} />}
        {usesCapability && (
          <>
            <TextField label="Capability" list="rule-capabilities" value={form.capability} onChange={(e) => set({ capability: e.target.value })} error={errors.capability} hint="Lower-case words joined by hyphens, e.g. electric-drive" />
            <datalist id="rule-capabilities">
              {capabilities.map((c) => (
                <option key={c} value={c} />
              ))}
            </datalist>
          </>
        )}
        {form.kind === 'prepares-for' && (
          <>
            <TextField label="Labour saved per unit (h)" inputMode="decimal" value={form.labourHoursSavedPerUnit} onChange={(e) => set({ labourHoursSavedPerUnit: e.target.value })} error={errors.labourHoursSavedPerUnit} />
            <TextField label="Parts saved per unit ($)" inputMode="decimal" value={form.partsUsdSavedPerUnit} onChange={(e) => set({ partsUsdSavedPerUnit: e.target.value })} error={errors.partsUsdSavedPerUnit} />
          </>
        )}
      </div>
      <Button type="submit" variant="secondary" className="mt-4">
        Add to the draft
      </Button>
    </form>
  );
}
