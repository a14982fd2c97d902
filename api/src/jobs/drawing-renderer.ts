import { createHash } from 'node:crypto';

import { Injectable, Logger, type OnApplicationShutdown, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { WorkerPool } from '../common/worker-pool.js';
import { workerScriptUrl } from '../common/worker-script.js';
import type { Env } from '../config/env.schema.js';
import type { DrawingTask } from './drawing-task.js';

export interface RenderedDrawing {
  svg: string;
  /** A strong validator for the drawing's inputs (and so its bytes: drawings are deterministic). */
  etag: string;
  isCacheHit: boolean;
}

/** The ETag of a drawing: a hash of everything it is drawn from. Cheap next to drawing it. */
export function drawingEtag(task: DrawingTask, identity: Record<string, unknown>): string {
  const hash = createHash('sha256').update(JSON.stringify({ identity, task })).digest('base64url');
  return `"drawing-${hash.slice(0, 32)}"`;
}

/**
 * Makes drawings off the event loop and keeps the recent ones. Layout and serialisation run in a small
 * pool of worker threads (DRAWING_THREADS); each finished SVG is kept in memory under its ETag, up to
 * DRAWING_CACHE_MB, least recently used first out. Identical requests arriving together share one
 * render. The cache key covers the job (id, version, revision), the as-built it is drawn from (so a
 * change to the site's reference points shows even though it does not bump the job), the paper, units,
 * layers and the plan image.
 */
@Injectable()
export class DrawingRenderer implements OnModuleInit, OnApplicationShutdown {
  private readonly logger = new Logger(DrawingRenderer.name);
  private pool: WorkerPool<DrawingTask, string> | undefined;
  private readonly cache = new Map<string, string>();
  private cachedBytes = 0;
  private readonly inFlight = new Map<string, Promise<string>>();
  private readonly threads: number;
  private readonly threadsStart: 'at-start' | 'on-demand';
  private readonly maxCacheBytes: number;
  private hits = 0;
  private misses = 0;

  constructor(config: ConfigService<Env, true>) {
    this.threads = config.get('DRAWING_THREADS', { infer: true });
    this.threadsStart = config.get('DRAWING_THREADS_START', { infer: true });
    this.maxCacheBytes = config.get('DRAWING_CACHE_MB', { infer: true }) * 1024 * 1024;
  }

  async onModuleInit(): Promise<void> {
    const script = await workerScriptUrl(new URL('./drawing.worker.js', import.meta.url));
    // A schematic of the largest seeded job lays out in well under a second; 30 s means a runaway.
    this.pool = new WorkerPool<DrawingTask, string>(script, { threads: this.threads, taskTimeoutMs: 30_000, maxQueue: 1000, name: 'drawing pool', start: this.threadsStart === 'on-demand' ? 'on-demand' : 'at-once' });
  }

  async onApplicationShutdown(): Promise<void> {
    await this.pool?.close();
  }

  /** Counters for the bench and tests: renders saved by the cache, renders made. */
  get stats(): { hits: number; misses: number; entries: number; bytes: number } {
    return { hits: this.hits, misses: this.misses, entries: this.cache.size, bytes: this.cachedBytes };
  }

  /** True when a drawing with this ETag is kept (a 304 needs no render then). */
  has(etag: string): boolean {
    return this.cache.has(etag);
  }

  async render(task: DrawingTask, etag: string): Promise<RenderedDrawing> {
    const cached = this.cache.get(etag);
    if (cached !== undefined) {
      this.hits += 1;
      // Map order is insertion order: re-inserting marks the entry as the most recently used.
      this.cache.delete(etag);
      this.cache.set(etag, cached);
      return { svg: cached, etag, isCacheHit: true };
    }
    const running = this.inFlight.get(etag);
    if (running) {
      this.hits += 1;
      return { svg: await running, etag, isCacheHit: true };
    }
    this.misses += 1;
    if (!this.pool) throw new Error('the drawing pool is not started');
    const started = this.pool.run(task);
    this.inFlight.set(etag, started);
    try {
      const svg = await started;
      this.remember(etag, svg);
      return { svg, etag, isCacheHit: false };
    } finally {
      this.inFlight.delete(etag);
    }
  }

  private remember(etag: string, svg: string): void {
    const bytes = svg.length * 2;
    if (bytes > this.maxCacheBytes / 4) return;
    this.cache.set(etag, svg);
    this.cachedBytes += bytes;
    for (const [key, value] of this.cache) {
      if (this.cachedBytes <= this.maxCacheBytes) break;
      this.cache.delete(key);
      this.cachedBytes -= value.length * 2;
    }
    if (this.misses % 500 === 0) this.logger.log(`drawing cache: ${this.cache.size} drawings, ${this.hits} hits, ${this.misses} renders`);
  }
}
