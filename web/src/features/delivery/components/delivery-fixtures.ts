import type { PacketDeliveryResponse } from '@domain/delivery/delivery.schema';

/** A delivery as the API answers it (queued, PDF attached), for component tests. */
export function buildDelivery(overrides: Partial<PacketDeliveryResponse> = {}): PacketDeliveryResponse {
  return {
    id: '7d1e2f30-4444-4a4a-9b9b-000000000001',
    revisionId: '7d1e2f30-3333-4a4a-9b9b-000000000001',
    to: 'perrin@owners.example',
    cc: [],
    message: null,
    status: 'queued',
    attempts: 0,
    lastError: null,
    failureReason: null,
    pdf: 'attached',
    isPdfAttached: null,
    messageId: null,
    isInvited: false,
    requestedByUserId: null,
    createdAt: '2026-05-20T17:00:00.000Z',
    updatedAt: '2026-05-20T17:00:00.000Z',
    sentAt: null,
    dismissedAt: null,
    ...overrides,
  };
}
