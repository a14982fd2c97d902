import { queryOptions, useQuery } from '@tanstack/react-query';
import { type PacketRevisionResponse, PacketRevisionResponseSchema } from '@domain/packet/packet-revision.schema';
import { z } from 'zod';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

/** One issued revision of the handover packet and its render status (`GET /api/jobs/:jobId/packets`): the API's contract. */
export type PacketRevision = PacketRevisionResponse;
export type PacketStatus = PacketRevisionResponse['status'];

/** How often the list is asked again while a revision is queued or rendering. */
export const PACKET_POLL_MS = 2_000;

export const isPacketInProgress = (status: PacketStatus) => status === 'queued' || status === 'rendering';

export function getJobPackets(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<PacketRevision[]> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/packets`, z.array(PacketRevisionResponseSchema), { signal });
}

export function getJobPacketsQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: jobKeys.packets(jobId),
    queryFn: ({ signal }) => getJobPackets(jobId, { signal }),
    // Poll only while something is on its way; a finished list stays quiet.
    refetchInterval: (query) => (query.state.data?.some((p) => isPacketInProgress(p.status)) ? PACKET_POLL_MS : false),
  });
}

export function useJobPackets(jobId: string) {
  return useQuery(getJobPacketsQueryOptions(jobId));
}
