import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob, siteWrite } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

const AMP = {
  kind: 'amplifier',
  label: 'Outdoor amplifier',
  model: 'Fieldtone A-2100',
  channels: [{ name: 'Patio' }, { name: 'Spa' }],
  ratedWatts8Ohm: 100,
  ratedWatts4Ohm: 160,
  minimumImpedanceOhm: 4,
};
const SPEAKER = { kind: 'speaker', label: 'Satellite', nominalImpedanceOhm: 8 };

describe('job records (zones, items, runs, depth readings, checks)', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let b: TestCompany;
  const as: Record<'admin' | 'office' | 'lead' | 'tech' | 'homeowner' | 'otherAdmin', Api> = {} as never;
  let siteId: string;
  let refA: string;
  let refB: string;

  /** A job in progress led by A's lead with A's tech on the crew, holding an amp → speaker run. */
  async function jobWithRun() {
    let job = await moveJob(as.office, await createJob(as.office, siteId, { crewLeadUserId: a.users.lead.id, technicianUserIds: [a.users.tech.id] }), 'in_progress');
    const write = async (path: string, body: object) => {
      const res = await as.lead.expectOk('post', `/api/jobs/${job.id}${path}`, body, { 'If-Match': String(job.version) });
      job = { ...job, version: res.jobVersion };
      return res;
    };
    const amp = (await write('/items', AMP)).item;
    const speaker = (await write('/items', { ...SPEAKER, ties: [{ referencePointId: refA, distanceM: 5 }, { referencePointId: refB, distanceM: 5 }] })).item;
    const channel = { amplifierItemId: amp.id, channelId: amp.channels[0].id };
    const run = (
      await write('/runs', {
        label: 'Amp to satellite',
        fromItemId: amp.id,
        toItemId: speaker.id,
        cableType: '14/2 direct burial',
        gauge: { system: 'awg', awg: 14 },
        conductors: 2,
        pairs: [{ pairIndex: 1, channel }],
        measuredLengthM: 10,
        method: 'direct_burial',
      })
    ).run;
    return { job: () => job, setVersion: (v: number) => (job = { ...job, version: v }), amp, speaker, channel, run };
  }

  const count = (table: string, column: string, id: string) =>
    withDb(async (db) => (await db.query(`select count(*)::int as n from ${table} where ${column} = $1`, [id])).rows[0].n as number);

  const version = (job: JobFixture) => ({ 'If-Match': String(job.version) });

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Records A');
    b = await createCompany('Records B');
    for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) as[role] = apiAs(app, await signIn(app, a.users[role]));
    as.otherAdmin = apiAs(app, await signIn(app, b.users.admin));
    ({ siteId } = await createSite(as.office));
    refA = (await siteWrite(as.office, 'post', siteId, '/reference-points', { label: 'House corner', x: 0, y: 0 })).id;
    refB = (await siteWrite(as.office, 'post', siteId, '/reference-points', { label: 'Gate post', x: 8, y: 0 })).id;
  });

  afterAll(async () => {
    await app.close();
  });

  describe('zones', () => {
    it('should create, rename and delete a zone, bumping the version each time', async () => {
      const { job } = await jobWithRun();
      let j = job();
      const created = await as.lead.expectOk('post', `/api/jobs/${j.id}/zones`, { name: 'Patio' }, version(j));
      expect(created).toMatchObject({ zone: { name: 'Patio' }, jobVersion: j.version + 1 });
      j = { ...j, version: created.jobVersion };
      const renamed = await as.lead.expectOk('patch', `/api/jobs/${j.id}/zones/${created.zone.id}`, { name: 'Terrace' }, version(j));
      expect(renamed.zone.name).toBe('Terrace');
      j = { ...j, version: renamed.jobVersion };
      expect((await as.otherAdmin.send('delete', `/api/jobs/${j.id}/zones/${created.zone.id}`, undefined, version(j))).status).toBe(404);
      expect((await as.lead.send('delete', `/api/jobs/${j.id}/zones/${created.zone.id}`, undefined, { 'If-Match': String(j.version - 1) })).status).toBe(412);
      expect(await count('zones', 'id', created.zone.id)).toBe(1);
      expect((await as.lead.send('delete', `/api/jobs/${j.id}/zones/${created.zone.id}`, undefined, version(j))).body).toEqual({ jobVersion: j.version + 1 });
      expect(await count('zones', 'id', created.zone.id)).toBe(0);
    });

    it('should answer 400 naming the field', async () => {
      const { job } = await jobWithRun();
      const res = await as.lead.send('post', `/api/jobs/${job().id}/zones`, { name: '' }, version(job()));
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('name');
    });
  });

  describe('items', () => {
    it('should create an amplifier with channels and read it back in the as-built', async () => {
      const { job, amp } = await jobWithRun();
      expect(amp.channels).toHaveLength(2);
      const body = await as.tech.expectOk('get', `/api/jobs/${job().id}/as-built`);
      expect(body.asBuilt.items[0]).toEqual({ id: amp.id, ...AMP, channels: amp.channels });
      expect(body.job.version).toBe(job().version);
    });

    it('should replace an item, keeping channels sent with their id, and refuse a foreign channel id', async () => {
      const { job, amp, setVersion } = await jobWithRun();
      const res = await as.lead.expectOk(
        'put',
        `/api/jobs/${job().id}/items/${amp.id}`,
        { ...AMP, label: 'Amp, closet', channels: [{ id: amp.channels[0].id, name: 'Patio + lawn' }, { id: amp.channels[1].id, name: 'Spa' }, { name: 'Spare' }] },
        version(job()),
      );
      setVersion(res.jobVersion);
      expect(res.item.channels.map((c: { id: string }) => c.id).slice(0, 2)).toEqual(amp.channels.map((c: { id: string }) => c.id));
      expect(res.item.channels[0].name).toBe('Patio + lawn');
      const bad = await as.lead.send(
        'put',
        `/api/jobs/${job().id}/items/${amp.id}`,
        { ...AMP, channels: [{ id: '00000000-0000-4000-8000-000000000000', name: 'X' }] },
        version(job()),
      );
      expect(bad.status).toBe(400);
      expect(bad.body.issues[0].path).toBe('channels.0.id');
    });

    it('should refuse to drop a channel a run uses (400) and to delete an item a run uses (409 IN_USE)', async () => {
      const { job, amp, speaker } = await jobWithRun();
      const drop = await as.lead.send('put', `/api/jobs/${job().id}/items/${amp.id}`, { ...AMP, channels: [{ id: amp.channels[1].id, name: 'Spa' }] }, version(job()));
      expect(drop.status).toBe(400);
      expect(drop.body.issues[0].path).toMatch(/^asBuilt\.runs\.0\.pairs\.0\.channel/);
      const del = await as.lead.send('delete', `/api/jobs/${job().id}/items/${speaker.id}`, undefined, version(job()));
      expect(del.status).toBe(409);
      expect(del.body.code).toBe('IN_USE');
      expect(await count('items', 'id', speaker.id)).toBe(1);
    });

    it('should answer 400 naming the field for a bad item, a tie to another site and an unknown zone', async () => {
      const { job } = await jobWithRun();
      const cases: [object, string][] = [
        [{ ...SPEAKER, nominalImpedanceOhm: -8 }, 'nominalImpedanceOhm'],
        [{ kind: 'subwoofer', label: 'Sub', voiceCoils: 'dual', coilImpedanceOhm: 8 }, 'coilWiring'],
        [{ ...SPEAKER, zoneId: '00000000-0000-4000-8000-000000000000' }, 'zoneId'],
        [{ ...SPEAKER, ties: [{ referencePointId: 'rp-elsewhere', distanceM: 3 }] }, 'ties.0.referencePointId'],
        [{ kind: 'gazebo', label: 'x' }, 'kind'],
      ];
      for (const [body, field] of cases) {
        const res = await as.lead.send('post', `/api/jobs/${job().id}/items`, body, version(job()));
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
      }
      expect(await count('items', 'job_id', job().id)).toBe(2);
    });

    it('should delete an unused item, and keep a stale delete from writing', async () => {
      const { job, setVersion } = await jobWithRun();
      const created = await as.lead.expectOk('post', `/api/jobs/${job().id}/items`, { kind: 'junction', label: 'Splice' }, version(job()));
      const stale = await as.lead.send('delete', `/api/jobs/${job().id}/items/${created.item.id}`, undefined, version(job()));
      expect(stale.status).toBe(412);
      expect(stale.body.currentVersion).toBe(created.jobVersion);
      setVersion(created.jobVersion);
      expect((await as.lead.send('delete', `/api/jobs/${job().id}/items/${created.item.id}`, undefined, version(job()))).status).toBe(200);
      expect(await count('items', 'id', created.item.id)).toBe(0);
    });

    it('should record an amplifier channel’s setup and return it with the as-built', async () => {
      const { job, amp } = await jobWithRun();
      const setup = { source: 'Streamer, optical in', gain: '-6 dB', crossover: 'HPF 80 Hz', polarity: 'normal', networkName: 'Backyard-Audio' };
      const res = await as.lead.expectOk('put', `/api/jobs/${job().id}/items/${amp.id}/channels/${amp.channels[0].id}/setup`, { ...setup, password: 'hunter2' }, version(job()));
      expect(res.channelSetup).toMatchObject(setup);
      const body = await as.office.expectOk('get', `/api/jobs/${job().id}/as-built`);
      expect(body.records.channelSetups[amp.channels[0].id]).toMatchObject(setup);
      expect(JSON.stringify(body)).not.toContain('hunter2');
    });
  });

  describe('runs', () => {
    it('should replace a run (pairs, route) and keep its readings when the body lists none', async () => {
      const { job, run, setVersion } = await jobWithRun();
      const added = await as.tech.expectOk('post', `/api/jobs/${job().id}/runs/${run.id}/depth-readings`, { stationM: 2, depthM: 0.3 }, version(job()));
      setVersion(added.jobVersion);
      const { id: _id, ...body } = run;
      const res = await as.lead.expectOk('put', `/api/jobs/${job().id}/runs/${run.id}`, { ...body, route: [{ x: 0, y: 0 }, { x: 6, y: 8 }], measuredLengthM: 10.5 }, version(job()));
      expect(res.run).toMatchObject({ measuredLengthM: 10.5, route: [{ x: 0, y: 0 }, { x: 6, y: 8 }], depthReadings: [{ stationM: 2, depthM: 0.3 }] });
      expect(await count('depth_readings', 'run_id', run.id)).toBe(1);
    });

    it('should keep a route bend placed by GPS with its accuracy, and refuse a GPS bend without one (issue 17)', async () => {
      const { job, run, setVersion } = await jobWithRun();
      const { id: _id, ...body } = run;
      const route = [{ x: 0, y: 0 }, { x: 3.5, y: 4, source: 'gps', accuracyM: 4.8 }, { x: 6, y: 8, source: 'manual' }];
      const res = await as.lead.expectOk('put', `/api/jobs/${job().id}/runs/${run.id}`, { ...body, route }, version(job()));
      setVersion(res.jobVersion);
      expect(res.run.route).toEqual(route);
      const asBuilt = await as.lead.expectOk('get', `/api/jobs/${job().id}/as-built`);
      expect(asBuilt.asBuilt.runs.find((r: { id: string }) => r.id === run.id).route).toEqual(route);
      const stored = await withDb(async (db) => (await db.query('select source, accuracy_m from run_route_points where run_id = $1 order by ordinal', [run.id])).rows);
      expect(stored).toEqual([{ source: null, accuracy_m: null }, { source: 'gps', accuracy_m: 4.8 }, { source: 'manual', accuracy_m: null }]);

      const refused = await as.lead.send('put', `/api/jobs/${job().id}/runs/${run.id}`, { ...body, route: [{ x: 0, y: 0 }, { x: 6, y: 8, source: 'gps' }] }, version(job()));
      expect(refused.status, JSON.stringify(refused.body)).toBe(400);
      expect(refused.body.issues.map((i: { path: string }) => i.path)).toContain('route.1.accuracyM');
      const after = await withDb(async (db) => (await db.query('select count(*)::int as n from run_route_points where run_id = $1 and source is not distinct from $2', [run.id, 'gps'])).rows[0].n as number);
      expect(after).toBe(1);
    });

    it('should answer 400 naming the field for a pair beyond the conductors, a loop and a missing item', async () => {
      const { job, run, amp, speaker } = await jobWithRun();
      const { id: _id, ...body } = run;
      const cases: [object, string][] = [
        [{ ...body, pairs: [{ pairIndex: 2, channel: null }] }, 'pairs.0.pairIndex'],
        [{ ...body, fromItemId: speaker.id, toItemId: amp.id }, 'toItemId'],
        [{ ...body, toItemId: '00000000-0000-4000-8000-000000000000' }, 'toItemId'],
        [{ ...body, gauge: { system: 'awg', awg: 13.5 } }, 'gauge.awg'],
      ];
      for (const [input, field] of cases) {
        const res = await as.lead.send('post', `/api/jobs/${job().id}/runs`, input, version(job()));
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
      }
      expect(await count('runs', 'job_id', job().id)).toBe(1);
    });

    it('should delete a run with its readings, and not let a technician touch runs', async () => {
      const { job, run } = await jobWithRun();
      expect((await as.tech.send('delete', `/api/jobs/${job().id}/runs/${run.id}`, undefined, version(job()))).status).toBe(403);
      expect((await as.otherAdmin.send('delete', `/api/jobs/${job().id}/runs/${run.id}`, undefined, version(job()))).status).toBe(404);
      expect((await as.office.send('delete', `/api/jobs/${job().id}/runs/${run.id}`, undefined, version(job()))).status).toBe(200);
      expect(await count('runs', 'id', run.id)).toBe(0);
    });
  });

  describe('depth readings', () => {
    it('should quick-add readings that show up (sorted by station) with a shallow finding, then edit and delete', async () => {
      const { job, run, setVersion } = await jobWithRun();
      for (const reading of [{ stationM: 6, depthM: 0.3 }, { stationM: 3, depthM: 0.08 }]) {
        const res = await as.tech.expectOk('post', `/api/jobs/${job().id}/runs/${run.id}/depth-readings`, reading, version(job()));
        setVersion(res.jobVersion);
      }
      let body = await as.tech.expectOk('get', `/api/jobs/${job().id}/as-built`);
      expect(body.asBuilt.runs[0].depthReadings).toEqual([{ stationM: 3, depthM: 0.08 }, { stationM: 6, depthM: 0.3 }]);
      expect(body.analysis.findings.some((f: { path: unknown[] }) => f.path.join('.') === 'runs.0.depthReadings.0')).toBe(true);
      const shallowId = body.records.depthReadingIds[run.id][0];
      const fixed = await as.tech.expectOk('patch', `/api/jobs/${job().id}/runs/${run.id}/depth-readings/${shallowId}`, { depthM: 0.3 }, version(job()));
      setVersion(fixed.jobVersion);
      body = await as.tech.expectOk('get', `/api/jobs/${job().id}/as-built`);
      expect(body.analysis.findings.some((f: { path: unknown[] }) => f.path.join('.') === 'runs.0.depthReadings.0')).toBe(false);
      expect((await as.tech.send('delete', `/api/jobs/${job().id}/runs/${run.id}/depth-readings/${shallowId}`, undefined, version(job()))).status).toBe(200);
      expect(await count('depth_readings', 'run_id', run.id)).toBe(1);
    });

    it('should answer 400 naming the field, 412 on a stale version, and 404 across companies', async () => {
      const { job, run } = await jobWithRun();
      const url = `/api/jobs/${job().id}/runs/${run.id}/depth-readings`;
      const far = await as.tech.send('post', url, { stationM: 500, depthM: 0.3 }, version(job()));
      expect(far.status).toBe(400);
      expect(far.body.issues[0].path).toBe('stationM');
      const negative = await as.tech.send('post', url, { stationM: 1, depthM: -1 }, version(job()));
      expect(negative.body.issues[0].path).toBe('depthM');
      const stale = await as.tech.send('post', url, { stationM: 1, depthM: 0.3 }, { 'If-Match': String(job().version - 1) });
      expect(stale.status).toBe(412);
      expect(stale.body).toMatchObject({ code: 'VERSION_CONFLICT', currentVersion: job().version });
      expect((await as.otherAdmin.send('post', url, { stationM: 1, depthM: 0.3 }, version(job()))).status).toBe(404);
      expect(await count('depth_readings', 'run_id', run.id)).toBe(0);
    });

    it('should let technicians add readings only on jobs they are assigned to, until submitted', async () => {
      const { job, run } = await jobWithRun();
      await withDb((db) => db.query('delete from job_technicians where job_id = $1', [job().id]));
      const res = await as.tech.send('post', `/api/jobs/${job().id}/runs/${run.id}/depth-readings`, { stationM: 1, depthM: 0.3 }, version(job()));
      expect(res.status).toBe(403);
      const other = await jobWithRun();
      const submitted = await moveJob(as.lead, other.job(), 'submitted');
      const late = await as.tech.send('post', `/api/jobs/${submitted.id}/runs/${other.run.id}/depth-readings`, { stationM: 1, depthM: 0.3 }, version(submitted));
      expect(late.status).toBe(409);
      expect(late.body.code).toBe('JOB_SUBMITTED');
      expect((await as.lead.send('post', `/api/jobs/${submitted.id}/zones`, { name: 'Late' }, version(submitted))).status).toBe(409);
      expect((await as.office.send('post', `/api/jobs/${submitted.id}/zones`, { name: 'Review fix' }, version(submitted))).status).toBe(201);
    });
  });

  describe('commissioning checks', () => {
    it('should create, replace and delete a check on a channel', async () => {
      const { job, channel, setVersion } = await jobWithRun();
      const created = await as.tech.expectOk('post', `/api/jobs/${job().id}/checks`, { channel, quantity: 'dc_resistance', measuredOhm: 6.9, isPolarityOk: true }, version(job()));
      setVersion(created.jobVersion);
      expect(created.check).toMatchObject({ channel, measuredOhm: 6.9 });
      const replaced = await as.tech.expectOk('put', `/api/jobs/${job().id}/checks/${created.check.id}`, { channel, quantity: 'impedance', measuredOhm: 8.4, frequencyHz: 1000 }, version(job()));
      setVersion(replaced.jobVersion);
      const body = await as.tech.expectOk('get', `/api/jobs/${job().id}/as-built`);
      expect(body.asBuilt.checks).toEqual([{ id: created.check.id, channel, quantity: 'impedance', measuredOhm: 8.4, frequencyHz: 1000 }]);
      expect(body.analysis.checks).toHaveLength(1);
      expect((await as.tech.send('delete', `/api/jobs/${job().id}/checks/${created.check.id}`, undefined, version(job()))).status).toBe(200);
      expect(await count('commissioning_checks', 'job_id', job().id)).toBe(0);
    });

    it('should answer 400 naming the field for a channel that is not on the amplifier', async () => {
      const { job, amp, speaker } = await jobWithRun();
      const res = await as.tech.send('post', `/api/jobs/${job().id}/checks`, { channel: { amplifierItemId: speaker.id, channelId: amp.channels[0].id }, quantity: 'impedance', measuredOhm: 8 }, version(job()));
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('channel.amplifierItemId');
      const stale = await as.tech.send('post', `/api/jobs/${job().id}/checks`, { channel: { amplifierItemId: amp.id, channelId: amp.channels[0].id }, quantity: 'impedance', measuredOhm: 8 }, { 'If-Match': '1' });
      expect(stale.status).toBe(412);
      expect(await count('commissioning_checks', 'job_id', job().id)).toBe(0);
    });
  });

  it('should audit every change to the job, and nothing for a refused one', async () => {
    const { job } = await jobWithRun();
    await as.lead.send('post', `/api/jobs/${job().id}/zones`, { name: 'Stale' }, { 'If-Match': '1' });
    const actions = await withDb(async (db) =>
      (await db.query(`select action from audit_log where target_id = $1 or details->>'jobId' = $1 order by id`, [job().id])).rows.map((r) => r.action),
    );
    expect(actions).toEqual(['job.create', 'job.status', 'job.item.create', 'job.item.create', 'job.run.create']);
  });
});
