import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type DeliveryInContext, DeliveryInContextSchema } from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

import { deliveryKeys } from './delivery-keys';

/** The company's packet e-mails that failed and are not dismissed (GET /api/deliveries/failed). */
export function getFailedDeliveries({ signal }: { signal?: AbortSignal } = {}): Promise<DeliveryInContext[]> {
  return apiRequest('/api/deliveries/failed', z.array(DeliveryInContextSchema), { signal });
}

export function getFailedDeliveriesQueryOptions() {
  return queryOptions({
    queryKey: deliveryKeys.failed(),
    queryFn: ({ signal }) => getFailedDeliveries({ signal }),
    // A failure can appear any time a queued e-mail runs out of retries.
    refetchInterval: 60_000,
  });
}

export const useFailedDeliveries = ({ enabled = true } = {}) => useQuery({ ...getFailedDeliveriesQueryOptions(), enabled });
