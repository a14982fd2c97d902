import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type InvitationResponse, InvitationResponseSchema } from '@domain/auth/auth.schema';
import type { InviteHomeownerInput } from '@domain/sites/homeowner-invitation.schema';
import { HomeownerListResponseSchema, type SiteResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { getInvitationsQueryOptions } from '../../users';

import { getSiteQueryOptions } from './get-site';

const base = (siteId: string) => `/api/sites/${encodeURIComponent(siteId)}`;

/** Lets an existing homeowner account see the site in the portal; answers the site's homeowners. */
export function linkHomeowner({ siteId, userId }: { siteId: string; userId: string }): Promise<SiteResponse['homeowners']> {
  return apiRequest(`${base(siteId)}/homeowners`, HomeownerListResponseSchema, { method: 'POST', body: { userId } });
}

export function unlinkHomeowner({ siteId, userId }: { siteId: string; userId: string }): Promise<void> {
  return apiRequest(`${base(siteId)}/homeowners/${encodeURIComponent(userId)}`, undefined, { method: 'DELETE' }).then(() => undefined);
}

/** E-mails a portal invitation; the site is linked to the account when it is accepted. */
export function inviteHomeowner({ siteId, input }: { siteId: string; input: InviteHomeownerInput }): Promise<InvitationResponse> {
  return apiRequest(`${base(siteId)}/homeowner-invitations`, InvitationResponseSchema, { method: 'POST', body: input });
}

function useSiteMutation<TVariables extends { siteId: string }, TResult>(mutationFn: (variables: TVariables) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: (_result, { siteId }) => queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
  });
}

export const useLinkHomeowner = () => useSiteMutation(linkHomeowner);
export const useUnlinkHomeowner = () => useSiteMutation(unlinkHomeowner);

export function useInviteHomeowner() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteHomeowner,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
