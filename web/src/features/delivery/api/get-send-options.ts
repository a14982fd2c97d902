import { queryOptions, useQuery } from '@tanstack/react-query';
import { type SendOptionsResponse, SendOptionsResponseSchema } from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

import { deliveryKeys } from './delivery-keys';

/** Whom a packet revision can be sent to (GET /api/packets/:revisionId/send-options). */
export function getSendOptions(revisionId: string, { signal }: { signal?: AbortSignal } = {}): Promise<SendOptionsResponse> {
  return apiRequest(`/api/packets/${encodeURIComponent(revisionId)}/send-options`, SendOptionsResponseSchema, { signal });
}

export function getSendOptionsQueryOptions(revisionId: string) {
  return queryOptions({
    queryKey: deliveryKeys.sendOptions(revisionId),
    queryFn: ({ signal }) => getSendOptions(revisionId, { signal }),
    staleTime: 0,
  });
}

export const useSendOptions = (revisionId: string, { enabled = true } = {}) => useQuery({ ...getSendOptionsQueryOptions(revisionId), enabled });
