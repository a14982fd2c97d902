import { type PacketDeliveryResponse, PacketDeliveryResponseSchema } from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

import { useDeliveryMutation } from './delivery-mutation';

/** Sends a failed packet e-mail again (POST /api/deliveries/:id/resend). */
export function resendDelivery(id: string): Promise<PacketDeliveryResponse> {
  return apiRequest(`/api/deliveries/${encodeURIComponent(id)}/resend`, PacketDeliveryResponseSchema, { method: 'POST' });
}

export const useResendDelivery = () => useDeliveryMutation(resendDelivery);
