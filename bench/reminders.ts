// Reminder benchmark: 5,000 due reminders enqueued and delivered to the local SMTP stand-in, which
// parses and stores each one in MariaDB. Target: all received within 60 s, received = enqueued.
// The stand-in runs as its own process (server/mail/standin-cli.ts), as a separate mail host
// would, so sender and receiver each get a core. Run with `npx tsx bench/reminders.ts` (own
// MariaDB on 127.0.0.1:3419, data in .data/bench-reminders). BENCH_REMINDERS and
// BENCH_CONCURRENCY change the size and the number of SMTP connections.
import { spawn } from 'node:child_process';
import { cpus, loadavg } from 'node:os';
import { QueryTypes } from 'sequelize';
import { isoDateUtc } from '../shared/calc/season-calendar';
import { startLocalMariaDb } from '../server/db/local-mariadb';
import { migrateUp } from '../server/db/migrate';
import { Account, Contact, initModels, ReminderCampaign, ReminderCampaignTerritory, SeasonWindow, Territory } from '../server/db/models/index';
import { createSequelize } from '../server/db/sequelize';
import { enqueueCampaign } from '../server/jobs/enqueue';
import { drainOutbox } from '../server/jobs/sender';
import { createMailTransport } from '../server/mail/transport';

const REMINDERS = Number(process.env.BENCH_REMINDERS ?? 5_000);
const CONTACTS_PER_ACCOUNT = 4;
const TARGET_S = 60;
const CONCURRENCY = Number(process.env.BENCH_CONCURRENCY ?? 8);

const db = await startLocalMariaDb({ baseDir: '.data/bench-reminders', port: Number(process.env.BENCH_DB_PORT ?? 3419), database: 'rowpath_bench', log: () => undefined });
const sequelize = createSequelize(db.url);
try {
  await sequelize.getQueryInterface().dropAllTables();
  await migrateUp(sequelize);
  initModels(sequelize);

  // Invented growers on the Plains, all opted in, all growing corn.
  const territory = await Territory.create({ name: 'Bench territory', region: 'Invented' });
  const accounts = await Account.bulkCreate(
    Array.from({ length: Math.ceil(REMINDERS / CONTACTS_PER_ACCOUNT) }, (_, i) => ({
      name: `Bench Farms ${i + 1}`,
      territoryId: territory.id,
      specialistId: null,
      address: null,
      town: 'Benchville',
      state: 'KS',
      lat: 39.4,
      lng: -98.1,
      acresByCrop: { corn: 800, soybean: 400 },
      notes: null,
    })),
  );
  const contacts = [];
  for (let i = 0; i < REMINDERS; i++) {
    contacts.push({ accountId: accounts[Math.floor(i / CONTACTS_PER_ACCOUNT)].id, name: `Grower ${i + 1}`, roleOnFarm: null, email: `grower${i + 1}@growers.rowpath.test`, phone: null, reminderOptIn: true });
  }
  for (let i = 0; i < contacts.length; i += 1000) await Contact.bulkCreate(contacts.slice(i, i + 1000));

  // A window opening in 5 days: the 10-day reminder is due today.
  const start = new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10);
  await SeasonWindow.create({ regionKey: 'bench', regionLabel: 'Bench', crop: 'corn', windowStart: start.endsWith('12-31') ? '12-30' : start.slice(5), windowEnd: '12-31', source: 'bench', sourceText: null, updatedBy: null });
  const campaign = await ReminderCampaign.create({
    name: 'Bench check-up',
    season: Number(start.slice(0, 4)),
    regionKey: 'bench',
    crop: 'corn',
    offsetsDays: [10],
    audience: { growsCrop: true, hasRoadmapItems: false, noCheckupSince: null },
    subject: 'Pre-season check-up, {{grower.firstName}}',
    body: 'Hello {{grower.name}},\n\nPlanting opens {{windowStart}}.\n\n{{planters}}\n\n{{checklist}}\n\n{{bookingLink}}',
    status: 'active',
    createdBy: null,
    updatedBy: null,
  });
  await ReminderCampaignTerritory.create({ campaignId: campaign.id, territoryId: territory.id });

  const standIn = spawn(process.execPath, ['--import', 'tsx', 'server/mail/standin-cli.ts'], {
    env: { ...process.env, DATABASE_URL: db.url, LOCAL_SMTP_PORT: '0', NODE_ENV: 'test', ROWPATH_DATA_DIR: '.data/bench-reminders' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const smtpPort = await new Promise<number>((resolve, reject) => {
    let out = '';
    standIn.stdout!.on('data', (d) => {
      out += d;
      const m = /listening on 127\.0\.0\.1:(\d+)/.exec(out);
      if (m) resolve(Number(m[1]));
    });
    standIn.once('exit', (code) => reject(new Error(`the SMTP stand-in exited (${code})`)));
  });
  const links = { publicUrl: 'http://127.0.0.1:3000', secret: 'bench-secret-bench-secret-bench-secret', mailFrom: 'Rowpath reminders <reminders@rowpath.test>' };

  const t0 = performance.now();
  const result = await enqueueCampaign(sequelize, campaign, links, isoDateUtc(new Date()));
  const enqueueS = (performance.now() - t0) / 1000;

  const transport = createMailTransport({ localPort: smtpPort, maxConnections: CONCURRENCY });
  const t1 = performance.now();
  const summary = await drainOutbox({ sequelize, transport, from: links.mailFrom, batchSize: 100, concurrency: CONCURRENCY });
  const sendS = (performance.now() - t1) / 1000;
  transport.close();
  standIn.kill('SIGTERM');
  await new Promise((r) => standIn.once('exit', r));

  const [stored] = await sequelize.query<{ n: number; repeats: number | null }>('SELECT COUNT(*) AS n, SUM(repeat_count) AS repeats FROM received_mail', { type: QueryTypes.SELECT });
  const totalS = enqueueS + sendS;
  console.log(`Reminders benchmark: ${CONCURRENCY} SMTP connections; the stand-in parses and stores each message in MariaDB (${cpus().length} cores, load average ${loadavg()[0].toFixed(1)})`);
  console.log(`enqueued:  ${result.enqueued}  in ${enqueueS.toFixed(2)} s`);
  console.log(`sent:      ${summary.sent} (retrying ${summary.retrying}, failed ${summary.failed})  in ${sendS.toFixed(2)} s  = ${(summary.sent / sendS).toFixed(0)} messages/s`);
  console.log(`received:  ${Number(stored.n)} (repeats ${Number(stored.repeats ?? 0)})`);
  console.log(`seconds:   ${totalS.toFixed(2)} (enqueue + delivery; target ≤ ${TARGET_S} s)`);
  const ok = result.enqueued === REMINDERS && Number(stored.n) === result.enqueued && totalS <= TARGET_S;
  console.log(ok ? 'PASS: every enqueued reminder was received, within the target.' : 'FAIL');
  process.exitCode = ok ? 0 : 1;
} finally {
  await sequelize.close();
  await db.stop();
}
