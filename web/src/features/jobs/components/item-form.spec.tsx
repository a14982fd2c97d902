import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const JOB_URL = `/jobs/${JOB_IDS.job}`;
const CORNERS = [
  { id: '7d1e2f30-1111-4a4a-9b9b-0000000000c1', label: 'House NW corner', x: 0, y: 0 },
  { id: '7d1e2f30-1111-4a4a-9b9b-0000000000c2', label: 'House NE corner', x: 10, y: 0 },
];

describe('ItemForm ties (issue 17)', () => {
  beforeEach(() => localStorage.clear());

  it('should ask before saving an item whose ties cannot meet, and save it without a position only when told to', async () => {
    const posts: MockRequest[] = [];
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt({ ...buildAsBuilt(), referencePoints: CORNERS })),
      [`POST /api/jobs/${JOB_IDS.job}/items`]: (request) => {
        posts.push(request);
        return jsonResponse({ item: { id: '7d1e2f30-1111-4a4a-9b9b-0000000000e1', ...(request.body as object) }, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: `${JOB_URL}?section=equipment`, signedInAs: buildSessionUser('lead') });
    await user.click(await screen.findByRole('button', { name: 'Add equipment' }, { timeout: 10_000 }));
    await user.type(await screen.findByLabelText(/^Name/, undefined, { timeout: 10_000 }), 'Lawn speaker L2');
    await user.click(screen.getByRole('button', { name: 'Add a tie' }));
    await user.selectOptions(screen.getByLabelText('Tie 1 from'), 'House NW corner');
    await user.type(screen.getAllByLabelText(/^Distance/)[0]!, '2 m');
    await user.click(screen.getByRole('button', { name: 'Add a tie' }));
    await user.selectOptions(screen.getByLabelText('Tie 2 from'), 'House NE corner');
    await user.type(screen.getAllByLabelText(/^Distance/)[1]!, '3 m');
    await user.click(screen.getByRole('radio', { name: 'Right' }));
    // The two corners are 10 m apart: ties of 2 m and 3 m cannot meet (2 + 3 < 10), and the form says so beside them.
    expect(screen.getByText(/House NW corner to House NE corner: .+ apart/)).toBeInTheDocument();
    expect(screen.getByText(/^Cannot place it yet/)).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Add' }));
    const ask = await screen.findByRole('alertdialog', { name: 'The ties do not meet' });
    expect(ask).toHaveTextContent('no position on the plan');
    await user.click(within(ask).getByRole('button', { name: 'Fix the ties' }));
    await waitFor(() => expect(screen.queryByRole('alertdialog')).not.toBeInTheDocument());
    expect(posts, 'nothing saved while the crew fixes the ties').toHaveLength(0);

    await user.click(screen.getByRole('button', { name: 'Add' }));
    await user.click(await screen.findByRole('button', { name: 'Save without a position' }, { timeout: 10_000 }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]!.body).toMatchObject({ kind: 'speaker', label: 'Lawn speaker L2', ties: [{ distanceM: 2 }, { distanceM: 3 }], sideHint: 'right' });
  }, 60_000);
});
