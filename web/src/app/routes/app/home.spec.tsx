import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { buildDelivery } from '../../../features/delivery/components/delivery-fixtures';
import { buildSessionUser } from '../../../testing/data';
import { buildJobList, buildJobSummary } from '../../../testing/job-data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

// The queries the home pages ask (features/home/api/get-home-jobs.ts through the jobs list's query string).
const TODAY = 'GET /api/jobs?status=draft%2Cin_progress%2Csubmitted%2Cready_to_issue&sort=-updatedAt&page=1&pageSize=25&mine=true';
const TO_REVIEW = 'GET /api/jobs?status=submitted&sort=updatedAt&page=1&pageSize=25';
const TO_ISSUE = 'GET /api/jobs?status=ready_to_issue&sort=updatedAt&page=1&pageSize=25';

const drafted = buildJobSummary({ id: '7d1e2f30-2222-4a4a-9b9b-000000000001', title: 'Front walk path lights', status: 'draft', startDate: '2026-05-02' });
const underway = buildJobSummary({ id: '7d1e2f30-2222-4a4a-9b9b-000000000002', title: 'Pool deck satellites', status: 'in_progress', startDate: '2026-05-01' });
const waiting = buildJobSummary({ id: '7d1e2f30-2222-4a4a-9b9b-000000000003', title: 'Orchard bollards', status: 'submitted', startDate: '2026-04-10' });

describe('HomeRoute: Today (crew lead and technician)', () => {
  it("should land a crew lead on Today with their open jobs, the one in progress first, each with its next step and link", async () => {
    const fetchMock = mockApi({ [TODAY]: () => jsonResponse(buildJobList([waiting, drafted, underway])) });

    renderApp({ url: '/', signedInAs: buildSessionUser('lead') });

    expect(await screen.findByRole('heading', { name: 'Today' }, { timeout: 20_000 })).toBeInTheDocument();
    const list = screen.getByRole('list', { name: 'Your open jobs' });
    const rows = within(list).getAllByRole('link');
    expect(rows.map((row) => row.textContent)).toEqual([
      expect.stringContaining('Pool deck satellites'),
      expect.stringContaining('Front walk path lights'),
      expect.stringContaining('Orchard bollards'),
    ]);
    expect(rows[0]).toHaveAttribute('href', `/jobs/${underway.id}`);
    expect(rows[0]).toHaveTextContent('Next: Record what went in the ground, then submit it for review');
    expect(rows[1]).toHaveTextContent('Next: Start the job when the crew is on site');
    expect(rows[2]).toHaveTextContent('Next: Nothing to do: the office is reviewing it');
    expect(within(rows[0]!).getByText('In progress')).toBeInTheDocument();
    // Only the caller's own jobs, never an issued one.
    expect(fetchMock.mock.calls.map(([url]) => String(url))).toContain(TODAY.replace('GET ', ''));
    // The server's health is no longer the home page: it has its own page in the menu.
    expect(screen.queryByText('Everything is working')).not.toBeInTheDocument();
    const nav = screen.getByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'System status' })).toHaveAttribute('href', '/status');
  }, 40_000);

  it("should give a technician the technician's next step", async () => {
    mockApi({ [TODAY]: () => jsonResponse(buildJobList([underway])) });

    renderApp({ url: '/', signedInAs: buildSessionUser('tech') });

    const row = within(await screen.findByRole('list', { name: 'Your open jobs' }, { timeout: 20_000 })).getByRole('link');
    expect(row).toHaveTextContent('Next: Add depth readings, checks and photos before the trench is filled');
  }, 40_000);

  it('should say so when the lead is on no open job', async () => {
    mockApi({ [TODAY]: () => jsonResponse(buildJobList([])) });

    renderApp({ url: '/', signedInAs: buildSessionUser('lead') });

    expect(await screen.findByText(/You are on no open job/, {}, { timeout: 20_000 })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'All your jobs, issued ones too' })).toHaveAttribute('href', '/jobs?mine=true');
  }, 40_000);

  it('should say the jobs could not be loaded rather than show an empty day', async () => {
    mockApi({ [TODAY]: () => jsonResponse({ statusCode: 503, message: 'Database busy' }, 503) });

    renderApp({ url: '/', signedInAs: buildSessionUser('lead') });

    expect(await screen.findByRole('alert', {}, { timeout: 20_000 })).toHaveTextContent('Your jobs could not be loaded');
    expect(screen.queryByText(/You are on no open job/)).not.toBeInTheDocument();
  });
});

