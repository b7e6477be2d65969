import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { RuleInput } from '@shared/schemas/roadmap';
import type { CatalogComponent } from '@/features/fleet/api/types';
import { api, ApiError } from '@/lib/api';

export type RuleKind = RuleInput['kind'];

export interface ComponentRule {
  id: number;
  componentId: number;
  kind: RuleKind;
  targetComponentId: number | null;
  capability: string | null;
  labourHoursSavedPerUnit: number | null;
  partsUsdSavedPerUnit: number | null;
}

/** A refused rule set's reason: what is wrong and the parts it concerns ("KR-ED-300 Electric row drive"). */
export interface RuleProblem {
  code: string;
  message: string;
  parts: string[];
}

/** The API's error with the refused set's problems kept (the shared client keeps only field messages). */
export class RuleSetError extends ApiError {
  readonly problems: RuleProblem[];
  constructor(init: ConstructorParameters<typeof ApiError>[0] & { problems: RuleProblem[] }) {
    super(init);
    this.problems = init.problems;
  }
}

export const ruleKeys = {
  all: ['component-rules'] as const,
  list: () => [...ruleKeys.all, 'list'] as const,
  parts: () => [...ruleKeys.all, 'parts'] as const,
};

/** GET /api/component-rules (staff). */
export const rulesQueryOptions = () =>
  queryOptions({
    queryKey: ruleKeys.list(),
    queryFn: ({ signal }) => api.get<{ items: ComponentRule[] }>('/api/component-rules', undefined, signal),
    select: (data) => data.items,
  });

/** Every catalog part, active or not (a rule may name a retired part), by part number. */
export const rulePartsQueryOptions = () =>
  queryOptions({
    queryKey: ruleKeys.parts(),
    queryFn: ({ signal }) => api.get<{ items: CatalogComponent[]; total: number }>('/api/components', { page: 1, pageSize: 500, sort: 'partNumber' }, signal),
    select: (data) => data.items,
    staleTime: 5 * 60_000,
  });

/**
 * PUT /api/component-rules (admin, manager): replaces the whole set in one go. A set with a cycle
 * or a contradiction is refused (400 'rule_conflict') with its problems; this sender keeps them.
 */
export async function putRules(rules: RuleInput[]): Promise<{ rules: ComponentRule[]; warnings: string[] }> {
  const { token } = await api.get<{ token: string }>('/api/auth/csrf');
  let response: Response;
  try {
    response = await fetch('/api/component-rules', {
      method: 'PUT',
      credentials: 'include',
      headers: { Accept: 'application/json', 'Content-Type': 'application/json', 'X-CSRF-Token': token },
      body: JSON.stringify({ rules }),
    });
  } catch {
    throw new ApiError({ status: 0, code: 'network', message: 'Rowpath could not reach the server. Check the connection and try again.' });
  }
  if (response.ok) return response.json();
  let body: { error?: { code?: string; message?: string; details?: { fields?: Record<string, unknown>; problems?: RuleProblem[] } } } = {};
  try {
    body = await response.json();
  } catch {
    // Not JSON: keep the generic message.
  }
  const fields = Object.fromEntries(Object.entries(body.error?.details?.fields ?? {}).map(([k, v]) => [k, String(v)]));
  throw new RuleSetError({
    status: response.status,
    code: body.error?.code ?? `http_${response.status}`,
    message: body.error?.message || 'The rules could not be saved. Try again.',
    fields,
    problems: body.error?.details?.problems ?? [],
  });
}

export function useSaveRulesMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: putRules,
    onSuccess: (data) => queryClient.setQueryData(ruleKeys.list(), { items: data.rules }),
  });
}
