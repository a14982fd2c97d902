import { screen, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';

import { buildSessionUser } from '../../../testing/data';
import { buildJobList, buildJobSummary } from '../../../testing/job-data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const page1 = buildJobList([buildJobSummary()], { total: 30 });
const page2 = buildJobList([buildJobSummary({ id: '7d1e2f30-1111-4a4a-9b9b-0000000000ff', title: 'Spa lights' })], { total: 30, page: 2 });

describe('JobsTable', () => {
  beforeEach(() => localStorage.clear());

  it('should ask for "my jobs" by default for a crew lead and reflect search, status and page in the request and the address', async () => {
    const fetchMock = mockApi({
      'GET /api/jobs?sort=-updatedAt&page=1&pageSize=25&mine=true': () => jsonResponse(page1),
      'GET /api/jobs?q=spa&sort=-updatedAt&page=1&pageSize=25&mine=true': () => jsonResponse(page1),
      'GET /api/jobs?q=spa&status=submitted&sort=-updatedAt&page=1&pageSize=25&mine=true': () => jsonResponse(page1),
      'GET /api/jobs?q=spa&status=submitted&sort=-updatedAt&page=2&pageSize=25&mine=true': () => jsonResponse(page2),
      'GET /api/jobs?q=spa&status=submitted&sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(page1),
    });
    const { user, router } = renderApp({ url: '/jobs', signedInAs: buildSessionUser('lead') });

    const grid = await screen.findByRole('grid', { name: 'Jobs' });
    expect(within(grid).getByRole('link', { name: 'Back-yard sound, phase 1' })).toBeInTheDocument();
    expect(screen.getByText('1–25 of 30 jobs')).toBeInTheDocument();

    await user.type(screen.getByRole('searchbox'), 'spa');
    await screen.findByText('1–25 of 30 jobs');
    await waitForRequest(fetchMock, 'q=spa&sort');
    expect(router.state.location.search).toBe('?q=spa');

    await user.click(screen.getByRole('combobox', { name: 'Status' }));
    await user.click(await screen.findByRole('menuitemcheckbox', { name: 'Submitted for review' }));
    await waitForRequest(fetchMock, 'status=submitted&sort=-updatedAt&page=1');
    expect(router.state.location.search).toBe('?q=spa&status=submitted');

    await user.click(screen.getByRole('button', { name: 'Next' }));
    await waitForRequest(fetchMock, 'page=2');
    expect(await screen.findByRole('link', { name: 'Spa lights' })).toBeInTheDocument();
    expect(router.state.location.search).toBe('?q=spa&status=submitted&page=2');

    // "All jobs" drops mine=true and says so in the address.
    await user.click(screen.getByRole('tab', { name: 'All jobs' }));
    await waitForRequest(fetchMock, 'page=1&pageSize=25', (url) => !url.includes('mine='));
    expect(router.state.location.search).toContain('mine=false');
  }, 30_000);

  it('should walk pages by cursor: Next sends the page’s nextCursor, Previous the cursor it came by, and a new sort starts again', async () => {
    const first = buildJobList([buildJobSummary()], { total: 60, nextCursor: 'c2' });
    const second = buildJobList([buildJobSummary({ id: '7d1e2f30-1111-4a4a-9b9b-0000000000f2', title: 'Spa lights' })], { total: 60, page: 2, nextCursor: 'c3' });
    const third = buildJobList([buildJobSummary({ id: '7d1e2f30-1111-4a4a-9b9b-0000000000f3', title: 'Pond pump' })], { total: 60, page: 3, nextCursor: null });
    const fetchMock = mockApi({
      'GET /api/jobs?sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(first),
      'GET /api/jobs?sort=-updatedAt&cursor=c2&pageSize=25': () => jsonResponse(second),
      'GET /api/jobs?sort=-updatedAt&cursor=c3&pageSize=25': () => jsonResponse(third),
      'GET /api/jobs?sort=title&page=1&pageSize=25': () => jsonResponse(first),
    });
    const { user, router } = renderApp({ url: '/jobs', signedInAs: buildSessionUser('office') });
    await screen.findByRole('grid', { name: 'Jobs' });

    await user.click(screen.getByRole('button', { name: 'Next' }));
    expect(await screen.findByRole('link', { name: 'Spa lights' })).toBeInTheDocument();
    expect(router.state.location.search).toBe('?page=2&cursor=c2');
    await user.click(screen.getByRole('button', { name: 'Next' }));
    expect(await screen.findByRole('link', { name: 'Pond pump' })).toBeInTheDocument();
    expect(screen.getByText('51–60 of 60 jobs')).toBeInTheDocument();
    expect(router.state.location.search).toBe('?page=3&cursor=c3');

    await user.click(screen.getByRole('button', { name: 'Previous' }));
    expect(await screen.findByRole('link', { name: 'Spa lights' })).toBeInTheDocument();
    expect(router.state.location.search).toBe('?page=2&cursor=c2');
    // Every page after the first was asked for by cursor, never by its number.
    expect(fetchMock.mock.calls.map(([input]) => String(input)).filter((url) => /[?&]page=[2-9]/.test(url))).toEqual([]);

    // A cursor belongs to its sort: choosing another starts again at page 1, without one.
    await user.click(within(screen.getByRole('grid', { name: 'Jobs' })).getByText('Job'));
    await waitForRequest(fetchMock, 'sort=title&page=1');
    expect(router.state.location.search).toBe('?sort=title');
  }, 30_000);

  it('should sort on the server when a column header is chosen', async () => {
    const fetchMock = mockApi({
      'GET /api/jobs?sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(page1),
      'GET /api/jobs?sort=title&page=1&pageSize=25': () => jsonResponse(page1),
    });
    const { user, router } = renderApp({ url: '/jobs', signedInAs: buildSessionUser('office') });
    const grid = await screen.findByRole('grid', { name: 'Jobs' });
    await user.click(within(grid).getByText('Job'));
    await waitForRequest(fetchMock, 'sort=title');
    expect(router.state.location.search).toBe('?sort=title');
  }, 30_000);
});

async function waitForRequest(
  fetchMock: ReturnType<typeof mockApi>,
  fragment: string,
  extra: (url: string) => boolean = () => true,
): Promise<void> {
  const { waitFor } = await import('@testing-library/react');
  await waitFor(() =>
    expect(
      fetchMock.mock.calls.some(([input]) => {
        const url = String(input);
        return url.includes(fragment) && extra(url);
      }),
    ).toBe(true),
  );
}
