import { type PacketDeliveryResponse, PacketDeliveryResponseSchema } from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

import { useDeliveryMutation } from './delivery-mutation';

/** Takes a failed packet e-mail off the failures list (POST /api/deliveries/:id/dismiss). */
export function dismissDelivery(id: string): Promise<PacketDeliveryResponse> {
  return apiRequest(`/api/deliveries/${encodeURIComponent(id)}/dismiss`, PacketDeliveryResponseSchema, { method: 'POST' });
}

export const useDismissDelivery = () => useDeliveryMutation(dismissDelivery);
