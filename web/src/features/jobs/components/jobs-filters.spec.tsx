import { screen, waitFor } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';

import { buildSessionUser } from '../../../testing/data';
import { buildJobList, buildJobSummary } from '../../../testing/job-data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const list = buildJobList([buildJobSummary()]);

function requested(fetchMock: ReturnType<typeof mockApi>): string[] {
  return fetchMock.mock.calls.map(([input]) => String(input));
}

describe('JobsFilters', () => {
  beforeEach(() => localStorage.clear());

  it('should filter by several statuses at once, in the request and the address, and clear them', async () => {
    const fetchMock = mockApi({
      'GET /api/jobs?status=draft&sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(list),
      'GET /api/jobs?status=draft%2Csubmitted&sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(list),
      'GET /api/jobs?status=submitted&sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(list),
      'GET /api/jobs?sort=-updatedAt&page=1&pageSize=25': () => jsonResponse(list),
    });
    const { user, router } = renderApp({ url: '/jobs?status=draft', signedInAs: buildSessionUser('office') });
    const status = await screen.findByRole('combobox', { name: 'Status' }, { timeout: 10_000 });
    expect(status).toHaveValue('Draft');

    await user.click(status);
    await user.click(await screen.findByRole('menuitemcheckbox', { name: 'Submitted for review' }, { timeout: 10_000 }));
    await waitFor(() => expect(router.state.location.search).toBe('?status=draft%2Csubmitted'));
    await waitFor(() => expect(requested(fetchMock).some((url) => url.includes('status=draft%2Csubmitted&sort'))).toBe(true));
    await waitFor(() => expect(screen.getByRole('combobox', { name: 'Status' })).toHaveValue('Draft, Submitted for review'));

    // A multi-select list stays open: a second tap takes Draft off again.
    await user.click(screen.getByRole('menuitemcheckbox', { name: 'Draft', checked: true }));
    await waitFor(() => expect(router.state.location.search).toBe('?status=submitted'));
    await waitFor(() => expect(requested(fetchMock).some((url) => url.includes('?status=submitted&sort'))).toBe(true));
  }, 30_000);

  it('should read a status repeated in the address, drop unknown ones, and keep "my jobs" for a crew lead', async () => {
    const fetchMock = mockApi({
      'GET /api/jobs?status=draft%2Cissued&sort=-updatedAt&page=1&pageSize=25&mine=true': () => jsonResponse(list),
    });
    renderApp({ url: '/jobs?status=draft&status=finished,issued', signedInAs: buildSessionUser('lead') });
    expect(await screen.findByRole('combobox', { name: 'Status' }, { timeout: 10_000 })).toHaveValue('Draft, Issued');
    await waitFor(() => expect(requested(fetchMock)).toContain('/api/jobs?status=draft%2Cissued&sort=-updatedAt&page=1&pageSize=25&mine=true'));
    expect(screen.getByRole('tab', { name: 'My jobs', selected: true })).toBeInTheDocument();
  }, 30_000);
});
