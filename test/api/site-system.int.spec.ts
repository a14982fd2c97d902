import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/*
 * Issue 21: the property's installed system is the record and a job is a change to it. A first job
 * installs an amplifier, a speaker and a capped spare run; once it is issued, a second job on the same
 * property connects to that spare end and amplifier channel, its analysis sees the first job's load,
 * and two open jobs cannot change the same record at once.
 */

const AMP = { kind: 'amplifier', label: 'Pool house amplifier', channels: [{ name: 'Garden' }], ratedWatts8Ohm: 100, ratedWatts4Ohm: 160, minimumImpedanceOhm: 4 };
const speaker = (label: string) => ({ kind: 'speaker', label, nominalImpedanceOhm: 8 });
const run = (label: string, fromItemId: string, toItemId: string, channel: { amplifierItemId: string; channelId: string } | null, extra: object = {}) => ({
  label,
  fromItemId,
  toItemId,
  cableType: '14/2 direct burial',
  gauge: { system: 'awg', awg: 14 },
  conductors: 2,
  pairs: [{ pairIndex: 1, channel }],
  measuredLengthM: 12,
  method: 'direct_burial',
  depthReadings: [{ stationM: 6, depthM: 0.2 }],
  ...extra,
});

interface Finding {
  code: string;
  severity: string;
  path: (string | number)[];
  itemId?: string;
  runId?: string;
  channel?: { channelId: string };
}

