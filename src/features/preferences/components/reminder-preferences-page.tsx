import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { FormAlert } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState, LoadingBlock } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { Spinner } from '@/components/ui/spinner';
import { Notice } from '@/features/fleet/components/form-bits';
import { formatDate } from '@/features/fleet/lib/labels';
import { cn } from '@/lib/cn';
import { reminderPreferencesQueryOptions, useSaveReminderPreferencesMutation, type PreferenceContact } from '../api/reminder-preferences';

/** Grower: which of the farm's contacts get the dealership's pre-season reminders. Each switch saves at once. */
export function ReminderPreferencesPage() {
  const prefs = useQuery(reminderPreferencesQueryOptions());
  const save = useSaveReminderPreferencesMutation();
  const [notice, setNotice] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  // The switch moves at once; the saved answer replaces the guess (or puts it back on failure).
  const [pending, setPending] = useState<Record<number, boolean>>({});
  const toggle = (contact: PreferenceContact, on: boolean) => {
    setError(null);
    setPending((p) => ({ ...p, [contact.id]: on }));
    save.mutate(
      { contacts: [{ id: contact.id, reminderOptIn: on }] },
      {
        onSuccess: () => setNotice(on ? `${contact.name} will get pre-season reminders.` : `${contact.name} will get no more pre-season reminders.`),
        onError: (e) => setError(`${contact.name}: ${e.message}`),
        onSettled: () =>
          setPending((p) => {
            const { [contact.id]: _done, ...rest } = p;
            return rest;
          }),
      },
    );
  };

  return (
    <>
      <title>Reminders · Rowpath</title>
      <PageHeader
        title="Pre-season reminders"
        description="Before planting, your dealership e-mails reminders: when to book the planter check-up, what to inspect, early-order dates and the upgrades planned for the season. Choose who on your farm receives them."
      />
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-4" />
      {error && (
        <div className="mb-4">
          <FormAlert>{error}</FormAlert>
        </div>
      )}
      {prefs.isPending ? (
        <LoadingBlock label="Loading your contacts…" />
      ) : prefs.isError ? (
        <ErrorState title="Your reminder settings could not be loaded" message={prefs.error.message} onRetry={() => void prefs.refetch()} retrying={prefs.isFetching} />
      ) : prefs.data.contacts.length === 0 ? (
        <EmptyState title="No contacts on record">Ask your specialist to add the people on your farm who should hear from the dealership.</EmptyState>
      ) : (
        <section aria-labelledby="prefs-title" className="max-w-3xl">
          <h2 id="prefs-title" className="mb-3 text-xl font-bold text-ink-900">
            Contacts at {prefs.data.account.name}
          </h2>
          <ul className="divide-y divide-loam-200 rounded-xl border border-loam-200 bg-white shadow-sm">
            {prefs.data.contacts.map((contact) => (
              <ContactRow key={contact.id} contact={contact} pendingOn={pending[contact.id]} busy={save.isPending && save.variables?.contacts[0]?.id === contact.id} disabled={save.isPending} onToggle={toggle} />
            ))}
          </ul>
          <p className="mt-4 max-w-prose text-loam-700">
            Every reminder also carries a one-click unsubscribe link. Turning a contact back on here undoes an unsubscribe. No tracking: reminders have no images or pixels.
          </p>
        </section>
      )}
    </>
  );
}

function ContactRow({ contact, pendingOn, busy, disabled, onToggle }: { contact: PreferenceContact; pendingOn: boolean | undefined; busy: boolean; disabled: boolean; onToggle: (c: PreferenceContact, on: boolean) => void }) {
  const noEmail = !contact.email;
  const on = pendingOn ?? (contact.reminderOptIn && !contact.unsubscribedAt);
  const switchId = `reminders-${contact.id}`;
  return (
    <li className="flex flex-wrap items-center justify-between gap-4 px-5 py-4" data-preference-contact={contact.id}>
      <div className="min-w-0">
        <p className="font-semibold text-ink-950">{contact.name}</p>
        <p className="break-all text-loam-700">{contact.email ?? 'No e-mail address on record'}</p>
        <p className="mt-1">
          {contact.receivesReminders ? (
            <StatusBadge tone="good" shape="dot">
              Receives reminders
            </StatusBadge>
          ) : contact.unsubscribedAt ? (
            <StatusBadge tone="neutral" shape="cross">
              Unsubscribed {formatDate(contact.unsubscribedAt)}
            </StatusBadge>
          ) : noEmail ? (
            <StatusBadge tone="soon" shape="triangle">
              No e-mail address — ask your specialist
            </StatusBadge>
          ) : (
            <StatusBadge tone="neutral" shape="dash">
              Reminders off
            </StatusBadge>
          )}
        </p>
      </div>
      <label htmlFor={switchId} className={cn('flex min-h-12 cursor-pointer items-center gap-3', (disabled || noEmail) && 'cursor-not-allowed opacity-70')}>
        <span className="font-semibold text-ink-900">Reminders for {contact.name}</span>
        {busy && <Spinner className="size-4" />}
        <input
          id={switchId}
          type="checkbox"
          role="switch"
          className="peer sr-only"
          checked={on}
          disabled={disabled || (noEmail && !on)}
          onChange={(e) => onToggle(contact, e.target.checked)}
          aria-describedby={`${switchId}-state`}
        />
        <span
          aria-hidden="true"
          className={cn(
            'relative inline-flex h-8 w-14 shrink-0 items-center rounded-full border-2 transition-colors peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-ink-500',
            on ? 'border-seedling-700 bg-seedling-600' : 'border-loam-500 bg-loam-200',
          )}
        >
          <span className={cn('absolute size-6 rounded-full bg-white shadow transition-transform', on ? 'translate-x-6' : 'translate-x-0.5')} />
        </span>
        <span id={`${switchId}-state`} className="w-8 font-semibold text-ink-900">
          {on ? 'On' : 'Off'}
        </span>
      </label>
    </li>
  );
}
