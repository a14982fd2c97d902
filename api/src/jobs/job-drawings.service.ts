import { Injectable, NotFoundException } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { DrawingQuery, SitePlanDrawingQuery } from '../domain/jobs/job-drawings.schema.js';
import type { JobAsBuiltResponse } from '../domain/jobs/job.schema.js';
import { drawJobDepthProfile, drawJobSchematic, drawJobSitePlan, type JobDrawingInput, jobTitleBlock } from '../drawings/job-drawings.js';
import { createNodeSvgCanvas } from '../drawings/node-svg-window.js';
import { SitePlanImagesService } from '../sites/site-plan-images.service.js';
import { JobsService } from './jobs.service.js';

/**
 * The drawings of a job's current as-built as standalone SVG files, drawn exactly as the packet and the
 * web app draw them (drawings/job-drawings.ts). Read access is that of the job itself.
 */
@Injectable()
export class JobDrawingsService {
  constructor(
    private readonly jobs: JobsService,
    private readonly planImages: SitePlanImagesService,
  ) {}

  private input(data: JobAsBuiltResponse, query: DrawingQuery): JobDrawingInput {
    return {
      asBuilt: data.asBuilt,
      analysis: data.analysis,
      createCanvas: createNodeSvgCanvas,
      units: query.units ?? data.asBuilt.units?.length ?? 'metric',
    };
  }

  async sitePlan(actor: AuthUser, jobId: string, query: SitePlanDrawingQuery): Promise<string> {
    const data = await this.jobs.asBuilt(actor, jobId);
    const planImage = await this.planImages.forDrawing(actor.companyId, data.job.site.id);
    const { job } = data;
    return drawJobSitePlan(this.input(data, query), {
      paper: query.paper ?? 'letter',
      titleBlock: jobTitleBlock({ jobTitle: job.title, siteLabel: job.site.label, place: job.site.city, revision: job.revision }),
      ...(planImage ? { planImage } : {}),
      layersOff: query.layers ?? [],
    });
  }

  async schematic(actor: AuthUser, jobId: string, query: DrawingQuery): Promise<string> {
    return drawJobSchematic(this.input(await this.jobs.asBuilt(actor, jobId), query));
  }

  async depthProfile(actor: AuthUser, jobId: string, runId: string, query: DrawingQuery): Promise<string> {
    const data = await this.jobs.asBuilt(actor, jobId);
    if (!data.asBuilt.runs.some((run) => run.id === runId)) {
      throw new NotFoundException({ message: 'No such run on this job.', code: 'RUN_NOT_FOUND' });
    }
    return drawJobDepthProfile(this.input(data, query), runId);
  }
}
