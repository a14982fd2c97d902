import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  type DeliveryInContext,
  DeliveryInContextSchema,
  type DeliveryStatus,
  type PacketDeliveryResponse,
  PacketDeliveryResponseSchema,
  type SendOptionsResponse,
  SendOptionsResponseSchema,
  type SendPacketInput,
  type SendPacketResponse,
  SendPacketResponseSchema,
} from '@domain/delivery/delivery.schema';

import { apiRequest } from '../../../lib/api-client';

/** How often a delivery list is asked again while an e-mail is queued or sending. */
export const DELIVERY_POLL_MS = 2_000;

export const isDeliveryInProgress = (status: DeliveryStatus) => status === 'queued' || status === 'sending';

const pollWhileInProgress = (list: readonly PacketDeliveryResponse[] | undefined) =>
  list?.some((d) => isDeliveryInProgress(d.status)) ? DELIVERY_POLL_MS : false;

export const deliveryKeys = {
  all: ['deliveries'] as const,
  job: (jobId: string) => ['deliveries', 'job', jobId] as const,
  failed: () => ['deliveries', 'failed'] as const,
  sendOptions: (revisionId: string) => ['deliveries', 'send-options', revisionId] as const,
};

export function getJobDeliveriesQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: deliveryKeys.job(jobId),
    queryFn: ({ signal }): Promise<DeliveryInContext[]> =>
      apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/deliveries`, z.array(DeliveryInContextSchema), { signal }),
    refetchInterval: (query) => pollWhileInProgress(query.state.data),
  });
}

export const useJobDeliveries = (jobId: string, { enabled = true } = {}) => useQuery({ ...getJobDeliveriesQueryOptions(jobId), enabled });

export function getFailedDeliveriesQueryOptions() {
  return queryOptions({
    queryKey: deliveryKeys.failed(),
    queryFn: ({ signal }): Promise<DeliveryInContext[]> => apiRequest('/api/deliveries/failed', z.array(DeliveryInContextSchema), { signal }),
    // A failure can appear any time a queued e-mail runs out of retries.
    refetchInterval: 60_000,
  });
}

export const useFailedDeliveries = ({ enabled = true } = {}) => useQuery({ ...getFailedDeliveriesQueryOptions(), enabled });

export function getSendOptionsQueryOptions(revisionId: string) {
  return queryOptions({
    queryKey: deliveryKeys.sendOptions(revisionId),
    queryFn: ({ signal }): Promise<SendOptionsResponse> =>
      apiRequest(`/api/packets/${encodeURIComponent(revisionId)}/send-options`, SendOptionsResponseSchema, { signal }),
    staleTime: 0,
  });
}

export const useSendOptions = (revisionId: string, { enabled = true } = {}) => useQuery({ ...getSendOptionsQueryOptions(revisionId), enabled });

export function sendPacket({ revisionId, input }: { revisionId: string; input: SendPacketInput }): Promise<SendPacketResponse> {
  return apiRequest(`/api/packets/${encodeURIComponent(revisionId)}/send`, SendPacketResponseSchema, { method: 'POST', body: input });
}

export function resendDelivery(id: string): Promise<PacketDeliveryResponse> {
  return apiRequest(`/api/deliveries/${encodeURIComponent(id)}/resend`, PacketDeliveryResponseSchema, { method: 'POST' });
}

export function dismissDelivery(id: string): Promise<PacketDeliveryResponse> {
  return apiRequest(`/api/deliveries/${encodeURIComponent(id)}/dismiss`, PacketDeliveryResponseSchema, { method: 'POST' });
}

/** After any change, every delivery list (job logs, the failures on the home page) is asked again. */
function useDeliveryMutation<TVariables, TResult>(mutationFn: (variables: TVariables) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn, onSettled: () => queryClient.invalidateQueries({ queryKey: deliveryKeys.all }) });
}

export const useSendPacket = () => useDeliveryMutation(sendPacket);
export const useResendDelivery = () => useDeliveryMutation(resendDelivery);
export const useDismissDelivery = () => useDeliveryMutation(dismissDelivery);
