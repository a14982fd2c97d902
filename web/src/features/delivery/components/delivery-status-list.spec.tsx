import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider } from 'react-router';
import { beforeEach, describe, expect, it } from 'vitest';
import type { DeliveryInContext } from '@domain/delivery/delivery.schema';

import { lightTheme } from '../../../app/theme';
import { setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { createTestQueryClient, jsonResponse } from '../../../testing/render-app';

import { buildDelivery } from './delivery-fixtures';
import { DeliveryStatusList } from './delivery-status-list';
import { JobDeliveries } from './job-deliveries';

const JOB_ID = '7d1e2f30-1111-4a4a-9b9b-000000000001';
const CONTEXT = { revision: 1, jobId: JOB_ID, jobTitle: 'Back garden lighting', siteId: '7d1e2f30-2222-4a4a-9b9b-000000000002', siteLabel: 'Thistledown garden' };

const inContext = (overrides: Parameters<typeof buildDelivery>[0]): DeliveryInContext => ({ ...buildDelivery(overrides), ...CONTEXT });

const QUEUED = inContext({ id: '7d1e2f30-4444-4a4a-9b9b-000000000001', to: 'queued@owners.example', status: 'queued' });
const SENDING = inContext({ id: '7d1e2f30-4444-4a4a-9b9b-000000000002', to: 'sending@owners.example', status: 'sending', attempts: 1 });
const SENT = inContext({
  id: '7d1e2f30-4444-4a4a-9b9b-000000000003',
  to: 'sent@owners.example',
  status: 'sent',
  attempts: 1,
  isPdfAttached: true,
  isInvited: true,
  sentAt: '2026-05-20T17:02:00.000Z',
});
const FAILED = inContext({
  id: '7d1e2f30-4444-4a4a-9b9b-000000000004',
  to: 'failed@owners.example',
  status: 'failed',
  attempts: 3,
  lastError: 'connect ECONNREFUSED 127.0.0.1:2525',
  failureReason: 'The mail server could not be reached.',
});

function renderWithProviders(element: React.ReactNode) {
  setSession(buildSessionResponse(buildSessionUser('office')));
  const router = createMemoryRouter([{ path: '*', element }]);
  render(
    <FluentProvider theme={lightTheme}>
      <QueryClientProvider client={createTestQueryClient()}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </FluentProvider>,
  );
  return userEvent.setup();
}

describe('DeliveryStatusList', () => {
  beforeEach(() => localStorage.clear());

  it('should show each recipient as queued, sending, sent with its time, or failed with the plain reason', () => {
    renderWithProviders(<DeliveryStatusList deliveries={[QUEUED, SENDING, SENT, FAILED]} label="E-mails" canAct={false} />);
    const row = (to: string) => within(screen.getByRole('listitem', { name: `E-mail to ${to}` }));
    expect(row('queued@owners.example').getByRole('status')).toHaveTextContent('Queued');
    expect(row('sending@owners.example').getByRole('status')).toHaveTextContent('Sending');
    expect(row('sent@owners.example').getByRole('status')).toHaveTextContent(/^Sent .*2026/);
    expect(row('sent@owners.example').getByText('PDF attached · with an invitation to the portal')).toBeInTheDocument();
    expect(row('failed@owners.example').getByRole('status')).toHaveTextContent('Failed');
    expect(row('failed@owners.example').getByText('The mail server could not be reached.')).toBeInTheDocument();
    // The raw error is for support, not shown to the office.
    expect(screen.queryByText(/ECONNREFUSED/)).not.toBeInTheDocument();
    // Someone who may not send sees no actions.
    expect(screen.queryByRole('button')).not.toBeInTheDocument();
  }, 60_000);

  it('should offer Send again on sent and failed e-mails, Dismiss on failed ones only, and call the API', async () => {
    const calls: MockRequest[] = [];
    mockApi({
      [`POST /api/deliveries/${FAILED.id}/resend`]: (request) => {
        calls.push(request);
        return jsonResponse({ ...buildDelivery({ ...FAILED, status: 'queued' }) }, 202);
      },
      [`POST /api/deliveries/${FAILED.id}/dismiss`]: (request) => {
        calls.push(request);
        return jsonResponse(buildDelivery({ ...FAILED, dismissedAt: '2026-05-20T18:00:00.000Z' }));
      },
    });
    const user = renderWithProviders(<DeliveryStatusList deliveries={[QUEUED, SENT, FAILED]} label="E-mails" canAct />);
    const queued = within(screen.getByRole('listitem', { name: 'E-mail to queued@owners.example' }));
    expect(queued.queryByRole('button')).not.toBeInTheDocument();
    const sent = within(screen.getByRole('listitem', { name: 'E-mail to sent@owners.example' }));
    expect(sent.getByRole('button', { name: 'Send again to sent@owners.example' })).toBeInTheDocument();
    expect(sent.queryByRole('button', { name: /Dismiss/ })).not.toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Send again to failed@owners.example' }));
    await user.click(screen.getByRole('button', { name: 'Dismiss the failed e-mail to failed@owners.example' }));
    await waitFor(() => expect(calls.map((c) => `${c.method} ${c.path}`)).toEqual([
      `POST /api/deliveries/${FAILED.id}/resend`,
      `POST /api/deliveries/${FAILED.id}/dismiss`,
    ]));
  }, 60_000);
});

describe('JobDeliveries', () => {
  beforeEach(() => localStorage.clear());

  it('should warn about a failed e-mail until it is dismissed, and then keep it in the log', async () => {
    let list: DeliveryInContext[] = [FAILED, SENT];
    mockApi({
      [`GET /api/jobs/${JOB_ID}/deliveries`]: () => jsonResponse(list),
      [`POST /api/deliveries/${FAILED.id}/dismiss`]: () => {
        list = [{ ...FAILED, dismissedAt: '2026-05-20T18:00:00.000Z' }, SENT];
        return jsonResponse(buildDelivery({ ...FAILED, dismissedAt: '2026-05-20T18:00:00.000Z' }));
      },
    });
    const user = renderWithProviders(<JobDeliveries jobId={JOB_ID} />);
    expect(await screen.findByText('An e-mail did not arrive', undefined, { timeout: 10_000 })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Dismiss the failed e-mail to failed@owners.example' }));
    await waitFor(() => expect(screen.queryByText('An e-mail did not arrive')).not.toBeInTheDocument());
    const row = within(screen.getByRole('listitem', { name: 'E-mail to failed@owners.example' }));
    expect(row.getByText(/dismissed/)).toBeInTheDocument();
    expect(row.getByRole('button', { name: 'Send again to failed@owners.example' })).toBeInTheDocument();
  }, 60_000);
});
