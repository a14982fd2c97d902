import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { JobAsBuiltResponse } from '@domain/jobs/job.schema';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const JOB_URL = `/jobs/${JOB_IDS.job}`;

function alertDialog(title: string) {
  return screen.findByText(title, { selector: 'h2' }).then((heading) => within(heading.closest<HTMLElement>('[role="alertdialog"]')!));
}

describe('Deleting records in the job workspace', () => {
  beforeEach(() => localStorage.clear());

  it('should ask first, delete the run on the current version, and put it back on Undo', async () => {
    let current: JobAsBuiltResponse = buildJobAsBuilt(buildAsBuilt([{ stationM: 1, depthM: 0.5 }]));
    const requests: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(current),
      [`DELETE /api/jobs/${JOB_IDS.job}/runs/${JOB_IDS.run}`]: (request) => {
        requests.push(request);
        current = buildJobAsBuilt({ ...buildAsBuilt(), runs: [] }, { version: 4 });
        return jsonResponse({ jobVersion: 4 });
      },
      [`POST /api/jobs/${JOB_IDS.job}/runs`]: (request) => {
        requests.push(request);
        current = buildJobAsBuilt(buildAsBuilt([{ stationM: 1, depthM: 0.5 }]), { version: 5 });
        return jsonResponse({ run: current.asBuilt.runs[0], jobVersion: 5 });
      },
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    const run = await screen.findByRole('listitem', { name: 'Run Patio trunk' }, { timeout: 10_000 });
    await user.click(within(run).getByRole('button', { name: 'Delete run Patio trunk' }));

    const dialog = await alertDialog('Delete the run “Patio trunk”?');
    expect(dialog.getByText(/Its depth reading, route and pairs are deleted with it/)).toBeInTheDocument();
    expect(requests).toHaveLength(0);
    await user.click(dialog.getByRole('button', { name: 'Delete', hidden: true }));

    await waitFor(() => expect(requests).toHaveLength(1));
    expect(requests[0]!.headers.get('If-Match')).toBe('"3"');
    await waitFor(() => expect(screen.queryByRole('listitem', { name: 'Run Patio trunk' })).not.toBeInTheDocument());

    const toast = (await screen.findByText('Run “Patio trunk” deleted', undefined, { timeout: 10_000 })).closest<HTMLElement>('[role="group"], .fui-Toast') ?? document.body;
    await user.click(within(toast).getByText('Undo'));
    await waitFor(() => expect(requests).toHaveLength(2));
    expect(requests[1]!.method).toBe('POST');
    expect(requests[1]!.headers.get('If-Match')).toBe('"4"');
    const body = requests[1]!.body as Record<string, unknown>;
    expect(body).not.toHaveProperty('id');
    expect(body).toMatchObject({ label: 'Patio trunk', fromItemId: JOB_IDS.amp, toItemId: JOB_IDS.speaker, depthReadings: [{ stationM: 1, depthM: 0.5 }] });
    expect(await screen.findByRole('listitem', { name: 'Run Patio trunk' }, { timeout: 10_000 })).toBeInTheDocument();
  }, 30_000);

  it('should say up front that runs use an item, and show the API’s refusal in the dialog', async () => {
    const requests: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      [`DELETE /api/jobs/${JOB_IDS.job}/items/${JOB_IDS.speaker}`]: (request) => {
        requests.push(request);
        return apiErrorResponse(409, {
          message: 'This item is still in use (asBuilt.runs.0.toItemId: no such item): change or delete what uses it first.',
          code: 'IN_USE',
        });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=equipment`, signedInAs: buildSessionUser('lead') });
    const item = await screen.findByRole('listitem', { name: 'Patio satellite' }, { timeout: 10_000 });
    await user.click(within(item).getByRole('button', { name: 'Delete Patio satellite' }));

    const dialog = await alertDialog('Delete the speaker “Patio satellite”?');
    expect(dialog.getByText(/It is still used by the run “Patio trunk”: change or delete that first/)).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Delete', hidden: true }));

    await waitFor(() => expect(requests).toHaveLength(1));
    expect(await dialog.findByText(/This item is still in use/)).toBeInTheDocument();
    expect(screen.getByRole('listitem', { name: 'Patio satellite', hidden: true })).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Cancel', hidden: true }));
    await waitFor(() => expect(screen.queryByText('Delete the speaker “Patio satellite”?')).not.toBeInTheDocument());
  }, 30_000);

  it('should not offer deleting to a technician, who records only depth readings and checks', async () => {
    mockApi({ [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt(), { technicians: [{ id: buildSessionUser('tech').id, name: 'Ines Farrow' }] })) });
    renderApp({ url: JOB_URL, signedInAs: buildSessionUser('tech') });
    const run = await screen.findByRole('listitem', { name: 'Run Patio trunk' }, { timeout: 10_000 });
    expect(within(run).queryByRole('button', { name: /^Delete/ })).not.toBeInTheDocument();
  }, 30_000);
});
