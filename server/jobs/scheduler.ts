// Scheduled reminder work (croner), safe to run on every app instance at once: the enqueue job
// relies on the outbox's unique key, the send job on row claims with SKIP LOCKED.
//   enqueue — every 15 minutes (and once at start): the reminders due today go into the outbox.
//   send    — every 15 seconds (and when a campaign is run by hand): the outbox is drained.
import { Cron } from 'croner';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config.js';
import { startSmtpStandIn, type SmtpStandIn } from '../mail/smtp-standin.js';
import { createMailTransport, transportTarget, type MailTransport } from '../mail/transport.js';
import { enqueueDue } from './enqueue.js';
import { drainOutbox, newWorkerId, type SenderOptions } from './sender.js';

export interface ReminderJobs {
  /** Drain the outbox now rather than at the next tick. */
  kickSender(): void;
  /** Stops both jobs, waits for a send in progress and closes SMTP connections. */
  stop(): Promise<void>;
}

let current: ReminderJobs | null = null;

/** Called after a hand-run campaign: the running scheduler (if any in this process) sends at once. */
export function kickReminderSender() {
  current?.kickSender();
}

export interface ReminderJobsOptions {
  sequelize: Sequelize;
  config: Config;
  transport?: MailTransport;
  sender?: Partial<Omit<SenderOptions, 'sequelize' | 'transport' | 'from'>>;
  enqueuePattern?: string;
  sendPattern?: string;
  log?: (line: string, err?: unknown) => void;
}

export function startReminderJobs(opts: ReminderJobsOptions): ReminderJobs {
  const log = opts.log ?? ((line: string, err?: unknown) => console.error(`[${new Date().toISOString()}] ${line}`, err ?? ''));
  const transport = opts.transport ?? createMailTransport(transportTarget(opts.config));
  const links = { publicUrl: opts.config.PUBLIC_URL, secret: opts.config.sessionSecret, mailFrom: opts.config.MAIL_FROM };
  const workerId = newWorkerId();
  let stopping = false;
  let inFlight: Promise<unknown> = Promise.resolve();

  const track = <T>(p: Promise<T>) => {
    inFlight = inFlight.then(() => p).catch(() => undefined);
    return p;
  };

  const enqueueJob = new Cron(
    opts.enqueuePattern ?? '0 */15 * * * *',
    { name: `reminders-enqueue-${workerId}`, protect: true, catch: (err) => log('Reminder enqueue failed; it runs again at the next tick.', err) },
    async () => {
      if (stopping) return;
      const results = await track(enqueueDue(opts.sequelize, links));
      const enqueued = results.reduce((n, r) => n + r.enqueued, 0);
      if (enqueued) {
        log(`Reminders: ${enqueued} message(s) enqueued.`);
        void sendJob.trigger();
      }
    },
  );
  const sendJob = new Cron(
    opts.sendPattern ?? '*/15 * * * * *',
    { name: `reminders-send-${workerId}`, protect: true, catch: (err) => log('Reminder sending failed; it runs again at the next tick.', err) },
    async () => {
      if (stopping) return;
      const s = await track(drainOutbox({ sequelize: opts.sequelize, transport, from: opts.config.MAIL_FROM, workerId, log, ...opts.sender }, () => stopping));
      if (s.sent || s.failed || s.retrying) log(`Reminders: ${s.sent} sent, ${s.retrying} to retry, ${s.failed} failed.`);
    },
  );
  void enqueueJob.trigger();

  const jobs: ReminderJobs = {
    kickSender: () => void sendJob.trigger(),
    async stop() {
      stopping = true;
      enqueueJob.stop();
      sendJob.stop();
      await inFlight;
      transport.close();
      if (current === jobs) current = null;
    },
  };
  current = jobs;
  return jobs;
}

/**
 * What `npm start` runs after the app listens: the local SMTP stand-in (only when SMTP_URL is
 * unset; a taken port is reported, not fatal) and the reminder jobs. stop() ends both.
 */
export async function startMailAndJobs(sequelize: Sequelize, config: Config, log: (line: string) => void = console.log): Promise<{ stop(): Promise<void> }> {
  let standIn: SmtpStandIn | null = null;
  if (!config.SMTP_URL) {
    try {
      standIn = await startSmtpStandIn({ sequelize, port: config.LOCAL_SMTP_PORT });
      log(`Local SMTP stand-in on 127.0.0.1:${standIn.port} (messages show on the admin's Sent mail page).`);
    } catch (err) {
      log(`The local SMTP stand-in could not start on port ${config.LOCAL_SMTP_PORT} (${(err as Error).message}); reminders wait in the outbox. Set LOCAL_SMTP_PORT to a free port.`);
    }
  }
  const jobs = startReminderJobs({ sequelize, config });
  return {
    async stop() {
      await jobs.stop();
      await standIn?.close();
    },
  };
}
