import type { QueryClient } from '@tanstack/react-query';
import type { SiteResponse } from '@domain/sites/site.schema';
import type { SiteVersionResponse } from '@domain/sites/site-rules';

import { isApiError } from '../../../lib/api-client';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse } from '../../job-record';

import { getSiteQueryOptions } from './get-site';

export type { SiteVersionResponse };

/**
 * Every write to a site names the site version it builds on (`If-Match`), as job writes name the job's:
 * a change made on a stale copy is refused (412 `VERSION_CONFLICT`, Precondition Failed) instead of undoing someone else's.
 */
export function siteIfMatch(version: number): Record<string, string> {
  return { 'If-Match': `"${version}"` };
}

/** The version of the site this browser has (0 when it has not read the site: the API then refuses). */
export function siteVersionOf(queryClient: QueryClient, siteId: string): number {
  return queryClient.getQueryData<SiteResponse>(getSiteQueryOptions(siteId).queryKey)?.version ?? 0;
}

/**
 * After a site write: the site's new version into the cached site, and the new version of each job the
 * write bumped (a change to the plan or reference points bumps every open job on the site) into its
 * cached as-built, so the next job write builds on it instead of meeting a conflict of our own making.
 */
export function applySiteVersions(queryClient: QueryClient, siteId: string, response: Partial<SiteVersionResponse> | undefined): void {
  if (!response) return;
  const { siteVersion, jobVersions } = response;
  if (typeof siteVersion === 'number') {
    queryClient.setQueryData<SiteResponse>(getSiteQueryOptions(siteId).queryKey, (previous) =>
      previous ? { ...previous, version: siteVersion } : previous,
    );
  }
  for (const [jobId, version] of Object.entries(jobVersions ?? {})) {
    queryClient.setQueryData<JobAsBuiltResponse>(getJobAsBuiltQueryOptions(jobId).queryKey, (previous) =>
      previous ? { ...previous, job: { ...previous.job, version } } : previous,
    );
  }
}

export function isSiteConflict(error: unknown): boolean {
  return isApiError(error) && error.code === 'VERSION_CONFLICT';
}

/**
 * Runs `send` on the site version this browser has and applies the versions it answers with. On a
 * conflict the latest site is fetched (the screen shows it) before the error goes to the caller, so
 * trying again builds on what is there now.
 */
export async function sendSiteWrite<T extends Partial<SiteVersionResponse> | undefined>(
  queryClient: QueryClient,
  siteId: string,
  send: (version: number) => Promise<T>,
): Promise<T> {
  try {
    const response = await send(siteVersionOf(queryClient, siteId));
    applySiteVersions(queryClient, siteId, response);
    return response;
  } catch (error) {
    if (isSiteConflict(error)) {
      await queryClient.refetchQueries({ queryKey: getSiteQueryOptions(siteId).queryKey, exact: true });
    }
    throw error;
  }
}
