// Checks a catalog's part rules for contradictions a specialist must fix before planning with them.
// Every problem names the parts involved so the catalog screen can point at them.
import type { CatalogPart, PartRule, RuleProblem } from './planner-types';

type Graph = Map<string, Set<string>>;

function addEdge(graph: Graph, from: string, to: string): void {
  let targets = graph.get(from);
  if (!targets) graph.set(from, (targets = new Set()));
  targets.add(to);
}

/**
 * Elementary cycles are too many to list; one cycle per strongly connected component is what a
 * person needs to find the mistake. Tarjan's algorithm, then a walk inside each component.
 */
function findCycles(graph: Graph): string[][] {
  const nodes = [...new Set([...graph.keys(), ...[...graph.values()].flatMap((s) => [...s])])].sort();
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const components: string[][] = [];
  let counter = 0;

  const strongConnect = (v: string): void => {
    index.set(v, counter);
    low.set(v, counter);
    counter += 1;
    stack.push(v);
    onStack.add(v);
    for (const w of [...(graph.get(v) ?? [])].sort()) {
      if (!index.has(w)) {
        strongConnect(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) {
        low.set(v, Math.min(low.get(v)!, index.get(w)!));
      }
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      components.push(component);
    }
  };
  for (const v of nodes) if (!index.has(v)) strongConnect(v);

  const cycles: string[][] = [];
  for (const component of components) {
    const members = new Set(component);
    const start = [...component].sort()[0];
    if (component.length === 1 && !graph.get(start)?.has(start)) continue;
    // Walk from the smallest id inside the component until a node repeats: that loop is a cycle.
    const path: string[] = [start];
    const seenAt = new Map<string, number>([[start, 0]]);
    let current = start;
    for (;;) {
      const next = [...(graph.get(current) ?? [])].filter((w) => members.has(w)).sort()[0];
      const at = seenAt.get(next);
      if (at !== undefined) {
        cycles.push(path.slice(at));
        break;
      }
      seenAt.set(next, path.length);
      path.push(next);
      current = next;
    }
  }
  return cycles;
}

function ruleKey(rule: PartRule): string {
  switch (rule.kind) {
    case 'requires':
      return 'requiredPartId' in rule
        ? `requires|${rule.partId}|part:${rule.requiredPartId}`
        : `requires|${rule.partId}|cap:${rule.requiredCapability}`;
    case 'conflictsWith':
      return `conflicts|${[rule.partId, rule.otherPartId].sort().join('|')}`;
    case 'supersedes':
      return `supersedes|${rule.partId}|${rule.supersededPartId}`;
    case 'provides':
      return `provides|${rule.partId}|${rule.capability}`;
    case 'preparesFor':
      return `prepares|${rule.partId}|${rule.laterPartId}`;
  }
}

function otherPartOf(rule: PartRule): string | undefined {
  switch (rule.kind) {
    case 'requires':
      return 'requiredPartId' in rule ? rule.requiredPartId : undefined;
    case 'conflictsWith':
      return rule.otherPartId;
    case 'supersedes':
      return rule.supersededPartId;
    case 'preparesFor':
      return rule.laterPartId;
    case 'provides':
      return undefined;
  }
}

/**
 * Problems of a rule set, errors first. Errors make plans meaningless (cycles, contradictions,
 * unknown parts); warnings are suspicious but plannable (duplicates, savings larger than the part).
 */
export function validateRuleSet(parts: readonly CatalogPart[], rules: readonly PartRule[]): RuleProblem[] {
  const problems: RuleProblem[] = [];
  const partsById = new Map(parts.map((p) => [p.id, p]));
  const nameOf = (id: string): string => (partsById.has(id) ? `${partsById.get(id)!.name} (${id})` : id);
  const add = (code: RuleProblem['code'], severity: RuleProblem['severity'], partIds: string[], message: string): void => {
    problems.push({ code, severity, partIds, message });
  };

  const seenRules = new Set<string>();
  const known: PartRule[] = [];
  for (const rule of rules) {
    const ids = [rule.partId, otherPartOf(rule)].filter((id): id is string => id !== undefined);
    const unknown = ids.filter((id) => !partsById.has(id));
    if (unknown.length > 0) {
      add('unknown-part', 'error', unknown, `A ${rule.kind} rule names ${unknown.join(', ')}, which is not in the catalog.`);
      continue;
    }
    const key = ruleKey(rule);
    if (seenRules.has(key)) {
      add('duplicate-rule', 'warning', ids, `The ${rule.kind} rule between ${ids.map(nameOf).join(' and ')} is listed twice.`);
      continue;
    }
    seenRules.add(key);
    if (ids.length === 2 && ids[0] === ids[1]) {
      add('self-reference', 'error', [rule.partId], `${nameOf(rule.partId)} has a ${rule.kind} rule naming itself.`);
      continue;
    }
    known.push(rule);
  }

  const providers = new Map<string, Set<string>>();
  const requiresParts = new Map<string, Set<string>>();
  const requiresCaps = new Map<string, Set<string>>();
  const conflicts = new Map<string, Set<string>>();
  const supersedes: Graph = new Map();
  const addTo = (map: Map<string, Set<string>>, key: string, value: string): void => addEdge(map, key, value);
  for (const rule of known) {
    if (rule.kind === 'provides') addTo(providers, rule.capability, rule.partId);
    if (rule.kind === 'requires' && 'requiredPartId' in rule) addTo(requiresParts, rule.partId, rule.requiredPartId);
    if (rule.kind === 'requires' && 'requiredCapability' in rule) addTo(requiresCaps, rule.partId, rule.requiredCapability);
    if (rule.kind === 'conflictsWith') {
      addTo(conflicts, rule.partId, rule.otherPartId);
      addTo(conflicts, rule.otherPartId, rule.partId);
    }
    if (rule.kind === 'supersedes') addEdge(supersedes, rule.partId, rule.supersededPartId);
  }
  const conflict = (a: string, b: string): boolean => conflicts.get(a)?.has(b) ?? false;

  // A capability required but provided by no part can never be satisfied.
  for (const [partId, caps] of requiresCaps) {
    for (const cap of caps) {
      if (!providers.has(cap)) {
        add('capability-without-provider', 'error', [partId], `${nameOf(partId)} requires "${cap}", which no part provides.`);
      }
    }
  }

  // Requires cycles: through a required part, or through a capability only one part provides
  // (with several providers the requirement can be met another way).
  const requiresGraph: Graph = new Map();
  for (const [partId, required] of requiresParts) for (const r of required) addEdge(requiresGraph, partId, r);
  for (const [partId, caps] of requiresCaps) {
    for (const cap of caps) {
      const only = providers.get(cap);
      if (only && only.size === 1) addEdge(requiresGraph, partId, [...only][0]);
    }
  }
  for (const cycle of findCycles(requiresGraph)) {
    add(
      'requires-cycle',
      'error',
      cycle,
      `Requirements go round in a circle: ${[...cycle, cycle[0]].map(nameOf).join(' requires ')}.`,
    );
  }

  for (const cycle of findCycles(supersedes)) {
    add(
      'supersedes-cycle',
      'error',
      cycle,
      `Supersessions go round in a circle: ${[...cycle, cycle[0]].map(nameOf).join(' supersedes ')}.`,
    );
  }

  for (const [partId, required] of requiresParts) {
    for (const r of required) {
      if (conflict(partId, r)) {
        add('requires-and-conflicts', 'error', [partId, r], `${nameOf(partId)} both requires and conflicts with ${nameOf(r)}.`);
      }
      if (supersedes.get(partId)?.has(r)) {
        add('supersedes-required-part', 'error', [partId, r], `${nameOf(partId)} requires ${nameOf(r)} but also removes it (supersedes).`);
      }
    }
  }
  for (const [partId, caps] of requiresCaps) {
    for (const cap of caps) {
      const capProviders = [...(providers.get(cap) ?? [])];
      if (capProviders.length > 0 && capProviders.every((p) => conflict(partId, p) || supersedes.get(partId)?.has(p))) {
        add(
          'requires-and-conflicts',
          'error',
          [partId, ...capProviders.sort()],
          `${nameOf(partId)} requires "${cap}" but conflicts with (or removes) every part that provides it: ${capProviders.map(nameOf).join(', ')}.`,
        );
      }
    }
  }

  // Two direct requirements of one part that conflict with each other: the part can never work.
  for (const [partId, required] of requiresParts) {
    const list = [...required].sort();
    for (let i = 0; i < list.length; i += 1) {
      for (let j = i + 1; j < list.length; j += 1) {
        if (conflict(list[i], list[j])) {
          add(
            'requirements-conflict',
            'error',
            [partId, list[i], list[j]],
            `${nameOf(partId)} requires both ${nameOf(list[i])} and ${nameOf(list[j])}, which conflict with each other.`,
          );
        }
      }
    }
  }

  for (const rule of known) {
    if (rule.kind !== 'preparesFor') continue;
    const later = partsById.get(rule.laterPartId)!;
    if (conflict(rule.partId, rule.laterPartId) && !supersedes.get(rule.laterPartId)?.has(rule.partId)) {
      add(
        'prepares-for-conflicting-part',
        'error',
        [rule.partId, rule.laterPartId],
        `${nameOf(rule.partId)} prepares for ${nameOf(rule.laterPartId)} but the two conflict, so the saving can never be used.`,
      );
    }
    if (rule.labourHoursSavedPerUnit > later.labourHours || rule.partsUsdSavedPerUnit > later.priceUsd) {
      add(
        'saving-exceeds-part',
        'warning',
        [rule.partId, rule.laterPartId],
        `${nameOf(rule.partId)} saves more on ${nameOf(rule.laterPartId)} than that part costs or takes to fit; the saving is capped at the part.`,
      );
    }
  }

  const severityRank = { error: 0, warning: 1 } as const;
  return problems
    .map((p, order) => ({ p, order }))
    .sort((a, b) => severityRank[a.p.severity] - severityRank[b.p.severity] || a.order - b.order)
    .map(({ p }) => p);
}
