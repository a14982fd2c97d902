import { describe, expect, it } from 'vitest';

import { buildJob } from '../../../testing/job-data';

import {
  callFromLegacyPath,
  isAdditiveEndpoint,
  JOB_WRITE_RESPONSES,
  JOB_WRITE_ROUTES,
  routeOf,
  type JobWriteCall,
  type JobWriteEndpoint,
} from './job-write-endpoints';

/** One call of every endpoint, with ids that need no escaping and one that does. */
const CALLS: Record<JobWriteEndpoint, JobWriteCall> = {
  updateJob: { endpoint: 'updateJob', params: {}, body: { notes: 'Trench by the fence' } },
  changeStatus: { endpoint: 'changeStatus', params: {}, body: { to: 'submitted' } },
  createZone: { endpoint: 'createZone', params: {}, body: { name: 'Patio' } },
  updateZone: { endpoint: 'updateZone', params: { zoneId: 'z1' }, body: { name: 'Lawn' } },
  deleteZone: { endpoint: 'deleteZone', params: { zoneId: 'z1' } },
  createItem: { endpoint: 'createItem', params: {}, body: { kind: 'speaker', label: 'P1' } },
  replaceItem: { endpoint: 'replaceItem', params: { itemId: 'i1' }, body: { kind: 'speaker', label: 'P1' } },
  deleteItem: { endpoint: 'deleteItem', params: { itemId: 'i1' } },
  updateChannelSetup: { endpoint: 'updateChannelSetup', params: { itemId: 'i1', channelId: 'c1' }, body: { gain: '-6 dB' } },
  createRun: { endpoint: 'createRun', params: {}, body: { label: 'Patio trunk' } },
  replaceRun: { endpoint: 'replaceRun', params: { runId: 'r1' }, body: { label: 'Patio trunk' } },
  deleteRun: { endpoint: 'deleteRun', params: { runId: 'r1' } },
  undoSiteChange: { endpoint: 'undoSiteChange', params: { recordId: 'r1' } },
  addDepthReading: { endpoint: 'addDepthReading', params: { runId: 'r1' }, body: { stationM: 3, depthM: 0.45 } },
  updateDepthReading: { endpoint: 'updateDepthReading', params: { runId: 'r1', readingId: 'd1' }, body: { depthM: 0.5 } },
  deleteDepthReading: { endpoint: 'deleteDepthReading', params: { runId: 'r1', readingId: 'd1' } },
  createCheck: { endpoint: 'createCheck', params: {}, body: { measuredOhm: 7.2 } },
  replaceCheck: { endpoint: 'replaceCheck', params: { checkId: 'k1' }, body: { measuredOhm: 7.4 } },
  deleteCheck: { endpoint: 'deleteCheck', params: { checkId: 'k1' } },
  saveSignature: { endpoint: 'saveSignature', params: { role: 'lead' }, body: { signerName: 'Ola Brenner', svgPath: 'M 1 1 L 2 2' } },
  clearSignature: { endpoint: 'clearSignature', params: { role: 'homeowner' } },
  createReferencePoint: { endpoint: 'createReferencePoint', params: { siteId: 's1' }, body: { label: 'Gate post', x: 1, y: 2 } },
};

describe('job write endpoints (issues 17 and 20)', () => {
  it('should give every endpoint its route below the job', () => {
    expect(Object.keys(CALLS).sort()).toEqual(Object.keys(JOB_WRITE_ROUTES).sort());
    expect(routeOf(CALLS.updateJob)).toEqual({ method: 'PATCH', path: '' });
    expect(routeOf(CALLS.changeStatus)).toEqual({ method: 'POST', path: '/status' });
    expect(routeOf(CALLS.updateChannelSetup)).toEqual({ method: 'PUT', path: '/items/i1/channels/c1/setup' });
    expect(routeOf(CALLS.updateDepthReading)).toEqual({ method: 'PATCH', path: '/runs/r1/depth-readings/d1' });
    expect(routeOf(CALLS.undoSiteChange)).toEqual({ method: 'DELETE', path: '/site-changes/r1' });
    expect(routeOf(CALLS.saveSignature)).toEqual({ method: 'PUT', path: '/signatures/lead' });
    expect(routeOf({ endpoint: 'deleteRun', params: { runId: 'a/b?c' } }).path, 'a parameter cannot reach another route').toBe('/runs/a%2Fb%3Fc');
    // A reference point added from the job goes to the job's site, on the site's version (issue 17).
    expect(routeOf(CALLS.createReferencePoint)).toEqual({ method: 'POST', path: '/reference-points', siteId: 's1' });
    expect(Object.values(CALLS).filter((call) => routeOf(call).siteId !== undefined).map((call) => call.endpoint)).toEqual(['createReferencePoint']);
  });

  it('should read back every write an earlier app kept as a path, and nothing else', () => {
    // Site writes were never queued as paths (they joined the queue by name), so none is read back.
    for (const call of Object.values(CALLS).filter((candidate) => routeOf(candidate).siteId === undefined)) {
      const { method, path } = routeOf(call);
      expect(callFromLegacyPath(method, path, call.body), `${method} ${path}`).toEqual(call.body === undefined ? { endpoint: call.endpoint, params: call.params } : call);
    }
    expect(callFromLegacyPath('POST', '/photos', {})).toBeUndefined();
    expect(callFromLegacyPath('GET', '/runs/r1', undefined)).toBeUndefined();
    expect(callFromLegacyPath('PUT', '/items/i1/channels/c1/other', {})).toBeUndefined();
  });

  it('should treat only writes that add a record as safe to send on a newer version', () => {
    const additive = (Object.keys(CALLS) as JobWriteEndpoint[]).filter(isAdditiveEndpoint).sort();
    expect(additive).toEqual(['addDepthReading', 'createCheck', 'createItem', 'createReferencePoint', 'createRun', 'createZone']);
  });
});

describe('JOB_WRITE_RESPONSES', () => {
  it('should parse each answer with its own route’s schema: a record write needs its record, a job write the whole job', () => {
    // A delete answers only the job's new version; the same answer is refused where the route answers a record.
    expect(JOB_WRITE_RESPONSES.deleteRun.safeParse({ jobVersion: 5 }).success).toBe(true);
    expect(JOB_WRITE_RESPONSES.clearSignature.safeParse({ jobVersion: 5 }).success).toBe(true);
    expect(JOB_WRITE_RESPONSES.replaceRun.safeParse({ jobVersion: 5 }).success).toBe(false);
    expect(JOB_WRITE_RESPONSES.createZone.safeParse({ zone: {}, jobVersion: 5 }).success).toBe(false);
    expect(JOB_WRITE_RESPONSES.updateJob.safeParse({ version: 5 }).success).toBe(false);
    expect(JOB_WRITE_RESPONSES.updateJob.safeParse({ ...buildJob(), version: 5 }).success).toBe(true);
    expect(JOB_WRITE_RESPONSES.deleteZone.safeParse({}).success).toBe(false);
    // A reference point answers the point with the site's version and the jobs it bumped.
    const point = { id: 'p1', label: 'Gate post', x: 1, y: 2, notes: null };
    expect(JOB_WRITE_RESPONSES.createReferencePoint.safeParse({ ...point, siteVersion: 4, jobVersions: { j1: 6 } }).success).toBe(true);
    expect(JOB_WRITE_RESPONSES.createReferencePoint.safeParse(point).success).toBe(false);
  });
});
