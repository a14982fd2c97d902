import { useCallback, useEffect, useRef } from 'react';

import { type JobListParams, type JobListResponse, jobListSearch } from '../api/get-jobs';

/**
 * The jobs list pages by cursor: this gives the cursor to ask for a page with. The next page's is the
 * `nextCursor` of the page on screen; an earlier page's is the one it was reached with, remembered while
 * the list is open (for the same filters and sort). Without one (page 1, or a page reached from an
 * address) the page is counted by number.
 */
export function useJobPageCursors(params: JobListParams, shown: JobListResponse | undefined): (page: number) => string | undefined {
  const cursors = useRef(new Map<string, string>());
  // The list's filters and sort, without its page: a cursor belongs to those it was read with.
  const list = jobListSearch({ ...params, page: 1, cursor: undefined });
  const { page, cursor } = params;

  useEffect(() => {
    if (cursor) cursors.current.set(`${list}#${page}`, cursor);
  }, [list, page, cursor]);

  return useCallback(
    (target: number) => {
      if (shown && target === shown.page + 1 && shown.nextCursor) return shown.nextCursor;
      return cursors.current.get(`${list}#${target}`);
    },
    [list, shown],
  );
}
