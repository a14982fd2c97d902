import { type ChildProcess, spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import { join } from 'node:path';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { root } from '../../../scripts/lib/setup.mjs';

export const ROOT: string = root;

/** A TCP port that was free a moment ago (taken from the OS, then released). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** A spawned Node process with its output kept (for waiting on a log line and for failure messages). */
export class Spawned {
  readonly output: string[] = [];
  private readonly exited: Promise<number | null>;

  constructor(
    readonly name: string,
    readonly child: ChildProcess,
  ) {
    const keep = (chunk: Buffer) => {
      this.output.push(chunk.toString());
      if (this.output.length > 400) this.output.splice(0, this.output.length - 400);
    };
    child.stdout?.on('data', keep);
    child.stderr?.on('data', keep);
    this.exited = new Promise((resolve) => child.once('exit', (code) => resolve(code)));
  }

  get isRunning(): boolean {
    return this.child.exitCode === null && this.child.signalCode === null;
  }

  tail(lines = 30): string {
    return this.output.join('').split('\n').slice(-lines).join('\n');
  }

  /** Resolves when `pattern` appears in the output; rejects if the process exits or time runs out. */
  async waitForOutput(pattern: RegExp, timeoutMs = 60_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    while (!pattern.test(this.output.join(''))) {
      if (!this.isRunning) throw new Error(`${this.name} exited (${this.child.exitCode ?? this.child.signalCode}) before ${pattern}:\n${this.tail()}`);
      if (Date.now() > deadline) throw new Error(`${this.name} did not print ${pattern} within ${timeoutMs} ms:\n${this.tail()}`);
      await sleep(100);
    }
  }

  /** SIGTERM (graceful), then SIGKILL if it has not exited after `graceMs`. */
  async stop(graceMs = 15_000): Promise<void> {
    if (!this.isRunning) return;
    this.child.kill('SIGTERM');
    const timer = setTimeout(() => this.child.kill('SIGKILL'), graceMs);
    await this.exited;
    clearTimeout(timer);
  }

  /** SIGKILL: the process ends at once, with no shutdown hook run (a crash, an OOM kill, a pulled plug). */
  async kill(): Promise<void> {
    if (!this.isRunning) return;
    this.child.kill('SIGKILL');
    await this.exited;
  }
}

/** What every spawned API or worker gets: quiet text logs, no SMTP port taken, a fresh secret. */
function baseEnv(databaseUrl: string, env: Record<string, string>): NodeJS.ProcessEnv {
  return {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    JWT_ACCESS_SECRET: randomBytes(32).toString('hex'),
    LOCAL_SMTP_PORT: '0',
    LOG_FORMAT: 'text',
    LOG_LEVEL: 'warn',
    ...env,
  };
}

export interface RunningApi {
  baseUrl: string;
  process: Spawned;
}

/**
 * Starts the built API (api/dist/main.js, as `npm start` runs it) on a free loopback port against
 * `databaseUrl` and waits until it listens (health answers at all: 200, or 503 with the database down).
 */
export async function startApi(databaseUrl: string, env: Record<string, string> = {}): Promise<RunningApi> {
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, [join(ROOT, 'api/dist/main.js')], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: baseEnv(databaseUrl, { PORT: String(port), HOST: '127.0.0.1', ...env }),
  });
  const api = new Spawned('the API', child);
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (!api.isRunning) throw new Error(`the API exited with ${child.exitCode}:\n${api.tail()}`);
    try {
      await fetch(`${baseUrl}/api/health`);
      break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      await api.kill();
      throw new Error(`the API did not listen within 60 s:\n${api.tail()}`);
    }
    await sleep(150);
  }
  return { baseUrl, process: api };
}

/**
 * Starts `npm run worker` (scripts/worker.mjs: a standalone packet render worker) against
 * `databaseUrl` and waits for it to report that it polls the queue. The worker logs at Nest's default
 * level, which includes that line.
 */
export async function startWorker(databaseUrl: string, env: Record<string, string> = {}): Promise<Spawned> {
  const child = spawn(process.execPath, [join(ROOT, 'scripts/worker.mjs')], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: baseEnv(databaseUrl, env),
  });
  const worker = new Spawned('the worker', child);
  try {
    await worker.waitForOutput(/packet render worker started/, 90_000);
  } catch (error) {
    await worker.kill();
    throw error;
  }
  return worker;
}

/** Signs in over HTTP and returns the access token. */
export async function signInOverHttp(baseUrl: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}
