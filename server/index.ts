// `npm start`: database, migrations, demo data when empty, client build when stale, then the app
// on http://127.0.0.1:PORT. Ctrl-C / SIGTERM closes the HTTP server first, then the database.
import type { Server } from 'node:http';
import { seedDemo, DEMO_PASSWORD, DEMO_USERS } from '../seeders/demo.js';
import { createApp } from './app.js';
import { assertPortFree, clientDir, databaseIsEmpty, ensureClientBuilt, openDatabase, type Database } from './boot.js';
import { loadConfig } from './config.js';
import { startMailAndJobs } from './jobs/scheduler.js';

async function main() {
  const config = loadConfig();
  await assertPortFree(config.PORT, config.HOST);
  const db: Database = await openDatabase(config);
  let server: Server | null = null;
  let mailAndJobs: Promise<{ stop(): Promise<void> } | null> | null = null; // reminders: SMTP stand-in + scheduler
  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`\n${signal}: closing the web server, then the database…`);
    await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
    server?.closeAllConnections?.();
    await (await mailAndJobs)?.stop(); // reminders stop before the database closes
    await db.close();
    console.log('Rowpath stopped cleanly.');
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  try {
    if (config.SEED_DEMO && (await databaseIsEmpty())) {
      console.log('Empty database: loading the demo dealership…');
      await seedDemo(db.sequelize);
    }
    if (!process.env.ROWPATH_SKIP_CLIENT_BUILD) ensureClientBuilt();
  } catch (err) {
    await db.close();
    throw err;
  }
  let app: ReturnType<typeof createApp>;
  try {
    app = createApp({ sequelize: db.sequelize, config, clientDir });
  } catch (err) {
    await db.close(); // the database this process started must not outlive it
    throw err;
  }
  server = app.listen(config.PORT, config.HOST, () => {
    const address = server!.address();
    const port = typeof address === 'object' && address ? address.port : config.PORT;
    console.log(`\nRowpath is running on http://${config.HOST}:${port}  (database ${db.describe})`);
    if (config.SEED_DEMO) {
      console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"): ${DEMO_USERS.map((u) => u.email).join(', ')}`);
    }
    console.log('Press Ctrl-C to stop.');
    // Reminders: the local SMTP stand-in (only without SMTP_URL) and the enqueue/send jobs.
    mailAndJobs = startMailAndJobs(db.sequelize, config).catch((err) => (console.error(`Reminders did not start: ${err.message}`), null));
  });
  server.on('error', async (err: NodeJS.ErrnoException) => {
    console.error(err.code === 'EADDRINUSE' ? `Port ${config.PORT} is already in use. Set PORT to a free port.` : err.message);
    await db.close();
    process.exit(1);
  });
}

main().catch((err) => {
  console.error(`Rowpath could not start: ${(err as Error).message}`);
  process.exit(1);
});
