/**
 * Where every benchmark leaves its figures: bench/results.json (git-ignored), one entry per bench name,
 * replaced by each run of that bench and kept otherwise, so `npm run bench` can print one summary
 * table and two runs (two machines, two commits) can be compared file to file.
 */
import { existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { cpus } from 'node:os';
import { join } from 'node:path';

export interface BenchFigure {
  /** What was measured, in words (e.g. "full analysis, median"). */
  label: string;
  value: number;
  /** ms, s, MB, KB, photos/s, req/s, ×, … */
  unit: string;
  /** The goal as text (e.g. "< 20 ms"), when the figure has one. */
  goal?: string;
  /** Whether the goal was met, when it has one. */
  isMet?: boolean;
}

export interface BenchEntry {
  recordedAt: string;
  node: string;
  cpu: string;
  figures: BenchFigure[];
}

export interface BenchResults {
  benches: Record<string, BenchEntry>;
}

export const RESULTS_FILE = join(import.meta.dirname, 'results.json');

export function readResults(): BenchResults {
  if (!existsSync(RESULTS_FILE)) return { benches: {} };
  try {
    const parsed = JSON.parse(readFileSync(RESULTS_FILE, 'utf8')) as Partial<BenchResults>;
    return { benches: parsed.benches ?? {} };
  } catch {
    // A hand-edited or truncated file is not worth failing a benchmark over: start again.
    return { benches: {} };
  }
}

/** Records `figures` as the latest of `bench`, merged into bench/results.json (written atomically). */
export function recordResults(bench: string, figures: BenchFigure[]): void {
  const results = readResults();
  results.benches[bench] = {
    recordedAt: new Date().toISOString(),
    node: process.version,
    cpu: `${cpus().length} × ${cpus()[0]?.model.trim() ?? 'unknown'}`,
    figures: figures.map((f) => ({ ...f, value: Number(f.value.toPrecision(6)) })),
  };
  const sorted: BenchResults = { benches: Object.fromEntries(Object.entries(results.benches).sort(([a], [b]) => a.localeCompare(b))) };
  const temporary = `${RESULTS_FILE}.${process.pid}.tmp`;
  writeFileSync(temporary, `${JSON.stringify(sorted, null, 2)}\n`);
  renameSync(temporary, RESULTS_FILE);
}
