import { useQuery } from '@tanstack/react-query';
import { useId, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, inputClasses } from '@/components/ui/form-field';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { calendarLinksQueryOptions, useRotateCalendarLinkMutation, type CalendarLinks } from '../api/calendar-links';

const SCOPE_WORDS: Record<CalendarLinks['scope'], string> = {
  specialist: 'the visits assigned to you',
  grower: 'your operation’s visits',
  territories: 'the visits in your territories',
  all: 'every visit',
};

/**
 * The user's own iCalendar feed: a secret address a calendar program subscribes to. Copy it, or
 * replace it (after a confirmation) when it may have been shared too widely.
 */
export function SubscribePanel() {
  const links = useQuery(calendarLinksQueryOptions());
  const rotate = useRotateCalendarLinkMutation();
  const [confirming, setConfirming] = useState(false);
  const [copied, setCopied] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const inputRef = useRef<HTMLTextAreaElement>(null);
  const inputId = useId();

  if (links.isPending) return <LoadingBlock label="Loading your calendar address…" />;
  if (links.isError) return <ErrorState message={links.error.message} onRetry={() => void links.refetch()} retrying={links.isFetching} />;
  const data = links.data;

  const copy = async () => {
    setCopied(null);
    try {
      await navigator.clipboard.writeText(data.feedUrl);
      setCopied('Address copied. Paste it into your calendar program as a subscription.');
    } catch {
      // Clipboard refused (no permission, plain http): select it for a manual copy instead.
      inputRef.current?.select();
      setCopied('Press Ctrl+C (or ⌘C) to copy the selected address.');
    }
  };

  return (
    <div className="space-y-3">
      <p className="text-ink-900">
        Subscribe to this address in the calendar you already use to see {SCOPE_WORDS[data.scope]}. Calendar programs check it about every{' '}
        {data.refreshMinutes} minutes.
      </p>
      <div>
        <label htmlFor={inputId} className="mb-1 block font-semibold text-ink-900">
          Calendar feed address
        </label>
        <div className="space-y-2">
          <textarea
            ref={inputRef}
            id={inputId}
            readOnly
            rows={2}
            className={`${inputClasses} resize-none font-mono text-sm break-all`}
            value={data.feedUrl}
            onFocus={(e) => e.currentTarget.select()}
          />
          <Button variant="secondary" onClick={() => void copy()}>
            Copy address
          </Button>
        </div>
        <p className="mt-1 text-sm text-loam-700">Keep it to yourself: anyone with the address can read these visits.</p>
      </div>
      <p role="status" className="empty:hidden font-semibold text-seedling-800">
        {copied}
      </p>
      <div className="flex flex-wrap gap-3">
        <a className="inline-flex min-h-11 items-center font-semibold text-ink-800 underline underline-offset-4" href={data.webcalUrl}>
          Open in your calendar program
        </a>
        <Button variant="ghost" onClick={() => setConfirming(true)}>
          Replace the address…
        </Button>
      </div>

      <Dialog open={confirming} onClose={() => setConfirming(false)} title="Replace your calendar address?">
        <div className="space-y-4">
          <p>Calendars subscribed to the current address stop updating at once. You will need to subscribe again with the new one.</p>
          {error && <FormAlert>{error}</FormAlert>}
          <div className="flex flex-wrap gap-3 pt-2">
            <Button
              variant="danger"
              busy={rotate.isPending}
              onClick={() => {
                setError(null);
                rotate.mutate(undefined, {
                  onSuccess: () => {
                    setConfirming(false);
                    setCopied('A new address is ready. The old one no longer works.');
                  },
                  onError: (err) => setError(err.message),
                });
              }}
            >
              Replace the address
            </Button>
            <Button variant="secondary" onClick={() => setConfirming(false)} data-autofocus>
              Keep the current one
            </Button>
          </div>
        </div>
      </Dialog>
    </div>
  );
}
