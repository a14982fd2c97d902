import { createHash } from 'node:crypto';

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { pdfPages } from '../print/packet-pdf.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany, withDb } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, type JobFixture, moveJob } from '../support/records.js';

/*
 * Issue 21, "years later": a first job leaves a capped spare run to a spare end by the planter; a
 * second job on the same property connects a fire-pit speaker to that spare end and the first job's
 * amplifier channel (in the browser, on the job page), and is issued. Its packet's analysis carries the
 * first job's load; the locate map shows both runs with when they went in and by which job; revision 1's
 * files are byte-identical to what they were.
 */

const PHONE = { width: 390, height: 844 };
const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

async function signIn(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

describe('a later job builds on what the first job left in the ground (issue 21)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let siteId: string;
  const first = {} as { job: JobFixture; revisionId: string; pdf: Buffer; zip: Buffer; ampId: string; channelId: string; spareEnd: string; spareRun: string; liveRun: string };

  const download = async (path: string) => {
    const res = await fetch(`${baseUrl}${path}`, { headers: { Authorization: `Bearer ${await token()}` } });
    expect(res.status, path).toBe(200);
    return Buffer.from(await res.arrayBuffer());
  };
  const token = async () => {
    const res = await fetch(`${baseUrl}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: company.users.office.email, password: TEST_PASSWORD }) });
    return ((await res.json()) as { accessToken: string }).accessToken;
  };

  /** Writes to a job as the lead, keeping its version. */
  const writer = (job: JobFixture) => {
    let version = job.version;
    return {
      write: async (method: 'post' | 'put', path: string, body: object) => {
        const res = await lead.expectOk(method, `/api/jobs/${job.id}${path}`, body, { 'If-Match': `"${version}"` });
        version = res.jobVersion;
        return res;
      },
      job: () => ({ ...job, version }),
    };
  };

  /** Ready to issue, issued with its must-fix findings acknowledged, and rendered. */
  async function issue(job: JobFixture): Promise<string> {
    const ready = await moveJob(office, await moveJob(lead, job, 'submitted'), 'ready_to_issue');
    const { analysis } = await office.expectOk('get', `/api/jobs/${job.id}/as-built`);
    const acknowledgements = (analysis.findings as { severity: string; code: string; path: (string | number)[] }[])
      .filter((f) => f.severity === 'critical')
      .map((f) => ({ code: f.code, path: f.path.join('.'), reason: 'Accepted for this journey.' }));
    const issued = await office.expectOk('post', `/api/jobs/${job.id}/packets`, { acknowledgements }, { 'If-Match': `"${ready.version}"` });
    const deadline = Date.now() + 120_000;
    for (;;) {
      const body = await office.expectOk('get', `/api/packets/${issued.id}`);
      if (body.status === 'ready') return issued.id as string;
      if (body.status === 'failed' || Date.now() > deadline) throw new Error(`packet ${body.status}: ${body.failureReason}`);
      await new Promise((resolve) => setTimeout(resolve, 300));
    }
  }

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

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Site System Journey');
    office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    lead = (await httpApiAs(baseUrl, company.users.lead)) as unknown as Api;
    ({ siteId } = await createSite(office));

    // The first job, recorded through the API (positions placed by hand so the map can draw the runs).
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    await office.expectOk('patch', `/api/jobs/${created.id}`, { title: 'Garden speakers', startDate: '2026-05-11', endDate: '2026-05-14', expectedVersion: created.version });
    const a = writer(await moveJob(lead, { ...created, version: created.version + 1 }, 'in_progress'));
    const amp = (await a.write('post', '/items', { kind: 'amplifier', label: 'Pool house amplifier', channels: [{ name: 'Garden' }], ratedWatts8Ohm: 100, ratedWatts4Ohm: 160, minimumImpedanceOhm: 4, position: { x: 0, y: 0, source: 'manual' } })).item;
    const lawn = (await a.write('post', '/items', { kind: 'speaker', label: 'Lawn speaker', nominalImpedanceOhm: 8, position: { x: 10, y: 0, source: 'manual' } })).item.id;
    first.spareEnd = (await a.write('post', '/items', { kind: 'spare_end', label: 'Spare end by the planter', isCapped: true, position: { x: 0, y: 8, source: 'manual' } })).item.id;
    first.ampId = amp.id;
    first.channelId = amp.channels[0].id;
    first.liveRun = (await a.write('post', '/runs', run('Amp to lawn speaker', amp.id, lawn, { amplifierItemId: amp.id, channelId: first.channelId }, { measuredLengthM: 10 }))).run.id;
    first.spareRun = (await a.write('post', '/runs', run('Spare to planter', amp.id, first.spareEnd, null, { isSpare: true, measuredLengthM: 8 }))).run.id;
    first.job = a.job();
    first.revisionId = await issue(first.job);
    first.pdf = await download(`/api/packets/${first.revisionId}/pdf`);
    first.zip = await download(`/api/packets/${first.revisionId}/archive.zip`);
  }, 240_000);

  afterAll(async () => {
    await browser?.close();
  });

  it('connects the second job to the spare end and channel, issues it, and shows both jobs’ runs with dates', async () => {
    // The second job on the same property; its new speaker recorded through the API.
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    await office.expectOk('patch', `/api/jobs/${created.id}`, { title: 'Fire pit zone', startDate: '2027-04-02', endDate: '2027-04-02', expectedVersion: created.version });
    const b = writer(await moveJob(lead, { ...created, version: created.version + 1 }, 'in_progress'));
    await b.write('post', '/items', { kind: 'speaker', label: 'Fire pit speaker', nominalImpedanceOhm: 8, position: { x: 6, y: 12, source: 'manual' } });

    // On the job page, the lead sees the first job's records as already in the ground, and runs the
    // new cable from the first job's spare end on the first job's amplifier channel.
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true, locale: 'en-US', timezoneId: 'UTC' });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    await page.goto(`${baseUrl}/jobs/${created.id}`);
    await signIn(page, company.users.lead.email);
    const spare = page.getByRole('listitem', { name: 'Run Spare to planter' });
    await expect.poll(() => spare.getByRole('note').textContent()).toContain('Already in the ground: installed May 14, 2026 by “Garden speakers”. Read-only until this job changes it.');
    await page.getByRole('button', { name: 'Add run' }).click();
    const form = page.getByRole('form', { name: 'New run' });
    await form.getByLabel(/^Name/).fill('Planter to fire pit');
    await form.getByLabel(/^From/).selectOption({ label: 'Spare end by the planter (spare end)' });
    await form.getByLabel(/^To/).selectOption({ label: 'Fire pit speaker (speaker)' });
    await form.getByLabel(/^Cable type/).fill('14/2 direct burial');
    await form.getByLabel(/^Gauge/).fill('14');
    await form.getByLabel(/^Measured length/).fill('7 m');
    await form.getByLabel('Pair 1 carries').selectOption({ label: 'Pool house amplifier · Garden' });
    await form.getByRole('button', { name: 'Add run' }).click();
    const newRun = page.getByRole('listitem', { name: 'Run Planter to fire pit' });
    await newRun.waitFor();
    expect(await newRun.getByRole('note').count()).toBe(0);
    await context.close();

    // The spare run goes live on the channel (a change by this job to the first job's record).
    const asBuilt = await lead.expectOk('get', `/api/jobs/${created.id}/as-built`);
    const newRunId = (asBuilt.asBuilt.runs as { id: string; label: string }[]).find((r) => r.label === 'Planter to fire pit')!.id;
    const channel = { amplifierItemId: first.ampId, channelId: first.channelId };
    const version = asBuilt.job.version as number;
    const live = await lead.expectOk('put', `/api/jobs/${created.id}/runs/${first.spareRun}`, run('Spare to planter', first.ampId, first.spareEnd, channel, { measuredLengthM: 8 }), { 'If-Match': `"${version}"` });
    const reading = await lead.expectOk('post', `/api/jobs/${created.id}/runs/${newRunId}/depth-readings`, { stationM: 3, depthM: 0.2 }, { 'If-Match': `"${live.jobVersion}"` });
    const revisionId = await issue({ id: created.id, siteId, version: reading.jobVersion });

    // The second packet's analysis carries the first job's load: lawn 8 Ω ∥ fire pit 8 Ω on one channel,
    // 1/R = 1/8 + 1/8, R = 4 Ω (parallel resistance; Horowitz & Hill, The Art of Electronics, 3rd ed.,
    // §1.2.2 — from memory); no open-circuit finding for the new speaker.
    const snapshot = await withDb(async (db) => (await db.query('select snapshot from packet_revisions where id = $1', [revisionId])).rows[0].snapshot);
    const load = (snapshot.analysis.channels as { channel: { channelId: string }; loadOhmNominal: number }[]).find((c) => c.channel.channelId === first.channelId)!;
    expect(load.loadOhmNominal).toBeCloseTo(4, 6);
    expect((snapshot.analysis.findings as { code: string }[]).map((f) => f.code)).not.toContain('CHANNEL_OPEN');
    const pages = await pdfPages(await download(`/api/packets/${revisionId}/pdf`));
    const whatChanged = pages.find((p) => p.includes('supersedes revision 1 of "Garden speakers"'));
    expect(whatChanged, 'What changed page').toBeDefined();
    expect(whatChanged).toContain('Planter to fire pit');

    // The locate map: both jobs' runs drawn, each with when it went in and by which job.
    const link = await office.expectOk('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 7, note: 'Fence crew' });
    const viewer = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true, locale: 'en-US', timezoneId: 'UTC' });
    const map = await viewer.newPage();
    map.on('pageerror', (error) => errors.push(error.message));
    await map.goto(`${baseUrl}${new URL(link.url as string).pathname}`);
    for (const id of [first.liveRun, first.spareRun, newRunId]) await map.locator(`[data-testid="locate-map"] [data-run-id="${id}"]`).waitFor({ state: 'attached' });
    const body = (await map.locator('body').textContent()) ?? '';
    expect(body).toContain('Installed May 14, 2026 by “Garden speakers”');
    expect(body).toContain('Installed Apr 2, 2027 by “Fire pit zone”');
    await viewer.close();
    expect(errors).toEqual([]);

    // Revision 1's files are byte-identical.
    expect(sha256(await download(`/api/packets/${first.revisionId}/pdf`))).toBe(sha256(first.pdf));
    expect(sha256(await download(`/api/packets/${first.revisionId}/archive.zip`))).toBe(sha256(first.zip));
  }, 240_000);
});
