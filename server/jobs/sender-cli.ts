// A sender on its own, outside the web app: `node --import tsx server/jobs/sender-cli.ts`.
// Drains the outbox of DATABASE_URL through SMTP_URL (or the stand-in on LOCAL_SMTP_PORT), then
// exits; with --watch it keeps sending every few seconds until SIGTERM. Any number may run at
// once beside the app. Tuning (optional): REMINDER_BATCH, REMINDER_CONCURRENCY,
// REMINDER_LEASE_MS, REMINDER_BACKOFF_MS. Prints one JSON line with what it did.
import { loadConfig } from '../config.js';
import { createSequelize } from '../db/sequelize.js';
import { createMailTransport, transportTarget } from '../mail/transport.js';
import { drainOutbox, type SendSummary } from './sender.js';

const num = (name: string) => (process.env[name] ? Number(process.env[name]) : undefined);

async function main() {
  const config = loadConfig();
  if (!config.DATABASE_URL) throw new Error('Set DATABASE_URL to the MariaDB whose outbox to send.');
  const sequelize = createSequelize(config.DATABASE_URL);
  const transport = createMailTransport({ ...transportTarget(config), maxConnections: num('REMINDER_CONCURRENCY') });
  let stop = false;
  process.on('SIGTERM', () => (stop = true));
  process.on('SIGINT', () => (stop = true));
  const options = {
    sequelize,
    transport,
    from: config.MAIL_FROM,
    batchSize: num('REMINDER_BATCH'),
    concurrency: num('REMINDER_CONCURRENCY'),
    leaseMs: num('REMINDER_LEASE_MS'),
    backoffBaseMs: num('REMINDER_BACKOFF_MS'),
  };
  const total: SendSummary = { claimed: 0, sent: 0, retrying: 0, failed: 0, cancelled: 0, held: 0 };
  do {
    const s = await drainOutbox(options, () => stop);
    for (const k of Object.keys(total) as (keyof SendSummary)[]) total[k] += s[k];
    if (process.argv.includes('--watch') && !stop) await new Promise((r) => setTimeout(r, 3_000));
  } while (process.argv.includes('--watch') && !stop);
  transport.close();
  await sequelize.close();
  console.log(JSON.stringify(total));
}

main().catch((err) => {
  console.error(`The reminder sender stopped: ${(err as Error).message}`);
  process.exit(1);
});
