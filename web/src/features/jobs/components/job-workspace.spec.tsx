import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { JobAsBuiltResponse } from '@domain/jobs/job.schema';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const ADD_READING = `POST /api/jobs/${JOB_IDS.job}/runs/${JOB_IDS.run}/depth-readings`;
const JOB_URL = `/jobs/${JOB_IDS.job}`;

/** The as-built answer that changes as the test saves readings. */
function serverWith(initial: JobAsBuiltResponse) {
  let current = initial;
  return {
    get: () => jsonResponse(current),
    set: (next: JobAsBuiltResponse) => {
      current = next;
    },
  };
}

async function openDepthFlow(user: ReturnType<typeof renderApp>['user']) {
  const run = await screen.findByRole('listitem', { name: 'Run Patio trunk' }, { timeout: 30_000 });
  await user.click(within(run).getByRole('button', { name: 'Add depth reading' }));
  return run;
}

describe('JobWorkspace', () => {
  beforeEach(() => localStorage.clear());

  it('should add depth readings one after another and say at once when one is shallow', async () => {
    const server = serverWith(buildJobAsBuilt(buildAsBuilt([{ stationM: 1, depthM: 0.2 }])));
    const posts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: server.get,
      [ADD_READING]: (request) => {
        posts.push(request);
        server.set(buildJobAsBuilt(buildAsBuilt([{ stationM: 1, depthM: 0.2 }, request.body as { stationM: number; depthM: number }]), { version: 4 }));
        return jsonResponse({ depthReading: { id: JOB_IDS.reading2, ...(request.body as object) }, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    const run = await openDepthFlow(user);

    // Feet and inches by default on a US browser: 6 in of cover is required.
    expect(within(run).getByText(/At least 6 in of cover is required/)).toBeInTheDocument();
    await user.type(within(run).getByLabelText('Station (from the start)'), '10');
    await user.type(within(run).getByLabelText('Cover depth'), '4');
    expect(within(run).getByText(/Shallow: 2 in short of 6 in/)).toBeInTheDocument();

    await user.click(within(run).getByRole('button', { name: 'Save reading' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]!.headers.get('If-Match')).toBe('"3"');
    expect((posts[0]!.body as { stationM: number }).stationM).toBeCloseTo(3.048, 6);
    expect((posts[0]!.body as { depthM: number }).depthM).toBeCloseTo(0.1016, 6);

    // Still open for the next reading, emptied, and the saved one is marked shallow by the analysis.
    await within(run).findByText('Too shallow');
    expect(within(run).getByLabelText('Station (from the start)')).toHaveValue('');
    expect(within(run).getByRole('button', { name: 'Save reading' })).toBeInTheDocument();
  }, 60_000);

  it('should link a shallow-depth finding to the reading it is about', async () => {
    const server = serverWith(buildJobAsBuilt(buildAsBuilt([{ stationM: 1, depthM: 0.2 }, { stationM: 6, depthM: 0.08 }])));
    mockApi({ [AS_BUILT]: server.get });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });

    // A phone-width layout in jsdom: the findings sit above the sections behind one button.
    await user.click(await screen.findByRole('button', { name: /^Findings: 1 to look at/ }, { timeout: 15_000 }));
    const findings = screen.getByRole('list', { name: 'Findings' });
    // In the reader's units (feet and inches here): 8 cm = 3.15 in → 3 1/8 in; 6 m = 236.2 in = 19 ft 8 in
    // (1 in = 0.0254 m, NIST SP 811 B.8); the rule 150 mm reads as the NEC's 6 in.
    const shallow = within(findings).getByText(/has 3 1\/8 in of cover at 19 ft 8 in .* is 6 in/).closest('li')!;
    expect(within(shallow).getByText('Check')).toBeInTheDocument();
    await user.click(within(shallow).getByRole('button', { name: 'Show the field' }));

    await waitFor(() => expect(document.activeElement?.id).toBe(`field-${JOB_IDS.run}-depth-1`));
    expect(document.activeElement).toHaveTextContent(/Too shallow/);
  }, 30_000);

  it('should offer to reload or keep my reading when someone saved first, and re-apply it on the new version', async () => {
    const server = serverWith(buildJobAsBuilt(buildAsBuilt([])));
    const posts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: server.get,
      [ADD_READING]: (request) => {
        posts.push(request);
        if (request.headers.get('If-Match') === '"3"') {
          server.set(buildJobAsBuilt(buildAsBuilt([]), { version: 5 }));
          return apiErrorResponse(412, { message: 'Someone saved this job after you opened it.', code: 'VERSION_CONFLICT', currentVersion: 5 } as never);
        }
        return jsonResponse({ depthReading: { id: JOB_IDS.reading1, ...(request.body as object) }, jobVersion: 6 });
      },
    });
    const { user } = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    const run = await openDepthFlow(user);
    await user.type(within(run).getByLabelText('Station (from the start)'), '2 m');
    await user.type(within(run).getByLabelText('Cover depth'), '20 cm');
    await user.click(within(run).getByRole('button', { name: 'Save reading' }));

    const title = await screen.findByText('Someone saved this job first', { selector: 'h2' });
    const dialog = within(title.closest<HTMLElement>('[role="alertdialog"]')!);
    expect(dialog.getByText(/now at version 5/)).toBeInTheDocument();
    expect(dialog.getByRole('button', { name: 'Reload, discard mine', hidden: true })).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Keep mine and save', hidden: true }));

    await waitFor(() => expect(posts).toHaveLength(2));
    expect(posts[1]!.headers.get('If-Match')).toBe('"5"');
    expect(posts[1]!.body).toEqual(posts[0]!.body);
  }, 30_000);

  it('should keep unsaved input across a remount and say it is not saved', async () => {
    mockApi({ [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt([]))) });
    const first = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    const run = await openDepthFlow(first.user);
    await first.user.type(within(run).getByLabelText('Station (from the start)'), '12');
    first.unmount();

    const second = renderApp({ url: JOB_URL, signedInAs: buildSessionUser('lead') });
    // The banner names the form and links to it.
    expect(await screen.findByText('Not saved yet', undefined, { timeout: 15_000 })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Depth reading on Patio trunk' })).toHaveAttribute('href', `/jobs/${JOB_IDS.job}`);
    const again = await openDepthFlow(second.user);
    expect(within(again).getByLabelText('Station (from the start)')).toHaveValue('12');
  }, 60_000);
});
