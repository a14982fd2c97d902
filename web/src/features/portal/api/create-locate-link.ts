import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  type CreatedLocateLinkResponse,
  CreatedLocateLinkResponseSchema,
  type CreateLocateLinkInput,
} from '@domain/locate/locate-link.schema';

import { apiRequest } from '../../../lib/api-client';

import { getLocateLinksQueryOptions } from './get-locate-links';

export type { CreatedLocateLinkResponse, CreateLocateLinkInput };

/** Makes a locate link; the answer's `url` carries the token and is never shown again. */
export function createLocateLink({ siteId, input }: { siteId: string; input: CreateLocateLinkInput }): Promise<CreatedLocateLinkResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/locate-links`, CreatedLocateLinkResponseSchema, {
    method: 'POST',
    body: input,
  });
}

export function useCreateLocateLink() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createLocateLink,
    onSuccess: (_link, { siteId }) => queryClient.invalidateQueries({ queryKey: getLocateLinksQueryOptions(siteId).queryKey }),
  });
}
