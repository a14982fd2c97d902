import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type DeliveryInContext, DeliveryInContextSchema } from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

import { deliveryKeys, pollWhileInProgress } from './delivery-keys';

/** The job's packet e-mails (GET /api/jobs/:jobId/deliveries). */
export function getJobDeliveries(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<DeliveryInContext[]> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/deliveries`, z.array(DeliveryInContextSchema), { signal });
}

export function getJobDeliveriesQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: deliveryKeys.job(jobId),
    queryFn: ({ signal }) => getJobDeliveries(jobId, { signal }),
    refetchInterval: (query) => pollWhileInProgress(query.state.data),
  });
}

export const useJobDeliveries = (jobId: string, { enabled = true } = {}) => useQuery({ ...getJobDeliveriesQueryOptions(jobId), enabled });
