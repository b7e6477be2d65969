// A grower's own reminder preferences: which of their account's contacts receive reminders.
// Growers only (the router refuses other roles); a contact of another account reads as missing.
import type { Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { ReminderPreferencesInput } from '../../../shared/schemas/reminders.js';
import { Account, AuditEvent, Contact } from '../../db/models/index.js';
import { AppError, notFound } from '../../http/errors.js';

async function ownAccount(user: SessionUser) {
  if (user.role !== 'grower') throw new AppError('forbidden', 403, 'Reminder preferences are set by the grower; staff change contacts on the account.');
  const account = user.accountId ? await Account.findByPk(user.accountId, { attributes: ['id', 'name'] }) : null;
  if (!account) throw notFound('Your account');
  return account;
}

export async function getPreferences(user: SessionUser) {
  const account = await ownAccount(user);
  const contacts = await Contact.findAll({ where: { accountId: account.id }, order: [['name', 'ASC'], ['id', 'ASC']] });
  return {
    account: { id: account.id, name: account.name },
    contacts: contacts.map((c) => ({
      id: c.id,
      name: c.name,
      email: c.email,
      reminderOptIn: c.reminderOptIn,
      unsubscribedAt: c.unsubscribedAt ? c.unsubscribedAt.toISOString() : null,
      /** Whether reminders reach this contact now. */
      receivesReminders: Boolean(c.reminderOptIn && !c.unsubscribedAt && c.email),
    })),
  };
}

/** Opting in again also clears an earlier unsubscribe: it is the grower's own, signed-in choice. */
export async function putPreferences(sequelize: Sequelize, user: SessionUser, input: ReminderPreferencesInput) {
  const account = await ownAccount(user);
  await sequelize.transaction(async (transaction) => {
    for (const change of input.contacts) {
      const contact = await Contact.findOne({ where: { id: change.id, accountId: account.id }, transaction, lock: transaction.LOCK.UPDATE });
      if (!contact) throw notFound('That contact');
      const before = { reminderOptIn: contact.reminderOptIn, unsubscribedAt: contact.unsubscribedAt };
      contact.reminderOptIn = change.reminderOptIn;
      if (change.reminderOptIn) contact.unsubscribedAt = null;
      if (!contact.changed()) continue;
      await contact.save({ transaction });
      await AuditEvent.create(
        {
          at: new Date(),
          accountId: account.id,
          userId: user.id,
          entity: 'contact',
          entityId: contact.id,
          action: 'update',
          summary: `${contact.name} ${change.reminderOptIn ? 'opted in to' : 'opted out of'} reminders (grower preferences)`,
          changes: { reminderOptIn: [before.reminderOptIn, change.reminderOptIn] },
        },
        { transaction },
      );
    }
  });
  return getPreferences(user);
}
