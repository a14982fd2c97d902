import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

import type { Reporter, TestModule, TestRunEndReason } from 'vitest/node';

/** One test file as it ran: wall-clock span in the worker, and where its time went (ms). */
export interface FileDuration {
  project: string;
  file: string;
  /** ms since the run started when the file was handed to a worker, and when its result came back. */
  startedAt: number;
  endedAt: number;
  /** Importing the file (and everything it imports) and running its describe callbacks. */
  collect: number;
  /** Setup files (test/setup/api-env.ts, web/src/testing/setup-tests.ts). */
  setup: number;
  /** jsdom / node environment. */
  environment: number;
  /** Tests and hooks (beforeAll: app bootstraps, browser launches). */
  tests: number;
  state: string;
}

export interface SuiteDurations {
  recordedAt: string;
  /** The whole `vitest run`, from the start of the run to its end (global set-up included), ms. */
  totalMs: number;
  /** How the run ended; `running` while it has not (the file is rewritten after every test file). */
  reason: TestRunEndReason | 'running';
  files: FileDuration[];
}

/**
 * Writes `.data/vitest-durations.json` at the end of a run (`npm test` adds this reporter): per file,
 * when it ran and how long it took to import, set up and run. `npm run bench -- test-suite` turns it
 * into a per-project table, so the slowest project and files can be seen. Unlike the JSON reporter's
 * per-test times this counts beforeAll hooks and imports, where most of an integration file's time goes.
 */
export default class SuiteDurationsReporter implements Reporter {
  private readonly started = Date.now();
  private readonly queuedAt = new Map<string, number>();
  private readonly endedAt = new Map<string, number>();

  // Vitest passes a reporter its options as the constructor argument: the file comes from the environment.
  private readonly outputFile = process.env.LOAMLINE_DURATIONS_FILE ?? '.data/vitest-durations.json';

  onTestModuleQueued(module: TestModule): void {
    this.queuedAt.set(module.id, Date.now() - this.started);
  }

  private readonly finished: TestModule[] = [];

  onTestModuleEnd(module: TestModule): void {
    this.endedAt.set(module.id, Date.now() - this.started);
    // Written after every file too, so a run that is stopped half-way still shows where its time went.
    this.finished.push(module);
    this.write(this.finished, 'running');
  }

  onTestRunEnd(modules: ReadonlyArray<TestModule>, _errors: unknown, reason: TestRunEndReason): void {
    this.write(modules, reason);
  }

  private write(modules: ReadonlyArray<TestModule>, reason: SuiteDurations['reason']): void {
    const endedAt = Date.now() - this.started;
    const files = modules.map((module): FileDuration => {
      const d = module.diagnostic();
      const busy = d.environmentSetupDuration + d.prepareDuration + d.collectDuration + d.setupDuration + d.duration;
      const startedAt = this.queuedAt.get(module.id) ?? Math.max(0, endedAt - busy);
      return {
        project: module.project.name,
        file: module.relativeModuleId,
        startedAt,
        endedAt: this.endedAt.get(module.id) ?? Math.round(startedAt + busy),
        collect: Math.round(d.collectDuration),
        setup: Math.round(d.setupDuration),
        environment: Math.round(d.environmentSetupDuration + d.prepareDuration),
        tests: Math.round(d.duration),
        state: module.state(),
      };
    });
    const result: SuiteDurations = { recordedAt: new Date().toISOString(), totalMs: endedAt, reason, files };
    mkdirSync(dirname(this.outputFile), { recursive: true });
    const temporary = `${this.outputFile}.${process.pid}.tmp`;
    writeFileSync(temporary, `${JSON.stringify(result, null, 2)}\n`);
    renameSync(temporary, this.outputFile);
  }
}
