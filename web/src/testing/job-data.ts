import { analyzeAsBuilt } from '@domain/analysis/analyze';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { JobAsBuiltResponse, JobListResponse, JobResponse, JobSummaryResponse } from '@domain/jobs/job.schema';

import { buildSessionUser } from './data';

/** Invented ids of one invented job, so tests can address records by name. */
export const JOB_IDS = {
  job: '7d1e2f30-1111-4a4a-9b9b-000000000001',
  site: '7d1e2f30-1111-4a4a-9b9b-000000000002',
  customer: '7d1e2f30-1111-4a4a-9b9b-000000000003',
  amp: '7d1e2f30-1111-4a4a-9b9b-000000000010',
  ch1: '7d1e2f30-1111-4a4a-9b9b-000000000011',
  speaker: '7d1e2f30-1111-4a4a-9b9b-000000000012',
  run: '7d1e2f30-1111-4a4a-9b9b-000000000020',
  reading1: '7d1e2f30-1111-4a4a-9b9b-000000000031',
  reading2: '7d1e2f30-1111-4a4a-9b9b-000000000032',
} as const;

export function buildJobSummary(overrides: Partial<JobSummaryResponse> = {}): JobSummaryResponse {
  const lead = buildSessionUser('lead');
  return {
    id: JOB_IDS.job,
    title: 'Back-yard sound, phase 1',
    status: 'in_progress',
    revision: 1,
    version: 3,
    site: { id: JOB_IDS.site, label: 'Thistledown garden', city: 'Marrowby' },
    customer: { id: JOB_IDS.customer, name: 'Perrin Ashgrove' },
    crewLead: { id: lead.id, name: lead.name },
    startDate: '2026-04-20',
    endDate: null,
    updatedAt: '2026-04-21T15:30:00.000Z',
    ...overrides,
  };
}

export function buildJobList(items: JobSummaryResponse[], overrides: Partial<JobListResponse> = {}): JobListResponse {
  return { items, total: items.length, page: 1, pageSize: 25, nextCursor: null, ...overrides };
}

export function buildJob(overrides: Partial<JobResponse> = {}): JobResponse {
  return {
    ...buildJobSummary(),
    technicians: [],
    notes: null,
    reviewComment: null,
    createdAt: '2026-04-18T09:00:00.000Z',
    ...overrides,
  };
}

/** An amplifier feeding one satellite through one buried run; `readings` in metres. */
export function buildAsBuilt(readings: { stationM: number; depthM: number }[] = []): AsBuilt {
  return {
    zones: [],
    referencePoints: [],
    items: [
      {
        id: JOB_IDS.amp,
        kind: 'amplifier',
        label: 'Garage amp',
        channels: [{ id: JOB_IDS.ch1, name: 'Patio' }],
        ratedWatts8Ohm: 60,
        minimumImpedanceOhm: 4,
      },
      { id: JOB_IDS.speaker, kind: 'speaker', label: 'Patio satellite', nominalImpedanceOhm: 8 },
    ],
    runs: [
      {
        id: JOB_IDS.run,
        label: 'Patio trunk',
        fromItemId: JOB_IDS.amp,
        toItemId: JOB_IDS.speaker,
        cableType: '14/2 direct burial',
        gauge: { system: 'awg', awg: 14 },
        conductors: 2,
        pairs: [{ pairIndex: 1, channel: { amplifierItemId: JOB_IDS.amp, channelId: JOB_IDS.ch1 } }],
        measuredLengthM: 12,
        method: 'direct_burial',
        location: 'general',
        depthReadings: readings,
      },
    ],
    checks: [],
  };
}

/** The as-built answer with the real analysis of `asBuilt`. */
export function buildJobAsBuilt(asBuilt: AsBuilt = buildAsBuilt(), job: Partial<JobResponse> = {}): JobAsBuiltResponse {
  const readingIds = [JOB_IDS.reading1, JOB_IDS.reading2];
  return {
    job: buildJob(job),
    asBuilt,
    analysis: analyzeAsBuilt(asBuilt),
    records: {
      depthReadingIds: Object.fromEntries(asBuilt.runs.map((run) => [run.id, (run.depthReadings ?? []).map((_r, i) => readingIds[i] ?? `reading-${i}`)])),
      channelSetups: {},
    },
  };
}
