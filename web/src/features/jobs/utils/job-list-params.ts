import type { Role } from '@domain/auth/roles';
import { JOB_SORTS } from '@domain/jobs/job.schema';

import type { JobListParams } from '../api/get-jobs';

import { isJobStatus } from './job-status';

export const DEFAULT_JOB_SORT = '-updatedAt';

/** Crew leads and technicians see their own jobs first; the office sees the whole company. */
export function isMineByDefault(role: Role): boolean {
  return role === 'lead' || role === 'tech';
}

/** The list's parameters from the page address (`?q=&status=&sort=&page=&cursor=&mine=`), with defaults. */
export function parseJobListParams(search: URLSearchParams, role: Role): JobListParams {
  const page = Number(search.get('page') ?? '1');
  const sort = search.get('sort') ?? DEFAULT_JOB_SORT;
  const mine = search.get('mine');
  const cursor = search.get('cursor');
  const isPage = Number.isInteger(page) && page >= 1;
  return {
    q: search.get('q') ?? '',
    // Several statuses: comma-separated, or the parameter repeated; unknown ones are dropped.
    status: [...new Set(search.getAll('status').flatMap((value) => value.split(',')).filter(isJobStatus))],
    sort: (JOB_SORTS as readonly string[]).includes(sort.replace(/^-/, '')) ? sort : DEFAULT_JOB_SORT,
    page: isPage ? page : 1,
    // A cursor always follows a page (page 1 has none).
    ...(cursor && isPage && page > 1 ? { cursor } : {}),
    mine: mine === null ? isMineByDefault(role) : mine === 'true',
  };
}

/**
 * The parameters after `changes`: a change of anything but the page (a search, a status, the sort,
 * "my jobs") starts from page 1 again, and only a page change brings a cursor, since a cursor belongs
 * to the filters and sort it was read with.
 */
export function changeJobListParams(params: JobListParams, changes: Partial<JobListParams>): JobListParams {
  const { cursor: _cursor, ...rest } = params;
  const isPaging = Object.keys(changes).every((key) => key === 'page' || key === 'cursor');
  return { ...rest, ...(isPaging ? {} : { page: 1 }), ...changes };
}

/** The page address for `params`: defaults are left out so a plain `/jobs` stays plain. */
export function jobListAddressSearch(params: JobListParams, role: Role): string {
  const search = new URLSearchParams();
  if (params.q.trim() !== '') search.set('q', params.q.trim());
  if (params.status.length > 0) search.set('status', params.status.join(','));
  if (params.sort !== DEFAULT_JOB_SORT) search.set('sort', params.sort);
  if (params.page > 1) search.set('page', String(params.page));
  if (params.cursor && params.page > 1) search.set('cursor', params.cursor);
  if (params.mine !== isMineByDefault(role)) search.set('mine', String(params.mine));
  return search.toString();
}
