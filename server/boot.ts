import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import type { Sequelize } from 'sequelize';
import type { Config } from './config.js';
import { startLocalMariaDb, type LocalMariaDb } from './db/local-mariadb.js';
import { migrateUp } from './db/migrate.js';
import { initModels, User } from './db/models/index.js';
import { createSequelize } from './db/sequelize.js';

export interface Database {
  sequelize: Sequelize;
  /** The project-owned server, when DATABASE_URL is not set. */
  local: LocalMariaDb | null;
  describe: string;
  close(): Promise<void>;
}

function describeUrl(url: string) {
  const u = new URL(url);
  const socket = u.searchParams.get('socketPath');
  return `${u.hostname}:${u.port || 3306}/${u.pathname.slice(1)}${socket ? ` (through its socket ${socket})` : ''}`;
}

/** Starts (or reaches) MariaDB, checks the connection, registers models and migrates. */
export async function openDatabase(config: Config, log: (line: string) => void = console.log): Promise<Database> {
  let local: LocalMariaDb | null = null;
  let url = config.DATABASE_URL;
  if (!url) {
    local = await startLocalMariaDb({ baseDir: path.join(config.dataDir, 'mariadb'), port: config.DB_PORT, database: config.DB_NAME, log });
    url = local.url;
  }
  const where = describeUrl(url);
  const sequelize = createSequelize(url);
  try {
    await sequelize.authenticate();
  } catch (err) {
    await sequelize.close().catch(() => undefined);
    await local?.stop();
    throw new Error(`Cannot reach MariaDB at ${where}: ${(err as Error).message}`);
  }
  initModels(sequelize);
  await migrateUp(sequelize);
  return {
    sequelize,
    local,
    describe: where,
    async close() {
      await sequelize.close().catch(() => undefined);
      await local?.stop();
    },
  };
}

export async function databaseIsEmpty(): Promise<boolean> {
  return (await User.count()) === 0;
}

/** Fails fast, with a message, when the HTTP port is taken. */
export function assertPortFree(port: number, host: string): Promise<void> {
  return new Promise((resolve, reject) => {
    if (port === 0) return resolve();
    const probe = net.createServer();
    probe.once('error', (err: NodeJS.ErrnoException) =>
      reject(new Error(err.code === 'EADDRINUSE' ? `Port ${port} on ${host} is already in use. Stop the other program or set PORT to a free port.` : err.message)),
    );
    probe.once('listening', () => probe.close(() => resolve()));
    probe.listen(port, host);
  });
}

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');
/** Where the built client lives; CLIENT_DIST_DIR lets parallel browser-test runs build apart. */
export const clientDir = path.resolve(root, process.env.CLIENT_DIST_DIR ?? 'dist');

function newestMtime(entry: string): number {
  if (!fs.existsSync(entry)) return 0;
  const stat = fs.statSync(entry);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = 0;
  for (const name of fs.readdirSync(entry)) newest = Math.max(newest, newestMtime(path.join(entry, name)));
  return newest;
}

/** Builds the client with Vite when dist/ is missing or older than its sources. */
export function ensureClientBuilt(log: (line: string) => void = console.log) {
  const built = path.join(clientDir, 'index.html');
  const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package.json'].map((p) => newestMtime(path.join(root, p)));
  if (fs.existsSync(built) && fs.statSync(built).mtimeMs >= Math.max(...sources)) return;
  log('Building the client (Vite)…');
  const vite = path.join(root, 'node_modules', '.bin', 'vite');
  const result = spawnSync(vite, ['build', '--logLevel', 'warn', '--outDir', clientDir, '--emptyOutDir'], { cwd: root, stdio: 'inherit' });
  if (result.status !== 0) throw new Error('The client build failed; see the output above.');
}
