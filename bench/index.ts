// `npm run bench`: every benchmark in one run, each in a child process of its own (so one's
// database, timers and memory never skew the next), then one summary of the figures.
//   npm run bench                         all of them (about 10 minutes on 2 cores)
//   npm run bench -- --only load,web-vitals
//   npm run bench -- --skip reminders
//   npm run bench -- --all-routes         api-latency measures every GET route, not the main ones
// Scripts that are not in the tree yet are skipped with a note. The figures depend on the machine
// and on what else runs on it: the summary prints the load average beside them.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

interface Script {
  name: string;
  file: string;
  args?: string[];
  what: string;
}

const SCRIPTS: Script[] = [
  { name: 'routes', file: 'bench/routes.ts', what: "route optimiser's gap on the TSPLIB files; week plan time" },
  { name: 'planner', file: 'bench/planner.ts', what: "roadmap planner's time" },
  { name: 'fleet-lists', file: 'bench/fleet-lists.ts', what: 'accounts and planters lists on the large data set' },
  { name: 'forecast', file: 'bench/forecast.ts', what: 'forecast endpoint on the large data set' },
  { name: 'reminders', file: 'bench/reminders.ts', what: '5,000 reminders enqueued and delivered' },
  { name: 'week-plan', file: 'bench/week-plan.ts', what: 'POST /api/week-plans end to end' },
  { name: 'api-latency', file: 'bench/api-latency.ts', args: ['--main'], what: 'main API routes beside a bare route, large data set' },
  { name: 'web-vitals', file: 'bench/web-vitals.ts', what: 'JS size and LCP of sign-in and home, 4× CPU slowdown' },
  { name: 'load', file: 'bench/load.ts', what: '50 connections × 60 s mixed; MariaDB stopped mid-run' },
];

// Lines of the other scripts worth repeating in the summary (their verdicts and headline figures).
const KEY_LINE = /average gap|median .* ms|target|PASS|FAIL|MISSED|\bmet\b|meets|MISSES|received:|seconds:/i;

function listArg(name: string): string[] | null {
  const i = process.argv.indexOf(name);
  return i > 0 && process.argv[i + 1] ? process.argv[i + 1].split(',').map((s) => s.trim()) : null;
}

interface Outcome {
  script: Script;
  status: 'ok' | 'failed' | 'skipped';
  seconds: number;
  output: string;
  note?: string;
  summary?: Record<string, any>;
}

function runScript(script: Script): Promise<Outcome> {
  const started = Date.now();
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script.file, ...(script.args ?? [])], { cwd: root, env: { ...process.env, NO_COLOR: '1' }, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    const tee = (stream: NodeJS.WriteStream) => (d: Buffer) => {
      output += d.toString();
      stream.write(d);
    };
    child.stdout.on('data', tee(process.stdout));
    child.stderr.on('data', tee(process.stderr));
    child.once('close', (code) => {
      const line = output.split('\n').find((l) => l.startsWith('BENCH-SUMMARY '));
      let summary: Record<string, unknown> | undefined;
      try {
        summary = line ? JSON.parse(line.slice('BENCH-SUMMARY '.length)) : undefined;
      } catch {
        summary = undefined;
      }
      resolve({ script, status: code === 0 ? 'ok' : 'failed', seconds: (Date.now() - started) / 1000, output, summary, note: code === 0 ? undefined : `exit ${code}` });
    });
  });
}

const f1 = (x: number) => (Number.isFinite(x) ? x.toFixed(1) : '—');
const f0 = (x: number) => (Number.isFinite(x) ? x.toFixed(0) : '—');

