// `npm test`: makes sure MariaDB and Chromium are present (installing Debian's packages as root
// when missing), runs every Vitest project, and ends with one plain line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ensureMariaDbInstalled } from '../server/db/local-mariadb.js';
import { ensureChromium } from '../tests/helpers/chromium.js';

ensureMariaDbInstalled();
ensureChromium();

const outFile = path.resolve('test-results/vitest.json');
fs.mkdirSync(path.dirname(outFile), { recursive: true });
fs.rmSync(outFile, { force: true });
const vitest = path.resolve('node_modules/.bin/vitest');
const args = ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${outFile}`, ...process.argv.slice(2)];
const result = spawnSync(vitest, args, { stdio: 'inherit', env: { ...process.env, NO_COLOR: '1', FORCE_COLOR: '0' } });

let passed = 0;
let failed = 0;
if (fs.existsSync(outFile)) {
  const report = JSON.parse(fs.readFileSync(outFile, 'utf8')) as { numPassedTests: number; numFailedTests: number; numTotalTestSuites: number; numFailedTestSuites: number };
  passed = report.numPassedTests;
  // A file that fails to load has no failed test but is a failure all the same.
  failed = report.numFailedTests + (report.numFailedTests === 0 && result.status !== 0 ? 1 : 0);
} else if (result.status !== 0) {
  failed = 1;
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(result.status === 0 && failed === 0 ? 0 : 1);
