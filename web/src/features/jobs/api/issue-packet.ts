import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type IssuePacketResponse, IssuePacketResponseSchema, type IssueWarning } from '@domain/packet/packet-revision.schema';

import { apiRequest } from '../../../lib/api-client';

import { jobKeys } from '../../job-record';

/** The issued revision, the job's new version and warnings about the packet (the API's contract). */
export type { IssuePacketResponse, IssueWarning };

/** An open finding the office acknowledges at issue (`path` joined with dots); it prints as a known exception. */
export type FindingAcknowledgement = { code: string; path: string; reason: string };

/**
 * Issues the job's next packet revision on top of `version` (If-Match); the render is queued. Every
 * open must-fix finding needs an acknowledgement with a reason (the API answers 400 naming the one missing).
 */
export function issuePacket(jobId: string, version: number, acknowledgements: FindingAcknowledgement[] = []): Promise<IssuePacketResponse> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/packets`, IssuePacketResponseSchema, {
    method: 'POST',
    headers: { 'If-Match': `"${version}"` },
    body: { acknowledgements },
  });
}

export function useIssuePacket(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ version, acknowledgements }: { version: number; acknowledgements?: FindingAcknowledgement[] }) =>
      issuePacket(jobId, version, acknowledgements),
    // The job is now issued (new version) and its signatures moved to the revision.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobKeys.all }),
  });
}
