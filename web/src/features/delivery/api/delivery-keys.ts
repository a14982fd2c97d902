import type { DeliveryStatus, PacketDeliveryResponse } from '@domain/delivery/delivery.schema';

/** How often a delivery list is asked again while an e-mail is queued or sending. */
export const DELIVERY_POLL_MS = 2_000;

export const isDeliveryInProgress = (status: DeliveryStatus) => status === 'queued' || status === 'sending';

/** The refetch interval of a delivery list: every DELIVERY_POLL_MS while one of its e-mails is on its way. */
export const pollWhileInProgress = (list: readonly PacketDeliveryResponse[] | undefined) =>
  list?.some((d) => isDeliveryInProgress(d.status)) ? DELIVERY_POLL_MS : false;

export const deliveryKeys = {
  all: ['deliveries'] as const,
  job: (jobId: string) => ['deliveries', 'job', jobId] as const,
  failed: () => ['deliveries', 'failed'] as const,
  sendOptions: (revisionId: string) => ['deliveries', 'send-options', revisionId] as const,
};
