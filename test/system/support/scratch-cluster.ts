import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { asPostgresUser, findPgBin, pgCommandOptions } from '../../../scripts/lib/setup.mjs';
import { freePort } from './processes.js';

const isRoot = process.getuid?.() === 0;

/**
 * A throwaway PostgreSQL cluster in a temporary folder on its own loopback port, for tests that stop
 * the database under a running API. The shared cluster (LOAMLINE_PG_PORT) is never touched. Trust
 * authentication on 127.0.0.1 only; `destroy()` stops it and deletes the folder.
 */
export class ScratchCluster {
  private constructor(
    private readonly pgBin: string,
    private readonly dir: string,
    readonly port: number,
  ) {}

  static async create(): Promise<ScratchCluster> {
    const pgBin: string | undefined = findPgBin();
    if (!pgBin) throw new Error('PostgreSQL server binaries not found (Debian package postgresql).');
    const dir = mkdtempSync(join(tmpdir(), 'loamline-scratch-pg-'));
    // PostgreSQL refuses to run as root: the cluster belongs to the unprivileged `postgres` user.
    if (isRoot) execFileSync('chown', ['postgres:postgres', dir]);
    chmodSync(dir, 0o700);
    const cluster = new ScratchCluster(pgBin, dir, await freePort());
    cluster.pg('initdb', ['-D', dir, '-U', 'postgres', '-A', 'trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    cluster.start();
    return cluster;
  }

  /** postgres:// URL of `database` on this cluster. */
  url(database = 'postgres'): string {
    return `postgres://postgres@127.0.0.1:${this.port}/${database}`;
  }

  start(): void {
    this.pg('pg_ctl', [
      '-D', this.dir, '-l', join(this.dir, 'server.log'), '-w', '-t', '60',
      '-o', `-c listen_addresses=127.0.0.1 -p ${this.port} -k ${this.dir} -c fsync=off`, 'start',
    ]);
  }

  /** Fast shutdown: open sessions are ended at once, as when the database host restarts. */
  stop(): void {
    this.pg('pg_ctl', ['-D', this.dir, '-m', 'fast', '-w', '-t', '60', 'stop']);
  }

  isRunning(): boolean {
    const [cmd, args] = asPostgresUser(join(this.pgBin, 'pg_ctl'), ['status', '-D', this.dir]) as [string, string[]];
    return spawnSync(cmd, args, { ...pgCommandOptions, stdio: 'ignore' }).status === 0;
  }

  /** Stops the server if it runs and deletes the cluster's folder; safe to call more than once. */
  destroy(): void {
    if (this.isRunning()) {
      const [cmd, args] = asPostgresUser(join(this.pgBin, 'pg_ctl'), ['-D', this.dir, '-m', 'immediate', '-w', 'stop']) as [string, string[]];
      spawnSync(cmd, args, { ...pgCommandOptions, stdio: 'ignore' });
    }
    rmSync(this.dir, { recursive: true, force: true });
  }

  private pg(binary: string, args: string[]): void {
    const [cmd, fullArgs] = asPostgresUser(join(this.pgBin, binary), args) as [string, string[]];
    const result = spawnSync(cmd, fullArgs, { ...pgCommandOptions, encoding: 'utf8' });
    if (result.status !== 0) throw new Error(`${binary} ${args.join(' ')} failed (${result.status}):\n${result.stderr}${result.stdout}`);
  }
}
