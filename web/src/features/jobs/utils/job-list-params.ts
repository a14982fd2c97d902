import type { Role } from '@domain/auth/roles';
import { JOB_SORTS } from '@domain/jobs/job.schema';

import type { JobListParams } from '../api/get-jobs';

import { isJobStatus } from './job-status';

export const DEFAULT_JOB_SORT = '-updatedAt';

/** Crew leads and technicians see their own jobs first; the office sees the whole company. */
export function isMineByDefault(role: Role): boolean {
  return role === 'lead' || role === 'tech';
}

/** The list's parameters from the page address (`?q=&status=&sort=&page=&mine=`), with defaults. */
export function parseJobListParams(search: URLSearchParams, role: Role): JobListParams {
  const page = Number(search.get('page') ?? '1');
  const sort = search.get('sort') ?? DEFAULT_JOB_SORT;
  const mine = search.get('mine');
  return {
    q: search.get('q') ?? '',
    // Several statuses: comma-separated, or the parameter repeated; unknown ones are dropped.
    status: [...new Set(search.getAll('status').flatMap((value) => value.split(',')).filter(isJobStatus))],
    sort: (JOB_SORTS as readonly string[]).includes(sort.replace(/^-/, '')) ? sort : DEFAULT_JOB_SORT,
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    mine: mine === null ? isMineByDefault(role) : mine === 'true',
  };
}

/** The page address for `params`: defaults are left out so a plain `/jobs` stays plain. */
export function jobListAddressSearch(params: JobListParams, role: Role): string {
  const search = new URLSearchParams();
  if (params.q.trim() !== '') search.set('q', params.q.trim());
  if (params.status.length > 0) search.set('status', params.status.join(','));
  if (params.sort !== DEFAULT_JOB_SORT) search.set('sort', params.sort);
  if (params.page > 1) search.set('page', String(params.page));
  if (params.mine !== isMineByDefault(role)) search.set('mine', String(params.mine));
  return search.toString();
}
