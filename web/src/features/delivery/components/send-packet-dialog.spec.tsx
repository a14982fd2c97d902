import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it } from 'vitest';
import type { SendOptionsResponse } from '@domain/delivery/delivery.schema';

import { lightTheme } from '../../../app/theme';
import { setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { createTestQueryClient, jsonResponse } from '../../../testing/render-app';

import { buildDelivery } from './delivery-fixtures';
import { SendPacketDialog } from './send-packet-dialog';

const REVISION_ID = '7d1e2f30-3333-4a4a-9b9b-000000000001';
const LINKED = 'perrin@owners.example';
const INVITED = 'merrit@owners.example';

function options(overrides: Partial<SendOptionsResponse> = {}): SendOptionsResponse {
  return {
    homeowners: [
      { email: LINKED, name: 'Perrin Ashgrove', hasAccount: true },
      { email: INVITED, name: null, hasAccount: false },
    ],
    pdfBytes: 2_400_000,
    maxAttachmentBytes: 10 * 1_048_576,
    canAttachPdf: true,
    ...overrides,
  };
}

function renderDialog() {
  setSession(buildSessionResponse(buildSessionUser('office')));
  render(
    <FluentProvider theme={lightTheme}>
      <QueryClientProvider client={createTestQueryClient()}>
        <SendPacketDialog revisionId={REVISION_ID} revision={2} siteLabel="Thistledown garden" />
      </QueryClientProvider>
    </FluentProvider>,
  );
  return userEvent.setup();
}

async function openDialog(user: ReturnType<typeof userEvent.setup>) {
  await user.click(screen.getByRole('button', { name: 'Send to homeowner' }));
  const heading = await screen.findByText('Send revision 2 of Thistledown garden', { selector: 'h2' }, { timeout: 10_000 });
  const dialog = within(heading.closest<HTMLElement>('[role="dialog"]')!);
  await dialog.findByRole('checkbox', { name: /Perrin Ashgrove/, hidden: true }, { timeout: 10_000 });
  return dialog;
}

describe('SendPacketDialog', () => {
  beforeEach(() => localStorage.clear());

  it('should start with the site’s homeowners ticked, add an address, and send the chosen recipients, note and PDF choice', async () => {
    const sent: MockRequest[] = [];
    mockApi({
      [`GET /api/packets/${REVISION_ID}/send-options`]: () => jsonResponse(options()),
      [`POST /api/packets/${REVISION_ID}/send`]: (request) => {
        sent.push(request);
        return jsonResponse({ deliveries: [buildDelivery({ to: LINKED }), buildDelivery({ id: '7d1e2f30-4444-4a4a-9b9b-000000000009', to: 'new.owner@owners.example', isInvited: true })] }, 202);
      },
    });
    const user = renderDialog();
    const dialog = await openDialog(user);
    const linked = dialog.getByRole('checkbox', { name: /Perrin Ashgrove/, hidden: true });
    const invited = dialog.getByRole('checkbox', { name: new RegExp(INVITED), hidden: true });
    expect(linked).toBeChecked();
    expect(invited).toBeChecked();
    expect(dialog.getByText(/the e-mail carries their invitation to the portal/)).toBeInTheDocument();

    await user.click(invited);
    expect(invited).not.toBeChecked();
    // A bad address is refused in place; a good one joins the list, ticked.
    const address = dialog.getByRole('textbox', { name: 'Another address', hidden: true });
    await user.click(address);
    await user.paste('not an address');
    await user.click(dialog.getByRole('button', { name: 'Add', hidden: true }));
    expect(dialog.getByText('Enter an e-mail address, like name@example.com.')).toBeInTheDocument();
    await user.clear(address);
    await user.paste('New.Owner@Owners.example');
    await user.click(dialog.getByRole('button', { name: 'Add', hidden: true }));
    expect(dialog.getByRole('checkbox', { name: /new\.owner@owners\.example/, hidden: true })).toBeChecked();

    await user.click(dialog.getByRole('textbox', { name: /Message/, hidden: true }));
    await user.paste('Thanks for having us.');
    await user.click(dialog.getByRole('radio', { name: 'Link to the portal only', hidden: true }));
    await user.click(dialog.getByRole('button', { name: 'Send to 2 recipients', hidden: true }));

    await waitFor(() => expect(sent).toHaveLength(1));
    expect(sent[0]!.body).toEqual({ to: [LINKED, 'new.owner@owners.example'], pdf: 'link', message: 'Thanks for having us.' });
    await waitFor(() => expect(screen.queryByText('Send revision 2 of Thistledown garden')).not.toBeInTheDocument());
  }, 60_000);

  it('should say so when the PDF is over the attachment limit, and send the link only', async () => {
    const sent: MockRequest[] = [];
    mockApi({
      [`GET /api/packets/${REVISION_ID}/send-options`]: () => jsonResponse(options({ pdfBytes: 14 * 1_048_576, canAttachPdf: false })),
      [`POST /api/packets/${REVISION_ID}/send`]: (request) => {
        sent.push(request);
        return jsonResponse({ deliveries: [buildDelivery({ pdf: 'link' })] }, 202);
      },
    });
    const user = renderDialog();
    const dialog = await openDialog(user);
    expect(dialog.getByText('This PDF (14.0 MB) is over the 10.0 MB attachment limit, so the e-mail carries a link to it instead.')).toBeInTheDocument();
    expect(dialog.getByRole('radio', { name: /Attach the PDF/, hidden: true })).toBeDisabled();
    expect(dialog.getByRole('radio', { name: 'Link to the portal only', hidden: true })).toBeChecked();
    await user.click(dialog.getByRole('button', { name: 'Send to 2 recipients', hidden: true }));
    await waitFor(() => expect(sent).toHaveLength(1));
    expect(sent[0]!.body).toEqual({ to: [LINKED, INVITED], pdf: 'link' });
  }, 60_000);

  it('should name the address the API refuses, and send nothing with no recipient ticked', async () => {
    mockApi({
      [`GET /api/packets/${REVISION_ID}/send-options`]: () => jsonResponse(options()),
      [`POST /api/packets/${REVISION_ID}/send`]: () =>
        apiErrorResponse(409, {
          message: `to.1: ${INVITED} has an open invitation to a staff role`,
          code: 'RECIPIENT_NOT_HOMEOWNER',
          issues: [{ path: 'to.1', message: 'has an open invitation to a staff role' }],
        }),
    });
    const user = renderDialog();
    const dialog = await openDialog(user);
    await user.click(dialog.getByRole('button', { name: 'Send to 2 recipients', hidden: true }));
    expect(await dialog.findByText(`${INVITED} has an open invitation to a staff role: untick it to send to the others.`)).toBeInTheDocument();
    // Still open; with nobody ticked, Send is disabled.
    await user.click(dialog.getByRole('checkbox', { name: /Perrin Ashgrove/, hidden: true }));
    await user.click(dialog.getByRole('checkbox', { name: new RegExp(INVITED), hidden: true }));
    expect(dialog.getByRole('button', { name: 'Send', hidden: true })).toBeDisabled();
  }, 60_000);
});
