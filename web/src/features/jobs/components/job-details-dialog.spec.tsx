import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';

import { buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const JOB_URL = `/jobs/${JOB_IDS.job}`;
const USERS = [
  buildUserResponse('admin'),
  buildUserResponse('office'),
  buildUserResponse('lead'),
  buildUserResponse('tech'),
  buildUserResponse('tech', { id: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a14', name: 'Bram Quillon', email: 'bram@fernhollow.example' }),
  buildUserResponse('homeowner'),
];

async function openDialog(user: ReturnType<typeof renderApp>['user']) {
  await user.click(await screen.findByRole('button', { name: 'Crew and dates' }, { timeout: 10_000 }));
  const heading = await screen.findByText('Crew and dates', { selector: 'h2' }, { timeout: 10_000 });
  return within(heading.closest<HTMLElement>('[role="dialog"]')!);
}

describe('JobDetailsDialog', () => {
  beforeEach(() => localStorage.clear());

  it('should let the office change technicians and dates, sending only what changed on the current version', async () => {
    const patches: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage(USERS)),
      [`PATCH /api/jobs/${JOB_IDS.job}`]: (request) => {
        patches.push(request);
        return jsonResponse({ ...buildJobAsBuilt().job, version: 4 });
      },
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('office') });
    const dialog = await openDialog(user);
    expect(dialog.getByLabelText('Crew lead')).toHaveValue(buildSessionUser('lead').id);

    await user.click(dialog.getByLabelText('Technicians'));
    // Only technicians and crew leads of the company are offered, never a homeowner or the office.
    const options = (await screen.findAllByRole('menuitemcheckbox')).map((option) => option.textContent);
    expect(options).toEqual(['Ossian Brackley (crew lead)', 'Ines Farrow (technician)', 'Bram Quillon (technician)']);
    await user.click(screen.getByRole('menuitemcheckbox', { name: 'Bram Quillon (technician)' }));
    await user.keyboard('{Escape}');
    await user.type(dialog.getByLabelText('Finish date'), '2026-04-24');
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));

    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.headers.get('If-Match')).toBe('"3"');
    expect(patches[0]!.body).toEqual({ technicianUserIds: ['0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a14'], endDate: '2026-04-24' });
    expect(await screen.findByText('Crew and dates saved', undefined, { timeout: 10_000 })).toBeInTheDocument();
  }, 30_000);

  it('should refuse a finish before the start without asking the server, and show the server’s field errors', async () => {
    const patches: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage(USERS)),
      [`PATCH /api/jobs/${JOB_IDS.job}`]: (request) => {
        patches.push(request);
        return apiErrorResponse(400, {
          message: 'crewLeadUserId: is not an active crew lead of your company',
          code: 'VALIDATION_FAILED',
          issues: [{ path: 'crewLeadUserId', message: 'is not an active crew lead of your company' }],
        });
      },
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('admin') });
    const dialog = await openDialog(user);
    await user.type(dialog.getByLabelText('Finish date'), '2026-04-01');
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));
    expect(await dialog.findByText('Must not be before the start date.')).toBeInTheDocument();
    expect(patches).toHaveLength(0);

    await user.clear(dialog.getByLabelText('Finish date'));
    await user.selectOptions(dialog.getByLabelText('Crew lead'), buildSessionUser('office').id);
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));
    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ crewLeadUserId: buildSessionUser('office').id });
    expect(await dialog.findByText('Is not an active crew lead of your company.')).toBeInTheDocument();
  }, 30_000);

  it('should show the crew and dates read-only to the crew lead', async () => {
    mockApi({
      [AS_BUILT]: () =>
        jsonResponse(buildJobAsBuilt(buildAsBuilt(), { technicians: [{ id: buildSessionUser('tech').id, name: 'Ines Farrow' }] })),
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    const dialog = await openDialog(user);
    expect(dialog.getByText('Ines Farrow')).toBeInTheDocument();
    expect(dialog.getByText('Ossian Brackley')).toBeInTheDocument();
    expect(dialog.queryByRole('button', { name: 'Save', hidden: true })).not.toBeInTheDocument();
    expect(dialog.queryByRole('combobox', { hidden: true })).not.toBeInTheDocument();
  }, 30_000);
});
