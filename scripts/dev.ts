// `npm run dev`: the same database as `npm start`, the API reloading on change (tsx watch) and
// Vite's dev server with hot reload, proxying /api to the API.
import { spawn } from 'node:child_process';
import { openDatabase, assertPortFree } from '../server/boot.js';
import { loadConfig } from '../server/config.js';
import { databaseIsEmpty } from '../server/boot.js';
import { seedDemo } from '../seeders/demo.js';

const config = loadConfig();
await assertPortFree(config.PORT, config.HOST);
const db = await openDatabase(config);
if (config.SEED_DEMO && (await databaseIsEmpty())) await seedDemo(db.sequelize);
await db.sequelize.close();

// The API process reaches the database through DATABASE_URL, so it never starts a second server.
const env = { ...process.env, DATABASE_URL: config.DATABASE_URL ?? db.local!.url, ROWPATH_SKIP_CLIENT_BUILD: '1' };
const children = [
  spawn('node_modules/.bin/tsx', ['watch', '--clear-screen=false', 'server/index.ts'], { stdio: 'inherit', env }),
  spawn('node_modules/.bin/vite', ['--host', '127.0.0.1', '--port', String(process.env.VITE_PORT ?? 5173)], {
    stdio: 'inherit',
    env: { ...env, API_PORT: String(config.PORT) },
  }),
];
let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill('SIGTERM');
  await Promise.all(children.map((c) => new Promise((r) => (c.exitCode !== null ? r(null) : c.once('exit', r)))));
  await db.local?.stop();
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const c of children) c.once('exit', () => void stop());
