import { Injectable } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { ConcurrencyLimiter } from '../common/concurrency-limiter.js';
import { NotFoundError } from '../domain/errors.js';
import type { DrawingQuery, SitePlanDrawingQuery } from '../domain/jobs/job-drawings.schema.js';
import type { JobAsBuiltResponse } from '../domain/jobs/job.schema.js';
import { jobTitleBlock } from '../drawings/job-drawings.js';
import { SitePlanImagesService } from '../sites/site-plan-images.service.js';
import { DrawingRenderer, drawingEtag, type RenderedDrawing } from './drawing-renderer.js';
import type { DrawingTask } from './drawing-task.js';
import { JobsService } from './jobs.service.js';

/** What a load yields: the drawing to make and its ETag. */
interface Loaded {
  task: DrawingTask;
  etag: string;
}

/** A drawing answer: the SVG, or only its ETag when the client already holds that version. */
export type DrawingAnswer = { etag: string; isNotModified: true } | ({ isNotModified: false } & RenderedDrawing);

/** Drawing requests that load their job from the database at once (the rest wait their turn). */
export const DRAWING_LOADS_AT_ONCE = 3;

/**
 * The drawings of a job's current as-built as standalone SVG files, drawn exactly as the packet and the
 * web app draw them (drawings/job-drawings.ts). Read access is that of the job itself.
 *
 * Drawing requests load their job with at most DRAWING_LOADS_AT_ONCE at a time (the rest wait their
 * turn here, not in the database pool, so 200 drawings at once leave connections for everyone else).
 * A request identical to one still waiting for its turn (same user, job, drawing and query) shares that
 * load: it starts after both arrived, so neither misses a write made before it asked. The layout and
 * drawing run in DrawingRenderer's worker threads, and a repeated request is answered from its cache,
 * or with 304 when `If-None-Match` names the current ETag.
 */
@Injectable()
export class JobDrawingsService {
  private readonly loads = new ConcurrencyLimiter({ concurrency: DRAWING_LOADS_AT_ONCE, maxQueue: 2000, maxWaitMs: 60_000, name: 'drawing requests' });
  /** Loads queued but not started, by request key; a load leaves this map when it starts. */
  private readonly queuedLoads = new Map<string, Promise<Loaded>>();

  constructor(
    private readonly jobs: JobsService,
    private readonly planImages: SitePlanImagesService,
    private readonly renderer: DrawingRenderer,
  ) {}

  private base(data: JobAsBuiltResponse, query: DrawingQuery): Pick<DrawingTask, 'asBuilt' | 'analysis' | 'units'> {
    return { asBuilt: data.asBuilt, analysis: data.analysis, units: query.units ?? data.asBuilt.units?.length ?? 'metric' };
  }

  /** Loads once for every identical request that arrives while this one waits for its turn. */
  private load(actor: AuthUser, key: string, work: () => Promise<{ data: JobAsBuiltResponse; task: DrawingTask }>): Promise<Loaded> {
    const fullKey = `${actor.id}:${actor.role}:${key}`;
    const queued = this.queuedLoads.get(fullKey);
    if (queued) return queued;
    const loading = this.loads.run(async () => {
      if (this.queuedLoads.get(fullKey) === loading) this.queuedLoads.delete(fullKey);
      const { data, task } = await work();
      // Hashed once per load, not once per request sharing it.
      return { task, etag: drawingEtag(task, { jobId: data.job.id, version: data.job.version, revision: data.job.revision }) };
    });
    this.queuedLoads.set(fullKey, loading);
    // A load refused in the queue (busy) must not stay behind for later requests.
    loading.catch(() => {
      if (this.queuedLoads.get(fullKey) === loading) this.queuedLoads.delete(fullKey);
    });
    return loading;
  }

  async sitePlan(actor: AuthUser, jobId: string, query: SitePlanDrawingQuery, ifNoneMatch: string | undefined): Promise<DrawingAnswer> {
    const key = JSON.stringify(['site-plan', jobId, query.units ?? null, query.paper ?? null, query.layers ?? []]);
    const loaded = await this.load(actor, key, async () => {
      const data = await this.jobs.asBuilt(actor, jobId);
      const [planImage, locale] = await Promise.all([this.planImages.forDrawing(actor.companyId, data.job.site.id), this.jobs.companyLocale(actor)]);
      const { job } = data;
      const task: DrawingTask = {
        kind: 'site-plan',
        ...this.base(data, query),
        locale,
        sitePlan: {
          paper: query.paper ?? 'letter',
          titleBlock: jobTitleBlock({ jobTitle: job.title, siteLabel: job.site.label, place: job.site.city, revision: job.revision }),
          ...(planImage ? { planImage } : {}),
          layersOff: query.layers ?? [],
        },
      };
      return { data, task };
    });
    return this.answer(loaded, ifNoneMatch);
  }

  async schematic(actor: AuthUser, jobId: string, query: DrawingQuery, ifNoneMatch: string | undefined): Promise<DrawingAnswer> {
    const loaded = await this.load(actor, JSON.stringify(['schematic', jobId, query.units ?? null]), async () => {
      const data = await this.jobs.asBuilt(actor, jobId);
      return { data, task: { kind: 'schematic', ...this.base(data, query) } };
    });
    return this.answer(loaded, ifNoneMatch);
  }

  async depthProfile(actor: AuthUser, jobId: string, runId: string, query: DrawingQuery, ifNoneMatch: string | undefined): Promise<DrawingAnswer> {
    const loaded = await this.load(actor, JSON.stringify(['depth-profile', jobId, runId, query.units ?? null]), async () => {
      const data = await this.jobs.asBuilt(actor, jobId);
      if (!data.asBuilt.runs.some((run) => run.id === runId)) {
        throw new NotFoundError('RUN_NOT_FOUND', 'No such run on this job.');
      }
      return { data, task: { kind: 'depth-profile', ...this.base(data, query), runId } };
    });
    return this.answer(loaded, ifNoneMatch);
  }

  private async answer({ task, etag }: Loaded, ifNoneMatch: string | undefined): Promise<DrawingAnswer> {
    if (ifNoneMatch !== undefined && matchesEtag(ifNoneMatch, etag)) return { etag, isNotModified: true };
    return { isNotModified: false, ...(await this.renderer.render(task, etag)) };
  }
}

/** `If-None-Match` may list several validators, weak (`W/`) or strong, or `*`. */
export function matchesEtag(header: string, etag: string): boolean {
  return header
    .split(',')
    .map((value) => value.trim().replace(/^W\//, ''))
    .some((value) => value === '*' || value === etag);
}
