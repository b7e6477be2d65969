// `npm run db:restore [file]`: loads a backup made by `npm run db:backup` into the configured
// database (DATABASE_URL, or the project-owned MariaDB), replacing what is there: every table is
// dropped first, so the result is exactly the backup. Stop the app before restoring.
//   npm run db:restore                                   the newest file in .data/backups
//   npm run db:restore -- .data/backups/rowpath-….sql.gz  that file
// On a terminal it asks before replacing the data; --yes skips the question.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import readline from 'node:readline/promises';
import { pipeline } from 'node:stream/promises';
import { fileURLToPath } from 'node:url';
import zlib from 'node:zlib';
import { loadConfig } from '../server/config.js';
import { configuredTarget, findTool, optionFile, type DbTarget } from './db-backup.js';

/** The newest rowpath-*.sql.gz in `dir` (names sort by their UTC timestamp). */
export function newestBackup(dir: string): string | null {
  if (!fs.existsSync(dir)) return null;
  const files = fs.readdirSync(dir).filter((f) => /^rowpath-\d{8}T\d{6}Z\.sql\.gz$/.test(f)).sort();
  return files.length ? path.join(dir, files[files.length - 1]) : null;
}

function runSql(client: string, optionsFile: string, database: string, input: NodeJS.ReadableStream | string): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(client, [`--defaults-file=${optionsFile}`, '--default-character-set=utf8mb4', '--binary-mode', database], { stdio: ['pipe', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.once('error', reject);
    child.once('close', (code) => (code === 0 ? resolve() : reject(new Error(`mariadb refused the restore (exit ${code}): ${stderr.trim().slice(0, 2000)}`))));
    if (typeof input === 'string') child.stdin.end(input);
    else pipeline(input, child.stdin).catch(reject);
  });
}

/** Replaces every table of `target` with the contents of the gzip dump `file`. */
export async function restoreDatabase(target: DbTarget, file: string): Promise<void> {
  if (!fs.existsSync(file)) throw new Error(`No backup at ${file}.`);
  const client = findTool('mariadb', 'mysql');
  const options = optionFile(target);
  try {
    // Drop what is there (tables made by later migrations included), then load the dump.
    const listing = await new Promise<string>((resolve, reject) => {
      const child = spawn(client, [`--defaults-file=${options.file}`, '--batch', '--skip-column-names', target.database, '-e', 'SHOW FULL TABLES'], { stdio: ['ignore', 'pipe', 'pipe'] });
      let out = '';
      let err = '';
      child.stdout.on('data', (d: Buffer) => (out += d.toString()));
      child.stderr.on('data', (d: Buffer) => (err += d.toString()));
      child.once('error', reject);
      child.once('close', (code) => (code === 0 ? resolve(out) : reject(new Error(`Cannot list the tables of ${target.database}: ${err.trim()}`))));
    });
    const rows = listing.split('\n').filter(Boolean).map((line) => line.split('\t'));
    const quote = (name: string) => `\`${name.replace(/`/g, '``')}\``;
    const views = rows.filter(([, type]) => type === 'VIEW').map(([name]) => quote(name));
    const tables = rows.filter(([, type]) => type !== 'VIEW').map(([name]) => quote(name));
    const drop = ['SET FOREIGN_KEY_CHECKS=0;', views.length ? `DROP VIEW IF EXISTS ${views.join(', ')};` : '', tables.length ? `DROP TABLE IF EXISTS ${tables.join(', ')};` : ''].join('\n');
    await runSql(client, options.file, target.database, drop);
    await runSql(client, options.file, target.database, fs.createReadStream(file).pipe(zlib.createGunzip()));
  } finally {
    options.remove();
  }
}

async function main() {
  const config = loadConfig();
  const args = process.argv.slice(2).filter((a) => a !== '--yes');
  const file = path.resolve(args[0] ?? newestBackup(path.join(config.dataDir, 'backups')) ?? '');
  if (!args[0] && !fs.existsSync(file)) throw new Error(`No backups in ${path.join(config.dataDir, 'backups')}. Make one with npm run db:backup.`);
  if (!fs.existsSync(file)) throw new Error(`No backup at ${file}.`);
  const db = await configuredTarget(config);
  try {
    if (process.stdin.isTTY && !process.argv.includes('--yes')) {
      const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
      const answer = await rl.question(`Replace every table in ${db.describe} with ${path.basename(file)}? Type "yes": `);
      rl.close();
      if (answer.trim().toLowerCase() !== 'yes') {
        console.log('Nothing restored.');
        return;
      }
    }
    const started = Date.now();
    await restoreDatabase(db.target, file);
    console.log(`Restored ${path.relative(process.cwd(), file) || file} into ${db.describe} (${((Date.now() - started) / 1000).toFixed(1)} s).`);
  } finally {
    await db.release();
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err) => {
    console.error(`Restore failed: ${(err as Error).message}`);
    process.exit(1);
  });
}
