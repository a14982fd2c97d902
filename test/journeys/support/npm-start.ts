import { type ChildProcess, spawn } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { root } from '../../../scripts/lib/setup.mjs';

/** A TCP port nobody listens on right now (on loopback). */
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

export interface StartedApp {
  baseUrl: string;
  /** Everything `npm start` printed so far (stdout and stderr). */
  output: () => string;
  /** SIGTERM to the start script (it stops the server, then its PostgreSQL cluster), then removes the data folder. */
  stop: () => Promise<void>;
}

/**
 * Runs `scripts/start.mjs` — what `npm start` runs — as a first start on a fresh machine: its own data
 * folder (so a new PostgreSQL cluster is initialised and started on its own port, and new secrets are
 * generated), NODE_ENV left for the script to set (production), no SMTP_URL, no demo company. Only the
 * builds are shared with the checkout (rebuilt by the script if the sources changed). Resolves once the
 * script says the app is ready.
 */
export async function npmStart({ readyTimeoutMs = 600_000 } = {}): Promise<StartedApp> {
  const dataDir = mkdtempSync(join(tmpdir(), 'loamline-journey-'));
  // The cluster belongs to the `postgres` user when running as root: it must be able to reach the folder.
  chmodSync(dataDir, 0o755);
  const [port, pgPort] = [await freePort(), await freePort()];
  const env: NodeJS.ProcessEnv = { ...process.env };
  // What the test runner or this machine's shell set that a user's `npm start` would not have.
  for (const name of Object.keys(env)) {
    if (name.startsWith('VITEST') || name.startsWith('LOAMLINE_TEST')) delete env[name];
  }
  for (const name of ['NODE_ENV', 'DATABASE_URL', 'SMTP_URL', 'JWT_ACCESS_SECRET', 'LOCAL_SMTP_PORT', 'SIGNUP_MODE', 'APP_URL', 'WEB_DIST_DIR', 'LOAMLINE_BUILDS_READY']) {
    delete env[name];
  }
  Object.assign(env, {
    PORT: String(port),
    HOST: '127.0.0.1',
    LOAMLINE_DATA_DIR: dataDir,
    LOAMLINE_PG_PORT: String(pgPort),
    LOAMLINE_SEED_DEMO: '0',
  });

  const child: ChildProcess = spawn(process.execPath, [join(root, 'scripts/start.mjs')], {
    cwd: root,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));

  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      const late = setTimeout(() => child.kill('SIGKILL'), 120_000);
      await exited;
      clearTimeout(late);
    }
    rmSync(dataDir, { recursive: true, force: true });
  };

  const deadline = Date.now() + readyTimeoutMs;
  for (;;) {
    const ready = output.match(/Loamline is ready at (http:\/\/\S+)/);
    if (ready && /Press Ctrl-C to stop\./.test(output)) return { baseUrl: ready[1]!, output: () => output, stop };
    if (child.exitCode !== null || Date.now() > deadline) {
      const why = child.exitCode !== null ? `exited with ${child.exitCode}` : `was not ready within ${readyTimeoutMs / 1000} s`;
      await stop();
      throw new Error(`npm start ${why}:\n${output.slice(-4000)}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}
