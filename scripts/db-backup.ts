// `npm run db:backup`: a consistent dump of the configured database (mariadb-dump with
// --single-transaction, so the app keeps running; routines, triggers and binary columns as hex)
// into .data/backups/rowpath-<UTC timestamp>.sql.gz. The database is the one `npm start` uses:
// DATABASE_URL when set, otherwise the project-owned MariaDB under ROWPATH_DATA_DIR (started for
// the dump if it is not running, and stopped again afterwards).
//   npm run db:backup                 write a new backup, print its path
//   npm run db:backup -- --out DIR    write it into DIR instead
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { fileURLToPath } from 'node:url';
import zlib from 'node:zlib';
import { loadConfig, type Config } from '../server/config.js';
import { startLocalMariaDb, type LocalMariaDb } from '../server/db/local-mariadb.js';

export interface DbTarget {
  host: string;
  port: number;
  user: string;
  password: string;
  database: string;
}

export function targetFromUrl(url: string): DbTarget {
  const u = new URL(url);
  return {
    host: u.hostname === 'localhost' ? '127.0.0.1' : u.hostname,
    port: Number(u.port || 3306),
    user: decodeURIComponent(u.username),
    password: decodeURIComponent(u.password),
    database: decodeURIComponent(u.pathname.slice(1)),
  };
}

/**
 * The configured database, reached the way `npm start` reaches it. `release()` stops a
 * project-owned server only if this call started it.
 */
export async function configuredTarget(config: Config = loadConfig(), log: (line: string) => void = console.log): Promise<{ target: DbTarget; describe: string; release(): Promise<void> }> {
  if (config.DATABASE_URL) {
    const target = targetFromUrl(config.DATABASE_URL);
    return { target, describe: `${target.host}:${target.port}/${target.database}`, release: async () => undefined };
  }
  const local: LocalMariaDb = await startLocalMariaDb({ baseDir: path.join(config.dataDir, 'mariadb'), port: config.DB_PORT, database: config.DB_NAME, log });
  return { target: targetFromUrl(local.url), describe: `127.0.0.1:${local.port}/${local.database} (project-owned)`, release: () => local.stop() };
}

/**
 * A client option file readable by this user only, so that the password is never on a command
 * line (where `ps` shows it to everyone). Removed by the returned function.
 */
export function optionFile(target: DbTarget): { file: string; remove(): void } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'rowpath-db-'));
  const file = path.join(dir, 'client.cnf');
  const quote = (v: string) => `"${v.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;
  fs.writeFileSync(file, `[client]\nhost=${target.host}\nport=${target.port}\nuser=${quote(target.user)}\npassword=${quote(target.password)}\nprotocol=TCP\n`, { mode: 0o600 });
  return { file, remove: () => fs.rmSync(dir, { recursive: true, force: true }) };
}

export function findTool(...names: string[]): string {
  for (const name of names) {
    for (const dir of [...(process.env.PATH ?? '').split(':'), '/usr/bin', '/usr/local/bin']) {
      const candidate = path.join(dir, name);
      if (dir && fs.existsSync(candidate)) return candidate;
    }
  }
  throw new Error(`${names[0]} is not installed (Debian: apt-get install -y mariadb-client).`);
}

/** rowpath-20261201T031500Z.sql.gz — sorts by time, no characters a shell or Windows dislikes. */
export function backupName(now = new Date()): string {
  return `rowpath-${now.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}Z$/, 'Z')}.sql.gz`;
}

/** Dumps `target` into `file` (gzip). Written beside it first and renamed, so a failed dump leaves no file that looks complete. */
export async function dumpDatabase(target: DbTarget, file: string): Promise<{ file: string; bytes: number }> {
  const dump = findTool('mariadb-dump', 'mysqldump');
  const options = optionFile(target);
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const partial = `${file}.partial`;
  try {
    const child = spawn(
      dump,
      [
        `--defaults-file=${options.file}`,
        '--single-transaction', // one consistent snapshot of InnoDB tables; writers are not blocked
        '--routines',
        '--triggers',
        '--hex-blob',
        '--default-character-set=utf8mb4',
        '--skip-dump-date', // identical data gives identical files
        // The name alone (no --databases): the dump carries no USE, so it restores into any database.
        target.database,
      ],
      { stdio: ['ignore', 'pipe', 'pipe'] },
    );
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    const exited = new Promise<number | null>((resolve, reject) => {
      child.once('error', reject);
      child.once('close', resolve);
    });
    await pipeline(child.stdout, zlib.createGzip({ level: 6 }), fs.createWriteStream(partial, { mode: 0o600 }));
    const code = await exited;
    if (code !== 0) throw new Error(`mariadb-dump failed (exit ${code}): ${stderr.trim()}`);
    fs.renameSync(partial, file);
    return { file, bytes: fs.statSync(file).size };
  } catch (err) {
    fs.rmSync(partial, { force: true });
    throw err;
  } finally {
    options.remove();
  }
}

async function main() {
  const config = loadConfig();
  const outIndex = process.argv.indexOf('--out');
  const dir = path.resolve(outIndex > 0 ? process.argv[outIndex + 1] : path.join(config.dataDir, 'backups'));
  const db = await configuredTarget(config);
  try {
    const started = Date.now();
    const { file, bytes } = await dumpDatabase(db.target, path.join(dir, backupName()));
    console.log(`Backed up ${db.describe} to ${path.relative(process.cwd(), file) || file} (${(bytes / 1024).toFixed(1)} kB gzip, ${((Date.now() - started) / 1000).toFixed(1)} s).`);
  } finally {
    await db.release();
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err) => {
    console.error(`Backup failed: ${(err as Error).message}`);
    process.exit(1);
  });
}
