// InnoDB may pick a statement as a deadlock victim when instances write the same keys at once
// (two enqueues of one campaign, two senders claiming). The victim's statement or transaction is
// rolled back whole, and the server's own advice is to run it again: this does, a few times,
// after a short random pause so the two do not meet again in step.

const RETRYABLE_ERRNO = new Set([1213 /* ER_LOCK_DEADLOCK */, 1205 /* ER_LOCK_WAIT_TIMEOUT */]);

function errnoOf(err: unknown): number | undefined {
  const e = err as { errno?: unknown; parent?: { errno?: unknown }; original?: { errno?: unknown } } | null;
  const n = e?.parent?.errno ?? e?.original?.errno ?? e?.errno;
  return typeof n === 'number' ? n : undefined;
}

/** True when the database rolled the work back and asks for it to be run again. */
export function isRetryableLockError(err: unknown): boolean {
  const n = errnoOf(err);
  return n !== undefined && RETRYABLE_ERRNO.has(n);
}

/**
 * Runs `work` and runs it again when it was a deadlock victim, up to `attempts` times in all.
 * `work` must be safe to repeat: one statement, or a whole transaction the database rolled back.
 */
export async function retryOnDeadlock<T>(work: () => Promise<T>, attempts = 5, pauseMs = 20): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      if (attempt >= attempts || !isRetryableLockError(err)) throw err;
      await new Promise((resolve) => setTimeout(resolve, pauseMs * attempt * (0.5 + Math.random())));
    }
  }
}