describe('the site system: a later job builds on what is in the ground', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let siteId: string;
  const first = {} as { job: JobFixture; amp: { id: string; channels: { id: string }[] }; speaker: string; spareEnd: string; liveRun: string; spareRun: string };
  /** The speaker the first job added in its revision 2 (set by the test that issues it). */
  let gateSpeaker = '';

  /** A job in progress on the site (or `onSite`), led by the company's lead; `write` keeps its version. */
  async function openJob(title?: string, onSite = siteId) {
    let job = await moveJob(office, await createJob(office, onSite, { crewLeadUserId: company.users.lead.id }), 'in_progress');
    if (title) job = { ...job, version: (await office.expectOk('patch', `/api/jobs/${job.id}`, { title, expectedVersion: job.version })).version };
    return writer(job);
  }

  /** Writes to a job in progress as its lead, keeping its version. */
  function writer(initial: JobFixture) {
    let job = initial;
    const send = (method: 'post' | 'put' | 'delete', path: string, body?: object) =>
      lead.send(method, `/api/jobs/${job.id}${path}`, body, { 'If-Match': `"${job.version}"` }).then((res) => {
        if (res.status < 300) job = { ...job, version: res.body.jobVersion };
        return res;
      });
    const write = async (method: 'post' | 'put' | 'delete', path: string, body?: object) => {
      const res = await send(method, path, body);
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
      return res.body;
    };
    return { job: () => job, send, write, asBuilt: () => lead.expectOk('get', `/api/jobs/${job.id}/as-built`) };
  }

  /** Moves the job to ready and issues it, acknowledging its open must-fix findings. */
  async function issue(job: JobFixture) {
    const ready = await moveJob(office, job, 'submitted', 'ready_to_issue');
    const { analysis } = await office.expectOk('get', `/api/jobs/${job.id}/as-built`);
    const acknowledgements = (analysis.findings as Finding[])
      .filter((f) => f.severity === 'critical')
      .map((f) => ({ code: f.code, path: f.path.join('.'), reason: 'Accepted for this test.' }));
    return office.expectOk('post', `/api/jobs/${job.id}/packets`, { acknowledgements }, { 'If-Match': `"${ready.version}"` });
  }

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Site system');
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    ({ siteId } = await createSite(office));

    // The first job: amplifier → speaker on the channel, and a capped spare run to a spare end by the planter.
    const a = await openJob('Garden speakers');
    first.amp = (await a.write('post', '/items', AMP)).item;
    first.speaker = (await a.write('post', '/items', speaker('Lawn speaker'))).item.id;
    first.spareEnd = (await a.write('post', '/items', { kind: 'spare_end', label: 'Spare end by the planter', isCapped: true })).item.id;
    const channel = { amplifierItemId: first.amp.id, channelId: first.amp.channels[0]!.id };
    first.liveRun = (await a.write('post', '/runs', run('Amp to lawn speaker', first.amp.id, first.speaker, channel))).run.id;
    first.spareRun = (await a.write('post', '/runs', run('Spare to planter', first.amp.id, first.spareEnd, null, { isSpare: true }))).run.id;
    await withDb((db) => db.query(`update jobs set start_date = '2026-05-11', end_date = '2026-05-14' where id = $1`, [a.job().id]));
    first.job = a.job();
    await issue(first.job);
  });

  afterAll(async () => {
    await app?.close();
  });

  /** The frozen snapshot of a packet revision. */
  const snapshotOf = async (revisionId: string) =>
    withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [revisionId])).rows[0].snapshot);

  /** A job's change rows for a record, oldest first, as stored. */
  const changeRows = async (jobId: string, recordId: string) =>
    withDb(
      async (db) =>
        (
          await db.query(
            `select id, change, before, changed_on::text, issued_at from site_record_changes where job_id = $1 and record_id = $2 order by created_at`,
            [jobId, recordId],
          )
        ).rows as { id: string; change: string; before: { record: { label: string } }; changed_on: string; issued_at: Date | null }[],
    );

  /** Reopens an issued job for its next revision, as its lead writes to it. */
  async function reopen(job: JobFixture) {
    const version = (await office.expectOk('get', `/api/jobs/${job.id}`)).version as number;
    return writer(await moveJob(office, { ...job, version }, 'in_progress'));
  }

  it('connects a second job to the first job’s spare end and channel, and checks the combined load', async () => {
    const b = await openJob('Fire pit zone');
    await withDb((db) => db.query(`update jobs set start_date = '2027-04-02', end_date = null where id = $1`, [b.job().id]));
    const channel = { amplifierItemId: first.amp.id, channelId: first.amp.channels[0]!.id };

    // What is already installed shows in the second job, marked as the first job's, dated.
    const before = await b.asBuilt();
    expect(before.asBuilt.items.map((i: { id: string }) => i.id)).toEqual([first.amp.id, first.speaker, first.spareEnd]);
    expect(before.records.siteRecords[first.spareRun]).toMatchObject({
      kind: 'run',
      isThisJob: false,
      installedBy: { jobId: first.job.id, jobTitle: 'Garden speakers' },
      installedOn: '2026-05-14',
      changedBy: [],
      abandoned: null,
    });

    // A speaker by the fire pit, fed from the spare end (refused as "no item with id" before issue 21).
    const firePit = (await b.write('post', '/items', speaker('Fire pit speaker'))).item.id;
    const newRun = (await b.write('post', '/runs', run('Planter to fire pit', first.spareEnd, firePit, channel))).run.id;
    // The spare run goes live on the channel: a change by this job to the first job's record.
    await b.write('put', `/runs/${first.spareRun}`, run('Spare to planter', first.amp.id, first.spareEnd, channel, { isSpare: false }));

    const after = await b.asBuilt();
    const findings = after.analysis.findings as Finding[];
    // The new speaker is on the first job's channel: not an open circuit, not on a spare-only run.
    expect(findings.filter((f) => f.itemId === firePit || f.runId === newRun).map((f) => f.code)).not.toEqual(
      expect.arrayContaining([expect.stringMatching(/^(CHANNEL_OPEN|SPEAKER_ON_NO_CHANNEL|SPEAKER_ONLY_ON_SPARE_RUN|RUN_NOT_CONNECTED_TO_AMP)$/)]),
    );
    const load = () => (after.analysis.channels as { channel: { channelId: string }; loadOhmNominal: number | null }[]).find((c) => c.channel.channelId === channel.channelId)!;
    // Two 8 Ω speakers in parallel on the channel: 1/R = 1/8 + 1/8, R = 4 Ω (parallel resistance,
    // Horowitz & Hill, The Art of Electronics, 3rd ed., §1.2.2 — from memory).
    expect(load().loadOhmNominal).toBeCloseTo(4, 6);
    expect(after.records.siteRecords[newRun]).toMatchObject({ isThisJob: true, installedBy: { jobId: b.job().id }, installedOn: '2027-04-02' });
    expect(after.records.siteRecords[first.spareRun]).toMatchObject({
      isThisJob: false,
      installedOn: '2026-05-14',
      changedBy: [{ jobId: b.job().id, jobTitle: 'Fire pit zone', change: 'changed', on: '2027-04-02', isIssued: false }],
    });
    expect(after.asBuilt.runs.find((r: { id: string }) => r.id === first.spareRun).isSpare).toBeUndefined();

    // A third speaker on the same channel: 8 Ω ∥ 8 Ω ∥ 8 Ω = 8/3 ≈ 2.67 Ω, below the amplifier's 4 Ω
    // minimum (same source); the analysis sees the first job's load and says so.
    const bench = (await b.write('post', '/items', speaker('Bench speaker'))).item.id;
    await b.write('post', '/runs', run('Planter to bench', first.spareEnd, bench, channel));
    const third = await b.asBuilt();
    const thirdLoad = (third.analysis.channels as { channel: { channelId: string }; loadOhmNominal: number }[]).find((c) => c.channel.channelId === channel.channelId)!;
    expect(thirdLoad.loadOhmNominal).toBeCloseTo(8 / 3, 6);
    expect((third.analysis.findings as Finding[]).some((f) => f.code === 'LOAD_BELOW_AMP_MINIMUM')).toBe(true);

    // The first job's revision is untouched: its frozen as-built still has the run as a spare.
    const [revision] = await office.expectOk('get', `/api/jobs/${first.job.id}/packets`);
    const snapshot = await withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [revision.id])).rows[0].snapshot);
    expect(snapshot.asBuilt.runs.find((r: { id: string }) => r.id === first.spareRun).isSpare).toBe(true);

    // Issuing the second job freezes the whole site system, says what changed against the first job's
    // packet (which it supersedes), and renews the site's one locate link instead of making another.
    const linkBefore = await withDb(async (db) => (await db.query(`select id, expires_at from locate_links where site_id = $1`, [siteId])).rows);
    expect(linkBefore).toHaveLength(1);
    await withDb((db) => db.query(`update locate_links set expires_at = now() + interval '400 days' where id = $1`, [linkBefore[0].id]));
    const issued = await issue(b.job());
    const second = await withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [issued.id])).rows[0].snapshot);
    expect(second.asBuilt.runs.map((r: { id: string }) => r.id)).toEqual(expect.arrayContaining([first.liveRun, first.spareRun, newRun]));
    expect(second.siteRecords[first.speaker]).toMatchObject({ installedBy: { jobId: first.job.id }, installedOn: '2026-05-14', isThisJob: false });
    expect(second.whatChanged.supersedes).toMatchObject({ revisionId: revision.id, jobId: first.job.id, jobTitle: 'Garden speakers', revision: 1 });
    expect(second.whatChanged.added.map((r: { label: string; on: string }) => `${r.label} ${r.on}`).sort()).toEqual(
      ['Bench speaker 2027-04-02', 'Fire pit speaker 2027-04-02', 'Planter to bench 2027-04-02', 'Planter to fire pit 2027-04-02'],
    );
    expect(second.whatChanged.changed).toEqual([{ kind: 'run', id: first.spareRun, label: 'Spare to planter', on: '2027-04-02', jobTitle: 'Fire pit zone' }]);
    const linkAfter = await withDb(async (db) => (await db.query(`select id, expires_at from locate_links where site_id = $1`, [siteId])).rows);
    expect(linkAfter.map((l: { id: string }) => l.id)).toEqual([linkBefore[0].id]);
    // Renewed for the full term (LOCATE_LONG_LIVED_DAYS, ten years by default) from this issue, not the 400 days left.
    expect(new Date(linkAfter[0].expires_at).getTime() - Date.now()).toBeGreaterThan(3000 * 86_400_000);
    const urls = await withDb(async (db) => (await db.query(`select distinct url from revision_locate_links where link_id = $1`, [linkBefore[0].id])).rows);
    expect(urls).toHaveLength(1);
  });

  it('abandons and removes an earlier record with this job’s date, and undoes it', async () => {
    const c = await openJob('Lawn rework');
    await withDb((db) => db.query(`update jobs set start_date = '2027-06-01', end_date = '2027-06-02' where id = $1`, [c.job().id]));
    // The live run (held by no other open job) is abandoned in place by this job.
    const channel = { amplifierItemId: first.amp.id, channelId: first.amp.channels[0]!.id };
    await c.write('put', `/runs/${first.liveRun}`, run('Amp to lawn speaker', first.amp.id, first.speaker, channel, { isAbandoned: true }));
    let view = await c.asBuilt();
    expect(view.records.siteRecords[first.liveRun]).toMatchObject({
      abandoned: { jobId: c.job().id, jobTitle: 'Lawn rework', on: '2027-06-02' },
      changedBy: [{ jobId: c.job().id, change: 'abandoned', on: '2027-06-02' }],
    });
    // Deleting the first job's speaker records its removal instead: it leaves this job's system, kept in the database.
    await c.write('delete', `/runs/${first.liveRun}`);
    view = await c.asBuilt();
    expect(view.asBuilt.runs.some((r: { id: string }) => r.id === first.liveRun)).toBe(false);
    expect(view.records.removedByThisJob).toEqual([{ kind: 'run', id: first.liveRun, label: 'Amp to lawn speaker', removedOn: '2027-06-02' }]);
    const row = await withDb(async (db) => (await db.query(`select removed_by_job_id, removed_on::text, job_id from runs where id = $1`, [first.liveRun])).rows[0]);
    expect(row).toEqual({ removed_by_job_id: c.job().id, removed_on: '2027-06-02', job_id: first.job.id });
    // Undo: the run is back as the first job left it, in service, and no longer held.
    await c.write('delete', `/site-changes/${first.liveRun}`);
    view = await c.asBuilt();
    expect(view.records.siteRecords[first.liveRun]).toMatchObject({ abandoned: null, changedBy: [] });
    expect(view.asBuilt.runs.find((r: { id: string }) => r.id === first.liveRun).isAbandoned).toBeUndefined();
    expect(view.records.removedByThisJob).toEqual([]);
    expect((await c.send('delete', `/site-changes/${first.liveRun}`)).status).toBe(404);

    // A draft job holding a change to an earlier record is not deleted out from under it: 409, nothing gone.
    const draft = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    await withDb((db) =>
      db.query(`insert into site_record_changes (site_id, job_id, record_kind, record_id, change, before, changed_on) values ($1, $2, 'run', $3, 'changed', '{}', current_date)`, [siteId, draft.id, first.liveRun]),
    );
    const refused = await office.send('delete', `/api/jobs/${draft.id}`, undefined, { 'If-Match': `"${draft.version}"` });
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('JOB_CHANGED_SITE_RECORDS');
    await withDb((db) => db.query(`delete from site_record_changes where job_id = $1`, [draft.id]));
    expect((await office.send('delete', `/api/jobs/${draft.id}`, undefined, { 'If-Match': `"${draft.version}"` })).status).toBe(204);
  });

  it('answers 409 when two open jobs change the same earlier record, also when they race', async () => {
    const channel = { amplifierItemId: first.amp.id, channelId: first.amp.channels[0]!.id };
    const d = await openJob('Patio refresh');
    const e = await openJob('Gate speakers');
    const body = (label: string) => run(label, first.amp.id, first.speaker, channel);
    // Both at once: one wins, the other is told which job holds the run; nothing half-written.
    const [one, two] = await Promise.all([d.send('put', `/runs/${first.liveRun}`, body('Patio label')), e.send('put', `/runs/${first.liveRun}`, body('Gate label'))]);
    expect([one.status, two.status].sort()).toEqual([200, 409]);
    const loser = one.status === 409 ? one : two;
    const winner = one.status === 409 ? e : d;
    expect(loser.body).toMatchObject({ code: 'RECORD_CHANGED_BY_OTHER_JOB', message: expect.stringContaining(one.status === 409 ? 'Gate speakers' : 'Patio refresh') });
    // The message names the run as the losing job sees it (the winner's relabel has not happened for it).
    expect(loser.body.message).toContain('run "Amp to lawn speaker"');
    const label = await withDb(async (db) => (await db.query(`select label from runs where id = $1`, [first.liveRun])).rows[0].label);
    expect(label).toBe(one.status === 409 ? 'Gate label' : 'Patio label');
    // The record stays held until the winner undoes (or issues) its change; then the other job may change it.
    const other = one.status === 409 ? d : e;
    expect((await other.send('put', `/runs/${first.liveRun}`, body('Again'))).status).toBe(409);
    await winner.write('delete', `/site-changes/${first.liveRun}`);
    expect((await other.send('put', `/runs/${first.liveRun}`, body('Again'))).status).toBe(200);
  });

  it('keeps a reopened job’s unissued record out of another job’s packet, and flags the site’s newest packet as latest', async () => {
    // The first job is reopened for its revision 2 and adds a speaker it has not issued yet.
    const version = (await office.expectOk('get', `/api/jobs/${first.job.id}`)).version as number;
    let a: JobFixture = await moveJob(office, { ...first.job, version }, 'in_progress');
    const draft = await lead.expectOk('post', `/api/jobs/${a.id}/items`, speaker('Gate speaker'), { 'If-Match': `"${a.version}"` });
    a = { ...a, version: draft.jobVersion };
    gateSpeaker = draft.item.id;
    // And a zone (zones are the job's own rows: dated when added, as items are).
    const gateZone = await lead.expectOk('post', `/api/jobs/${a.id}/zones`, { name: 'Gate' }, { 'If-Match': `"${a.version}"` });
    a = { ...a, version: gateZone.jobVersion };

    // Meanwhile another job is issued: its frozen system and What changed hold only what is issued or its own.
    const g = await openJob('Hedge lights');
    const hedge = (await g.write('post', '/items', speaker('Hedge speaker'))).item.id;
    expect((await g.asBuilt()).asBuilt.items.map((i: { id: string }) => i.id)).not.toContain(draft.item.id);
    const gIssued = await issue(g.job());
    const gSnapshot = await withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [gIssued.id])).rows[0].snapshot);
    expect(gSnapshot.asBuilt.items.map((i: { id: string }) => i.id)).not.toContain(draft.item.id);
    const gZones = gSnapshot.asBuilt.zones.map((z: { id: string }) => z.id);
    expect(gZones).not.toContain(gateZone.zone.id);
    expect(gSnapshot.whatChanged.added.map((r: { id: string }) => r.id)).toEqual([hedge]);
    // The previous test left an open job holding an unissued relabel of the first job's live run: it has
    // not happened for this job, so its packet has the run as it was and lists no change to it.
    expect(gSnapshot.asBuilt.runs.find((r: { id: string }) => r.id === first.liveRun).label).toBe('Amp to lawn speaker');
    expect(gSnapshot.whatChanged.changed).toEqual([]);
    expect(gSnapshot.siteRecords[first.liveRun].changedBy).toEqual([]);

    // Packets issued before the site record froze only their own job's records: make every earlier
    // packet of the site look like that (its own records, no site records). What changed must then
    // compare with all of them merged, not with the superseded packet's one job alone.
    await withDb(async (db) => {
      const rows = (await db.query(`select pr.id, pr.job_id, pr.snapshot from packet_revisions pr join jobs j on j.id = pr.job_id where j.site_id = $1`, [siteId])).rows;
      for (const row of rows) {
        const { siteRecords, whatChanged: _changes, ...rest } = row.snapshot;
        const own = (r: { id: string }) => siteRecords?.[r.id]?.installedBy.jobId === row.job_id;
        const asBuilt = { ...rest.asBuilt, items: rest.asBuilt.items.filter(own), runs: rest.asBuilt.runs.filter(own) };
        await db.query(`update packet_revisions set snapshot = $2 where id = $1`, [row.id, { ...rest, asBuilt }]);
      }
    });

    // The first job's revision 2 supersedes that packet and adds its speaker, on its own work date.
    const aIssued = await issue(a);
    const aSnapshot = await withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [aIssued.id])).rows[0].snapshot);
    expect(aSnapshot.whatChanged.supersedes).toMatchObject({ revisionId: gIssued.id, jobTitle: 'Hedge lights' });
    expect(aSnapshot.whatChanged.added.map((r: { id: string; jobTitle: string }) => `${r.id} ${r.jobTitle}`)).toEqual([`${draft.item.id} Garden speakers`]);
    expect(aSnapshot.asBuilt.items.map((i: { id: string }) => i.id)).toEqual(expect.arrayContaining([hedge, draft.item.id, first.speaker]));

    // The portal lists every packet of the site newest first; only the newest (of any job) is latest.
    await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: company.users.homeowner.id });
    // The portal lists ready packets only; the render itself is other tests' concern, so the revisions
    // not rendered yet are marked ready here with file keys that are never downloaded.
    await withDb((db) =>
      db.query(
        `update packet_revisions set status = 'ready', pdf_key = coalesce(pdf_key, 'unrendered.pdf'), pdf_sha256 = coalesce(pdf_sha256, ''),
           zip_key = coalesce(zip_key, 'unrendered.zip'), zip_sha256 = coalesce(zip_sha256, '')
         where job_id in (select id from jobs where site_id = $1)`,
        [siteId],
      ),
    );
    const homeowner = apiAs(app, await signIn(app, company.users.homeowner));
    const { packets } = await homeowner.expectOk('get', `/api/portal/sites/${siteId}`);
    expect(packets.map((p: { jobTitle: string; revision: number; isLatest: boolean }) => `${p.jobTitle} ${p.revision} ${p.isLatest}`)).toEqual([
      'Garden speakers 2 true',
      'Hedge lights 1 false',
      'Fire pit zone 1 false',
      'Garden speakers 1 false',
    ]);
  });
  it('keeps another open job’s unissued amplifier setting out of other jobs’ view and packet; undo puts it back', async () => {
    const channelId = first.amp.channels[0]!.id;
    const setupPath = `/items/${first.amp.id}/channels/${channelId}/setup`;
    const snapshotOf = async (revisionId: string) =>
      withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [revisionId])).rows[0].snapshot);
    // A job sets the channel to -12 dB and issues it: that is the site's record of the setting.
    const commissioning = await openJob('Amp commissioning');
    await commissioning.write('put', setupPath, { source: 'Streamer', gain: '-12 dB' });
    const commissioned = await snapshotOf((await issue(commissioning.job())).id);
    expect(commissioned.whatChanged.changed).toEqual([expect.objectContaining({ kind: 'item', id: first.amp.id, label: 'Pool house amplifier', jobTitle: 'Amp commissioning' })]);

    const h = await openJob('Amp tune-up');
    await h.write('put', setupPath, { source: 'Streamer', gain: '-6 dB' });
    expect((await h.asBuilt()).records.channelSetups[channelId]).toMatchObject({ source: 'Streamer', gain: '-6 dB' });

    // Another open job sees the setting as issued, cannot change it meanwhile, and its packet prints -12 dB.
    const i = await openJob('Side yard speaker');
    await i.write('post', '/items', speaker('Side yard speaker'));
    expect((await i.asBuilt()).records.channelSetups[channelId]).toMatchObject({ source: 'Streamer', gain: '-12 dB' });
    const refused = await i.send('put', setupPath, { gain: '-3 dB' });
    expect(refused.status).toBe(409);
    expect(refused.body).toMatchObject({ code: 'RECORD_CHANGED_BY_OTHER_JOB' });
    expect(refused.body.message).toContain('item "Pool house amplifier"');
    expect(refused.body.message).toContain('Amp tune-up');
    const iSnapshot = await snapshotOf((await issue(i.job())).id);
    expect(iSnapshot.channelSetups[channelId]).toMatchObject({ source: 'Streamer', gain: '-12 dB' });
    expect(iSnapshot.siteRecords[first.amp.id].changedBy.map((c: { jobTitle: string }) => c.jobTitle)).toEqual(['Amp commissioning']);
    expect(iSnapshot.whatChanged.changed.map((r: { id: string }) => r.id)).not.toContain(first.amp.id);

    // Undo restores the setting itself, not only the amplifier's fields.
    await h.write('delete', `/site-changes/${first.amp.id}`);
    const gain = async () => withDb(async (db) => (await db.query(`select gain from amplifier_channels where id = $1`, [channelId])).rows[0].gain);
    expect(await gain()).toBe('-12 dB');

    // Changed again and issued: from then on every job sees -6 dB.
    await h.write('put', setupPath, { source: 'Streamer', gain: '-6 dB' });
    const hSnapshot = await snapshotOf((await issue(h.job())).id);
    expect(hSnapshot.channelSetups[channelId]).toMatchObject({ gain: '-6 dB' });
    expect(hSnapshot.whatChanged.changed).toEqual([expect.objectContaining({ kind: 'item', id: first.amp.id, jobTitle: 'Amp tune-up' })]);
    const later = await openJob('Later look');
    expect((await later.asBuilt()).records.channelSetups[channelId]).toMatchObject({ gain: '-6 dB' });
  });

  it('records a reopened job’s removal of a record it had issued (with its date) instead of deleting it; a record never issued is deleted', async () => {
    expect(gateSpeaker).not.toBe('');
    const version = (await office.expectOk('get', `/api/jobs/${first.job.id}`)).version as number;
    const a = writer(await moveJob(office, { ...first.job, version }, 'in_progress'));
    const k = await openJob('Path lights');
    const row = async (id: string) =>
      withDb(async (db) => (await db.query(`select job_id, removed_by_job_id, removed_on::text from items where id = $1`, [id])).rows[0]);

    // The Gate speaker went into the ground with revision 2: taking it out now is a dated removal by the job.
    expect((await a.asBuilt()).records.siteRecords[gateSpeaker]).toMatchObject({ isThisJob: true, isIssued: true });
    await a.write('delete', `/items/${gateSpeaker}`);
    expect(await row(gateSpeaker)).toEqual({ job_id: first.job.id, removed_by_job_id: first.job.id, removed_on: '2026-05-14' });
    let view = await a.asBuilt();
    expect(view.asBuilt.items.map((i: { id: string }) => i.id)).not.toContain(gateSpeaker);
    expect(view.records.removedByThisJob).toEqual([{ kind: 'item', id: gateSpeaker, label: 'Gate speaker', removedOn: '2026-05-14' }]);
    // Not issued yet: for another open job the speaker is still in the ground, held by the first job.
    expect((await k.asBuilt()).asBuilt.items.map((i: { id: string }) => i.id)).toContain(gateSpeaker);
    const refused = await k.send('put', `/items/${gateSpeaker}`, speaker('Gate speaker, moved'));
    expect(refused.status).toBe(409);
    expect(refused.body).toMatchObject({ code: 'RECORD_CHANGED_BY_OTHER_JOB' });
    expect(refused.body.message).toContain('item "Gate speaker"');
    expect(refused.body.message).toContain('Garden speakers');

    // Put back (undo), it is the job's issued record again.
    await a.write('delete', `/site-changes/${gateSpeaker}`);
    expect(await row(gateSpeaker)).toMatchObject({ removed_by_job_id: null, removed_on: null });
    view = await a.asBuilt();
    expect(view.asBuilt.items.map((i: { id: string }) => i.id)).toContain(gateSpeaker);

    // A speaker added and deleted within this revision never was in the ground: its row goes.
    const temporary = (await a.write('post', '/items', speaker('Temporary speaker'))).item.id;
    expect((await a.asBuilt()).records.siteRecords[temporary]).toMatchObject({ isThisJob: true, isIssued: false });
    await a.write('delete', `/items/${temporary}`);
    expect(await row(temporary)).toBeUndefined();

    // Removed again and issued: revision 3 says what was removed, when and by which job; it is gone for everyone.
    await a.write('delete', `/items/${gateSpeaker}`);
    const issued = await issue(a.job());
    const snapshot = await withDb(async (db) => (await db.query(`select snapshot from packet_revisions where id = $1`, [issued.id])).rows[0].snapshot);
    expect(snapshot.revision).toBe(3);
    expect(snapshot.siteRecords[first.speaker]).not.toHaveProperty('isIssued');
    expect(snapshot.whatChanged.removed).toEqual([{ kind: 'item', id: gateSpeaker, label: 'Gate speaker', on: '2026-05-14', jobTitle: 'Garden speakers' }]);
    expect((await k.asBuilt()).asBuilt.items.map((i: { id: string }) => i.id)).not.toContain(gateSpeaker);
    expect(await row(gateSpeaker)).toMatchObject({ removed_by_job_id: first.job.id, removed_on: '2026-05-14' });
  });
  describe('a reopened job’s changes to the same record (one change row per issue)', () => {
    let pondSite = '';
    const pond = {} as { job: JobFixture; amp: string; speaker: string; run: string; spare: string; spareEnd: string };
    let rework: ReturnType<typeof writer>;
    let revision1 = '';
    const runBody = (label: string, extra: object = {}) => {
      const channel = { amplifierItemId: pond.amp, channelId: pondChannel };
      return run(label, pond.amp, pond.speaker, channel, extra);
    };
    const spareBody = (label: string, extra: object = {}) => run(label, pond.amp, pond.spareEnd, null, { isSpare: true, ...extra });
    let pondChannel = '';
    const runOf = (view: { asBuilt: { runs: { id: string }[] } }, id: string) => view.asBuilt.runs.find((r) => r.id === id);

    beforeAll(async () => {
      // A site of its own: the tests above leave open jobs holding records of the first site.
      ({ siteId: pondSite } = await createSite(office));
      const p = await openJob('Pond lights', pondSite);
      const amp = (await p.write('post', '/items', { ...AMP, label: 'Pond amplifier' })).item;
      pond.amp = amp.id;
      pondChannel = amp.channels[0]!.id;
      pond.speaker = (await p.write('post', '/items', speaker('Pond speaker'))).item.id;
      pond.spareEnd = (await p.write('post', '/items', { kind: 'spare_end', label: 'Spare end by the reeds', isCapped: true })).item.id;
      pond.run = (await p.write('post', '/runs', runBody('Amp to pond speaker'))).run.id;
      pond.spare = (await p.write('post', '/runs', spareBody('Spare to the reeds'))).run.id;
      await withDb((db) => db.query(`update jobs set start_date = '2026-08-03', end_date = '2026-08-04' where id = $1`, [p.job().id]));
      pond.job = p.job();
      await issue(pond.job);

      // A later job relabels the pond run and abandons the spare run, and issues that as its revision 1.
      rework = await openJob('Pond rework', pondSite);
      await withDb((db) => db.query(`update jobs set start_date = '2027-03-01', end_date = '2027-03-03' where id = $1`, [rework.job().id]));
      await rework.write('put', `/runs/${pond.run}`, runBody('Pond run, relabelled'));
      await rework.write('put', `/runs/${pond.spare}`, spareBody('Spare to the reeds', { isAbandoned: true }));
      revision1 = (await issue(rework.job())).id;
    });

    it('keeps the issued change when the reopened job changes the record again, and undo goes back to the issued state', async () => {
      const [issued] = await changeRows(rework.job().id, pond.run);
      expect(issued).toMatchObject({ change: 'changed', changed_on: '2027-03-03', before: { record: { label: 'Amp to pond speaker' } } });
      expect(issued!.issued_at).not.toBeNull();

      // Reopened for revision 2, on a later work date: a further change to the same run is a row of its own,
      // starting from the run as revision 1 issued it; the revision-1 row is untouched.
      rework = await reopen(rework.job());
      await withDb((db) => db.query(`update jobs set end_date = '2027-08-10' where id = $1`, [rework.job().id]));
      await rework.write('put', `/runs/${pond.run}`, runBody('Pond run, third label'));
      const rows = await changeRows(rework.job().id, pond.run);
      expect(rows).toHaveLength(2);
      expect(rows[0]).toEqual(issued);
      expect(rows[1]).toMatchObject({ change: 'changed', changed_on: '2027-08-10', issued_at: null, before: { record: { label: 'Pond run, relabelled' } } });
      // Provenance keeps both: revision 1's issued change with its date, and this revision's.
      const view = await rework.asBuilt();
      expect(view.records.siteRecords[pond.run].changedBy).toEqual([
        { jobId: rework.job().id, jobTitle: 'Pond rework', change: 'changed', on: '2027-03-03', isIssued: true },
        { jobId: rework.job().id, jobTitle: 'Pond rework', change: 'changed', on: '2027-08-10', isIssued: false },
      ]);

      // Undo takes back only this revision's change: the run is exactly as revision 1 froze it.
      await rework.write('delete', `/site-changes/${pond.run}`);
      expect(await changeRows(rework.job().id, pond.run)).toEqual([issued]);
      const frozen = runOf(await snapshotOf(revision1), pond.run);
      expect(runOf(await rework.asBuilt(), pond.run)).toEqual(frozen);
      expect((await rework.asBuilt()).records.siteRecords[pond.run].changedBy).toEqual([
        { jobId: rework.job().id, jobTitle: 'Pond rework', change: 'changed', on: '2027-03-03', isIssued: true },
      ]);
      // Nothing left to undo: an issued change is part of revision 1.
      const nothing = await rework.send('delete', `/site-changes/${pond.run}`);
      expect(nothing.status).toBe(404);
      expect(nothing.body.code).toBe('CHANGE_NOT_FOUND');
      expect(runOf(await rework.asBuilt(), pond.run)).toEqual(frozen);
    });

    it('still answers 409 to another open job while the reopened job holds the record, and not once it is undone', async () => {
      const other = await openJob('Pond pump', pondSite);
      // Only issued changes: the run is free for any job; the reopened job's new change holds it again.
      const [first, second] = await Promise.all([
        rework.send('put', `/runs/${pond.run}`, runBody('Pond run, raced by the rework')),
        other.send('put', `/runs/${pond.run}`, runBody('Pond run, raced by the pump')),
      ]);
      expect([first.status, second.status].sort()).toEqual([200, 409]);
      const [winner, loser] = first.status === 200 ? [rework, other] : [other, rework];
      const refused = first.status === 200 ? second : first;
      expect(refused.body).toMatchObject({ code: 'RECORD_CHANGED_BY_OTHER_JOB', message: expect.stringContaining(first.status === 200 ? 'Pond rework' : 'Pond pump') });
      expect((await loser.send('put', `/runs/${pond.run}`, runBody('Again'))).status).toBe(409);
      // At most one unissued change per record across the site; the rework's issued row is still there.
      const open = await withDb(async (db) => (await db.query(`select count(*)::int as n from site_record_changes where record_id = $1 and issued_at is null`, [pond.run])).rows[0].n);
      expect(open).toBe(1);
      expect((await changeRows(rework.job().id, pond.run))[0]).toMatchObject({ changed_on: '2027-03-03', before: { record: { label: 'Amp to pond speaker' } } });
      await winner.write('delete', `/site-changes/${pond.run}`);
      expect((await loser.send('put', `/runs/${pond.run}`, runBody('Again'))).status).toBe(200);
      await loser.write('delete', `/site-changes/${pond.run}`);
      // Held by the reopened job again: the other job is refused, naming it.
      await rework.write('put', `/runs/${pond.run}`, runBody('Pond run, revision 2'));
      const held = await other.send('put', `/runs/${pond.run}`, runBody('Pump label'));
      expect(held.status).toBe(409);
      expect(held.body.message).toContain('Pond rework');
    });

    it('issued twice with a change each time: both rows stay, revision 2’s What changed lists only the second', async () => {
      // Revision 2 also relabels the spare run revision 1 abandoned: a change, not a new abandonment.
      await rework.write('put', `/runs/${pond.spare}`, spareBody('Abandoned spare to the reeds', { isAbandoned: true }));
      const revision2 = (await issue(rework.job())).id;
      const rows = await changeRows(rework.job().id, pond.run);
      expect(rows.map((r) => `${r.changed_on} ${r.before.record.label} ${r.issued_at !== null}`)).toEqual([
        '2027-03-03 Amp to pond speaker true',
        '2027-08-10 Pond run, relabelled true',
      ]);
      expect((await changeRows(rework.job().id, pond.spare)).map((r) => `${r.change} ${r.changed_on}`)).toEqual(['abandoned 2027-03-03', 'changed 2027-08-10']);

      const snapshot = await snapshotOf(revision2);
      expect(snapshot.revision).toBe(2);
      expect(snapshot.whatChanged.supersedes).toMatchObject({ revisionId: revision1, jobTitle: 'Pond rework', revision: 1 });
      expect(snapshot.whatChanged.changed).toEqual([
        { kind: 'run', id: pond.run, label: 'Pond run, revision 2', on: '2027-08-10', jobTitle: 'Pond rework' },
        { kind: 'run', id: pond.spare, label: 'Abandoned spare to the reeds', on: '2027-08-10', jobTitle: 'Pond rework' },
      ]);
      expect([...snapshot.whatChanged.added, ...snapshot.whatChanged.abandoned, ...snapshot.whatChanged.removed]).toEqual([]);
      // Provenance in the packet (and so on its plan and the locate map) keeps both changes, with their
      // dates; the spare run stays abandoned since revision 1's date.
      expect(snapshot.siteRecords[pond.run].changedBy.map((c: { on: string; change: string }) => `${c.change} ${c.on}`)).toEqual(['changed 2027-03-03', 'changed 2027-08-10']);
      expect(snapshot.siteRecords[pond.spare].abandoned).toEqual({ jobId: rework.job().id, jobTitle: 'Pond rework', on: '2027-03-03' });
      expect(snapshot.siteRecords[pond.spare].changedBy.map((c: { on: string; change: string }) => `${c.change} ${c.on}`)).toEqual(['abandoned 2027-03-03', 'changed 2027-08-10']);
      // Revision 1 still says what it changed then.
      const first = await snapshotOf(revision1);
      expect(first.whatChanged.changed.map((r: { label: string; on: string }) => `${r.label} ${r.on}`)).toEqual(['Pond run, relabelled 2027-03-03']);
      expect(first.whatChanged.abandoned.map((r: { label: string; on: string }) => `${r.label} ${r.on}`)).toEqual(['Spare to the reeds 2027-03-03']);
      // A later job sees both changes in the run's history.
      const later = await openJob('Pond survey', pondSite);
      expect((await later.asBuilt()).records.siteRecords[pond.run].changedBy.map((c: { on: string; isIssued: boolean }) => `${c.on} ${c.isIssued}`)).toEqual([
        '2027-03-03 true',
        '2027-08-10 true',
      ]);
    });
  });
});
