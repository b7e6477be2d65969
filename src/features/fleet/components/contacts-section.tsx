import { useForm } from 'react-hook-form';
import { contactSchema, type ContactInput } from '@shared/schemas/fleet';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/form-field';
import { StatusBadge } from '@/components/ui/status-badge';
import { useSaveAccountChildMutation } from '../api/account-children';
import type { Contact } from '../api/types';
import { sharedResolver, textOrNull } from '../lib/forms';
import { useSaveError } from '../lib/use-save-error';
import { ChildFormPanel, DeleteChildDialog, RecordActions, useChildSection } from './child-panel';
import { CheckboxField, FormButtons, SaveErrorAlert } from './form-bits';
import { FleetSection } from './section';

interface ContactFormValues {
  name: string;
  roleOnFarm: string;
  email: string;
  phone: string;
  reminderOptIn: boolean;
}
const fields = ['name', 'roleOnFarm', 'email', 'phone', 'reminderOptIn'] as const;
const toBody = (v: ContactFormValues) => ({ ...v, roleOnFarm: textOrNull(v.roleOnFarm), email: textOrNull(v.email), phone: textOrNull(v.phone) });
const resolver = sharedResolver<ContactFormValues, ContactInput>(contactSchema, toBody);

/** The people on the farm: who to call, who to e-mail, who gets the season reminders. */
export function ContactsSection({ accountId, contacts, canEdit }: { accountId: number; contacts: Contact[]; canEdit: boolean }) {
  const s = useChildSection<Contact>('contacts', accountId);
  const editing = s.editing;
  // The form follows the record as the account reloads: a newer version (after a 409) starts it afresh.
  const fresh = editing?.mode === 'update' ? (contacts.find((c) => c.id === editing.record.id) ?? editing.record) : null;
  return (
    <FleetSection
      id="contacts"
      title="Contacts"
      count={contacts.length}
      action={
        canEdit && (
          <Button variant="secondary" onClick={() => s.setEditing({ mode: 'create' })}>
            <span aria-hidden="true">+</span> Add a contact
          </Button>
        )
      }
    >
      {contacts.length === 0 ? (
        <p className="text-loam-700">No contacts recorded yet.</p>
      ) : (
        <ul className="divide-y divide-loam-200">
          {contacts.map((c) => (
            <li key={c.id} className="flex flex-wrap items-start justify-between gap-2 py-3 first:pt-0 last:pb-0">
              <div className="min-w-0">
                <p className="font-semibold text-ink-900">
                  {c.name}
                  {c.roleOnFarm && <span className="font-normal text-loam-700"> · {c.roleOnFarm}</span>}
                </p>
                <p className="flex flex-wrap gap-x-4 text-ink-800">
                  {c.email && (
                    <a className="underline underline-offset-2 [overflow-wrap:anywhere]" href={`mailto:${c.email}`}>
                      {c.email}
                    </a>
                  )}
                  {c.phone && (
                    <a className="underline underline-offset-2 tabular" href={`tel:${c.phone.replace(/[^\d+]/g, '')}`}>
                      {c.phone}
                    </a>
                  )}
                  {!c.email && !c.phone && <span className="text-loam-700 italic">No e-mail or phone</span>}
                </p>
                <p className="mt-1">
                  {c.unsubscribedAt ? (
                    <StatusBadge tone="neutral" shape="cross">Unsubscribed from reminders</StatusBadge>
                  ) : c.reminderOptIn ? (
                    <StatusBadge tone="good" shape="dot">Gets season reminders</StatusBadge>
                  ) : (
                    <StatusBadge tone="neutral" shape="dash">No reminders</StatusBadge>
                  )}
                </p>
              </div>
              {canEdit && <RecordActions name={c.name} onEdit={() => s.setEditing({ mode: 'update', record: c })} onDelete={() => s.setDeleting(c)} />}
            </li>
          ))}
        </ul>
      )}
      <ChildFormPanel open={editing !== null} title={editing?.mode === 'update' ? `Edit ${editing.record.name}` : 'Add a contact'} onClose={() => s.setEditing(null)}>
        {editing && (
          <ContactForm
            key={fresh ? `${fresh.id}-${fresh.version}` : 'new'}
            accountId={accountId}
            contact={fresh}
            onReload={s.reload}
            onDone={() => s.setEditing(null)}
          />
        )}
      </ChildFormPanel>
      <DeleteChildDialog kind="contact" record={s.deleting} remove={s.remove} onClose={() => s.setDeleting(null)} />
    </FleetSection>
  );
}

function ContactForm({ accountId, contact, onReload, onDone }: { accountId: number; contact: Contact | null; onReload: () => void; onDone: () => void }) {
  const save = useSaveAccountChildMutation('contacts', accountId);
  const form = useForm<ContactFormValues, unknown, ContactInput>({
    resolver,
    defaultValues: {
      name: contact?.name ?? '',
      roleOnFarm: contact?.roleOnFarm ?? '',
      email: contact?.email ?? '',
      phone: contact?.phone ?? '',
      reminderOptIn: contact?.reminderOptIn ?? true,
    },
  });
  const { register, handleSubmit, setError, formState: { errors } } = form;
  const { saveError, clearSaveError, handleSaveError } = useSaveError(setError, fields);
  const onSubmit = handleSubmit((input) => {
    clearSaveError();
    save.mutate(contact ? { mode: 'update', id: contact.id, input, version: contact.version } : { mode: 'create', input }, { onSuccess: onDone, onError: handleSaveError });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label={contact ? `Edit ${contact.name}` : 'Add a contact'}>
      {saveError && <SaveErrorAlert {...saveError} onReload={onReload} />}
      <TextField label="Name" autoComplete="off" data-autofocus error={errors.name?.message} {...register('name')} />
      <TextField label="Role on the farm" hint="Owner, operator, equipment lead…" autoComplete="off" error={errors.roleOnFarm?.message} {...register('roleOnFarm')} />
      <TextField label="E-mail" type="email" inputMode="email" autoComplete="off" spellCheck={false} error={errors.email?.message} {...register('email')} />
      <TextField label="Phone" type="tel" autoComplete="off" error={errors.phone?.message} {...register('phone')} />
      <CheckboxField label="Send this contact season reminders" error={errors.reminderOptIn?.message} {...register('reminderOptIn')} />
      <FormButtons busy={save.isPending} busyLabel="Saving…" label={contact ? 'Save contact' : 'Add contact'} onCancel={onDone} />
    </form>
  );
}
