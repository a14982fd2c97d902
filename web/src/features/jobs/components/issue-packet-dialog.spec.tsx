import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Finding } from '@domain/analysis/finding';
import { describe, expect, it } from 'vitest';

import { lightTheme } from '../../../app/theme';
import { setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { createTestQueryClient, jsonResponse } from '../../../testing/render-app';

import { IssuePacketDialog } from './issue-packet-dialog';

const JOB_ID = '7d1e2f30-1111-4a4a-9b9b-000000000009';

const MUST_FIX_A: Finding = {
  code: 'LOAD_BELOW_AMP_MINIMUM',
  severity: 'critical',
  message: 'Outdoor amplifier / Patio drives 4 Ω of speakers, below the amplifier’s 8 Ω minimum.',
  path: ['items', 0],
};
// Same code and path (the other channel of the same amplifier): acknowledged together.
const MUST_FIX_B: Finding = { ...MUST_FIX_A, message: 'Outdoor amplifier / Spa drives 5.33 Ω of speakers, below the amplifier’s 8 Ω minimum.' };
const CHECK: Finding = { code: 'DEPTH_SHALLOW', severity: 'warning', message: 'Run "Patio splice to P2" has 4.3 in of cover.', path: ['runs', 3, 'depthReadings', 1] };
const NOTE: Finding = { code: 'POSITION_SIDE_HINT_MISSING', severity: 'info', message: 'A note nobody is asked about.', path: ['items', 2] };

function renderDialog(findings: Finding[]) {
  setSession(buildSessionResponse(buildSessionUser('office')));
  return render(
    <FluentProvider theme={lightTheme}>
      <QueryClientProvider client={createTestQueryClient()}>
        <IssuePacketDialog jobId={JOB_ID} jobVersion={5} findings={findings} />
      </QueryClientProvider>
    </FluentProvider>,
  );
}

/** The dialog by its title (jsdom leaves Fluent's surface aria-hidden for role queries, as in the other dialog tests). */
async function openDialog(title: string) {
  const heading = await screen.findByText(title, { selector: 'h2' });
  return within(heading.closest<HTMLElement>('[role="dialog"]')!);
}

const issued = { id: 'p1', jobId: JOB_ID, revision: 1, status: 'queued', failureReason: null, attempts: 0, paperSize: 'letter', pageCount: null, pdf: null, archive: null, issuedByUserId: null, issuedAt: '2026-05-20T17:00:00Z', renderedAt: null, jobVersion: 6 };

describe('IssuePacketDialog', () => {
  it('should show the open findings, hold the issue until each must-fix one has a reason, then send the acknowledgements with If-Match', async () => {
    let sent: { ifMatch: string | null; body: unknown } | undefined;
    mockApi({
      [`POST /api/jobs/${JOB_ID}/packets`]: ({ headers, body }) => {
        sent = { ifMatch: headers.get('If-Match'), body };
        return jsonResponse({ ...issued, warnings: [] }, 201);
      },
    });
    renderDialog([MUST_FIX_A, MUST_FIX_B, CHECK, NOTE]);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Issue packet' }));
    const dialog = await openDialog('Issue the handover packet?');
    const list = within(dialog.getByRole('list', { name: 'Open findings', hidden: true }));
    // One entry for the two channels of one amplifier, one for the check; notes are not asked about.
    expect(list.getAllByRole('listitem', { hidden: true })).toHaveLength(2);
    expect(list.getByText(MUST_FIX_A.message)).toBeInTheDocument();
    expect(list.getByText(MUST_FIX_B.message)).toBeInTheDocument();
    expect(dialog.queryByText(NOTE.message)).not.toBeInTheDocument();
    const confirm = dialog.getByRole('button', { name: 'Give 1 reason to issue', hidden: true });
    expect(confirm).toBeDisabled();

    await user.type(dialog.getByRole('textbox', { name: /Reason \(required\)/, hidden: true }), 'Kept; limit set.');
    await user.type(dialog.getByRole('textbox', { name: /Reason \(optional/, hidden: true }), 'Rock; sleeved.');
    await user.click(dialog.getByRole('button', { name: 'Issue revision', hidden: true }));

    await expect.poll(() => sent).toBeDefined();
    expect(sent).toEqual({
      ifMatch: '"5"',
      body: {
        acknowledgements: [
          { code: 'LOAD_BELOW_AMP_MINIMUM', path: 'items.0', reason: 'Kept; limit set.' },
          { code: 'DEPTH_SHALLOW', path: 'runs.3.depthReadings.1', reason: 'Rock; sleeved.' },
        ],
      },
    });
    await expect.poll(() => screen.queryByText('Issue the handover packet?')).toBeNull();
  }, 60_000);

  it('should confirm a job without open findings in one step, and show the API’s refusal and the warnings', async () => {
    const answers = [
      apiErrorResponse(400, { message: 'acknowledgements: must acknowledge the must-fix finding CHANNEL_SHORT@items.0 with a reason', code: 'FINDINGS_NOT_ACKNOWLEDGED' }),
      jsonResponse({ ...issued, warnings: [{ code: 'PACKET_WITHOUT_PHONE', message: 'The company profile has no phone number.' }] }, 201),
    ];
    mockApi({ [`POST /api/jobs/${JOB_ID}/packets`]: () => answers.shift()! });
    renderDialog([NOTE]);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Issue packet' }));
    const dialog = await openDialog('Issue the handover packet?');
    expect(dialog.getByText('There are no open findings.')).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Issue revision', hidden: true }));
    expect(await dialog.findByText(/must acknowledge the must-fix finding CHANNEL_SHORT@items\.0/)).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Issue revision', hidden: true }));
    expect(await dialog.findByText('Revision 1 issued')).toBeInTheDocument();
    expect(dialog.getByText('The company profile has no phone number.')).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Close', hidden: true }));
    await expect.poll(() => screen.queryByText('Revision 1 issued')).toBeNull();
  }, 60_000);

  it('should put the API’s refusal of one acknowledgement under that finding’s reason, and keep the dialog open', async () => {
    mockApi({
      [`POST /api/jobs/${JOB_ID}/packets`]: () =>
        apiErrorResponse(400, {
          message: 'acknowledgements.1: DEPTH_SHALLOW at "runs.3.depthReadings.1" is not an open finding of this job',
          code: 'VALIDATION_FAILED',
          issues: [{ path: 'acknowledgements.1', message: 'DEPTH_SHALLOW at "runs.3.depthReadings.1" is not an open finding of this job' }],
        }),
    });
    renderDialog([MUST_FIX_A, CHECK]);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Issue packet' }));
    const dialog = await openDialog('Issue the handover packet?');
    const required = dialog.getByRole('textbox', { name: /Reason \(required\)/, hidden: true });
    const optional = dialog.getByRole('textbox', { name: /Reason \(optional/, hidden: true });
    await user.type(required, 'Kept; limit set.');
    await user.type(optional, 'Rock; sleeved.');
    await user.click(dialog.getByRole('button', { name: 'Issue revision', hidden: true }));

    // The second acknowledgement sent is the check's: its reason field carries the refusal.
    const refusal = 'DEPTH_SHALLOW at "runs.3.depthReadings.1" is not an open finding of this job.';
    expect(await dialog.findByText(refusal)).toBeInTheDocument();
    expect(optional).toHaveAccessibleDescription(refusal);
    expect(required).not.toHaveAccessibleDescription(refusal);
    expect(dialog.getByText('Issue the handover packet?')).toBeInTheDocument();

    // Clearing the must-fix reason after a refusal holds the issue again and says why under it.
    await user.clear(required);
    expect(await dialog.findByText('Give a reason of at least 3 characters.')).toBeInTheDocument();
    expect(dialog.getByRole('button', { name: 'Give 1 reason to issue', hidden: true })).toBeDisabled();
  }, 60_000);
});
