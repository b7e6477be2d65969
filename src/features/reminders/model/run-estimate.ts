// How many messages "Run now" would put in the outbox, said before the specialist confirms. The
// server enqueues the reminder due today once per contact in the audience, skipping contacts who
// already have that reminder (the outbox key is contact + campaign + offset). This counts the same.

export interface RunEstimate {
  /** Contacts in the audience today. */
  audience: number;
  /** Of those, contacts who already have today's reminder in the outbox. */
  alreadyQueued: number;
  /** Messages a run would add. */
  wouldEnqueue: number;
}

export function estimateRun(audienceContactIds: readonly number[], queuedAtDueOffset: readonly { contactId: number; offsetDays: number }[], dueOffsetDays: number | null): RunEstimate {
  const audience = new Set(audienceContactIds);
  if (dueOffsetDays === null) return { audience: audience.size, alreadyQueued: 0, wouldEnqueue: 0 };
  const queued = new Set(queuedAtDueOffset.filter((r) => r.offsetDays === dueOffsetDays && audience.has(r.contactId)).map((r) => r.contactId));
  return { audience: audience.size, alreadyQueued: queued.size, wouldEnqueue: audience.size - queued.size };
}