describe('HomeRoute: work queue (office and admin)', () => {
  it('should land the office on the work queue: jobs to review, jobs ready to issue and failed packet e-mails', async () => {
    const ready = buildJobSummary({ id: '7d1e2f30-2222-4a4a-9b9b-000000000004', title: 'Terrace subwoofer', status: 'ready_to_issue' });
    mockApi({
      [TO_REVIEW]: () => jsonResponse(buildJobList([waiting])),
      [TO_ISSUE]: () => jsonResponse(buildJobList([ready])),
      'GET /api/deliveries/failed': () =>
        jsonResponse([
          {
            ...buildDelivery({ status: 'failed', failureReason: 'The mailbox does not exist.', attempts: 3 }),
            revision: 1,
            jobId: ready.id,
            jobTitle: 'Terrace subwoofer',
            siteId: ready.site.id,
            siteLabel: 'Thistledown garden',
          },
        ]),
      'GET /api/outbox/status': () => jsonResponse({ captured: true, destination: null }),
    });

    renderApp({ url: '/', signedInAs: buildSessionUser('office') });

    expect(await screen.findByRole('heading', { name: 'Work queue' }, { timeout: 20_000 })).toBeInTheDocument();
    const review = screen.getByRole('region', { name: 'To review (1)' });
    const reviewRow = within(within(review).getByRole('list', { name: 'To review' })).getByRole('link');
    expect(reviewRow).toHaveAttribute('href', `/jobs/${waiting.id}`);
    expect(reviewRow).toHaveTextContent('Next: Review the record, then mark it ready to issue or send it back');
    const issue = screen.getByRole('region', { name: 'Ready to issue (1)' });
    expect(within(issue).getByRole('link', { name: /Terrace subwoofer/ })).toHaveTextContent('Next: Issue the handover packet to the homeowner');
    expect(within(issue).getByRole('link', { name: 'Open in the jobs list' })).toHaveAttribute('href', '/jobs?status=ready_to_issue');
    const failed = screen.getByRole('region', { name: 'Packets that did not reach the homeowner' });
    expect(within(failed).getByText(/The mailbox does not exist/)).toBeInTheDocument();
  }, 40_000);

  it('should say when nothing waits for the admin', async () => {
    mockApi({
      [TO_REVIEW]: () => jsonResponse(buildJobList([])),
      [TO_ISSUE]: () => jsonResponse(buildJobList([])),
      'GET /api/deliveries/failed': () => jsonResponse([]),
      'GET /api/outbox/status': () => jsonResponse({ captured: true, destination: null }),
    });

    renderApp({ url: '/', signedInAs: buildSessionUser('admin') });

    expect(await screen.findByText('No job is waiting for review.', {}, { timeout: 20_000 })).toBeInTheDocument();
    expect(screen.getByText('No job is waiting to be issued.')).toBeInTheDocument();
    expect(screen.getByRole('region', { name: 'To review (0)' })).toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Packets that did not reach the homeowner' })).not.toBeInTheDocument();
  });
});

describe('HomeRoute: homeowner', () => {
  it('should send a homeowner to their property, and their menu has no contractor home page', async () => {
    mockApi({ 'GET /api/portal/sites': () => jsonResponse([]) });

    const { router } = renderApp({ url: '/', signedInAs: buildSessionUser('homeowner') });

    const nav = await screen.findByRole('navigation', { name: 'Main' }, { timeout: 20_000 });
    await expect.poll(() => router.state.location.pathname).toBe('/portal');
    const links = within(nav).getAllByRole('link');
    expect(links[0]).toHaveAccessibleName('My property');
    expect(links[0]).toHaveAttribute('href', '/portal');
    expect(links.map((link) => link.getAttribute('href'))).not.toContain('/');
  });
});
