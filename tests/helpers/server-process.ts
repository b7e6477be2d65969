// Runs the real `npm start` entry point as a child process, for browser and restart tests.
import { spawn, type ChildProcess } from 'node:child_process';

export interface RunningServer {
  child: ChildProcess;
  url: string;
  output: () => string;
  stop: () => Promise<{ code: number | null; output: string }>;
}

export function startServer(env: Record<string, string>, timeoutMs = 240_000): Promise<RunningServer> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env: { ...process.env, ...env } });
    let output = '';
    const onData = (d: Buffer) => {
      output += d.toString();
      const match = output.match(/Rowpath is running on (http:\/\/\S+)/);
      if (match && !settled) {
        settled = true;
        clearTimeout(timer);
        resolve({ child, url: match[1], output: () => output, stop: () => stopServer(child, () => output) });
      }
    };
    let settled = false;
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.on('exit', (code) => {
      if (!settled) {
        settled = true;
        reject(new Error(`server exited with ${code} before it was ready:\n${output}`));
      }
    });
    const timer = setTimeout(() => {
      if (settled) return;
      settled = true;
      child.kill('SIGKILL');
      reject(new Error(`server not ready after ${timeoutMs} ms:\n${output}`));
    }, timeoutMs);
  });
}

function stopServer(child: ChildProcess, output: () => string): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve) => {
    if (child.exitCode !== null) return resolve({ code: child.exitCode, output: output() });
    child.once('exit', (code) => resolve({ code, output: output() }));
    child.kill('SIGTERM');
  });
}