function describe(o: Outcome): string[] {
  const s = o.summary;
  if (o.status !== 'ok' || !s) {
    const lines = o.output.split('\n').filter((l) => KEY_LINE.test(l) && !l.startsWith('BENCH-SUMMARY')).slice(-8);
    return lines.length ? lines.map((l) => l.trim()) : o.status === 'failed' ? o.output.trim().split('\n').slice(-4) : ['(no headline lines printed)'];
  }
  switch (s.script) {
    case 'api-latency':
      return [
        `bare route: p50 ${f1(s.bareP50Ms)} ms, p95 ${f1(s.bareP95Ms)} ms`,
        ...s.main.map((r: any) => `${r.route.padEnd(30)} p50 ${f1(r.p50Ms).padStart(7)} ms  p95 ${f1(r.p95Ms).padStart(7)} ms  p95 ÷ bare ${f1(r.ratioP95)}`),
        ...(s.failingRoutes.length ? [`non-2xx answers on: ${s.failingRoutes.join(', ')}`] : []),
      ];
    case 'web-vitals':
      return [
        `JS gzip: sign-in ${f1(s.signInJsGzipKb)} kB, home ${f1(s.homeJsGzipKb)} kB; LCP (4× CPU): sign-in ${f0(s.signInLcpMs)} ms, home ${f0(s.homeLcpMs)} ms`,
        ...Object.entries(s.budgets as Record<string, boolean>).map(([b, met]) => `${b}: ${met ? 'met' : 'MISSED'}`),
      ];
    case 'load': {
      const out: string[] = [];
      if (s.steady) {
        const st = s.steady;
        out.push(`steady: ${st.requests} requests, ${f0(st.reqPerSec)} req/s, p50 ${f0(st.p50Ms)} ms, p95 ${f0(st.p95Ms)} ms, non-2xx ${st.non2xx}, errors ${st.errors} — zero errors ${st.zeroErrors ? 'met' : 'MISSED'}`);
        out.push(`memory: heap after GC ${st.heapMb[0]} → ${st.heapMb[st.heapMb.length - 1]} MB, growth after warm-up ${f1(st.growthPct)} % (${f1(st.slopeMbPerMin)} MB/min) — ${st.noGrowth ? 'met' : 'MISSED'}`);
      }
      if (s.fault) {
        const fa = s.fault;
        out.push(`fault: 503 × ${fa.gap['503'] ?? 0} during the ${f1(fa.restartedAtS - fa.stoppedAtS)} s outage, first success ${f1(fa.recoveredS)} s after restart, other 5xx ${fa.fiveHundreds}`);
        out.push(`writes: ${fa.created} answered 201, ${fa.planters} in the database, partial ${fa.partial} — ${fa.ok ? 'met' : 'MISSED'}`);
      }
      return out;
    }
    default:
      return [JSON.stringify(s)];
  }
}

async function main() {
  const only = listArg('--only');
  const skip = listArg('--skip') ?? [];
  const chosen = SCRIPTS.filter((s) => (!only || only.includes(s.name)) && !skip.includes(s.name)).map((s) =>
    s.name === 'api-latency' && process.argv.includes('--all-routes') ? { ...s, args: [] } : s,
  );
  const started = new Date();
  const outcomes: Outcome[] = [];
  for (const script of chosen) {
    if (!fs.existsSync(path.join(root, script.file))) {
      outcomes.push({ script, status: 'skipped', seconds: 0, output: '', note: `${script.file} is not in the tree yet` });
      continue;
    }
    console.log(`\n━━━━ ${script.name}: ${script.what} (${script.file}) ━━━━`);
    outcomes.push(await runScript(script));
  }
  console.log(`\n════════ Rowpath benchmarks, ${started.toISOString()} — ${os.cpus().length} cores, load average ${os.loadavg().map((l) => l.toFixed(1)).join(' / ')} ════════`);
  for (const o of outcomes) {
    console.log(`\n${o.script.name} — ${o.status}${o.note ? ` (${o.note})` : ''}${o.status === 'skipped' ? '' : `, ${f0(o.seconds)} s`}: ${o.script.what}`);
    if (o.status !== 'skipped') for (const line of describe(o)) console.log(`  ${line}`);
  }
  const failed = outcomes.filter((o) => o.status === 'failed');
  if (failed.length) {
    console.log(`\n${failed.length} benchmark(s) did not finish: ${failed.map((o) => o.script.name).join(', ')}`);
    process.exit(1);
  }
}

await main();
