import { type SendPacketInput, type SendPacketResponse, SendPacketResponseSchema } from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

import { useDeliveryMutation } from './delivery-mutation';

/** E-mails a packet revision (POST /api/packets/:revisionId/send). */
export function sendPacket({ revisionId, input }: { revisionId: string; input: SendPacketInput }): Promise<SendPacketResponse> {
  return apiRequest(`/api/packets/${encodeURIComponent(revisionId)}/send`, SendPacketResponseSchema, { method: 'POST', body: input });
}

export const useSendPacket = () => useDeliveryMutation(sendPacket);
