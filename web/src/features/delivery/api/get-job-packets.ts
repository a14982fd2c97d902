import type { PacketRevisionResponse } from '@domain/packet/packet-revision.schema';
import { queryOptions, useQuery } from '@tanstack/react-query';

import { apiRequest } from '../../../lib/api-client';

import { responseOf } from '../../../lib/response';

/** One issued revision of the handover packet and its render status (`GET /api/jobs/:jobId/packets`): the API's contract. */
export type PacketRevision = PacketRevisionResponse;
export type PacketStatus = PacketRevisionResponse['status'];

/** How often the list is asked again while a revision is queued or rendering. */
export const PACKET_POLL_MS = 2_000;

export const isPacketInProgress = (status: PacketStatus) => status === 'queued' || status === 'rendering';

export function getJobPackets(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<PacketRevision[]> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/packets`, responseOf<PacketRevision[]>(), { signal });
}

export function getJobPacketsQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: ['jobs', 'detail', jobId, 'packets'],
    queryFn: ({ signal }) => getJobPackets(jobId, { signal }),
    // Poll only while something is on its way; a finished list stays quiet.
    refetchInterval: (query) => (query.state.data?.some((p) => isPacketInProgress(p.status)) ? PACKET_POLL_MS : false),
  });
}

export function useJobPackets(jobId: string) {
  return useQuery(getJobPacketsQueryOptions(jobId));
}
