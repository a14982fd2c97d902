/**
 * The jobs' query keys, for every feature that reads or refreshes a job (here, below the features, so
 * that jobs, sites, plan, photos and delivery share them): the options factories and the invalidations
 * take them from here, never as literals.
 */
export const jobKeys = {
  all: ['jobs'] as const,
  lists: () => ['jobs', 'list'] as const,
  list: <P extends object>(params: P) => ['jobs', 'list', params] as const,
  /** Every job's detail queries (the as-built, signatures, packets of each job). */
  details: () => ['jobs', 'detail'] as const,
  detail: (jobId: string) => ['jobs', 'detail', jobId] as const,
  asBuilt: (jobId: string) => ['jobs', 'detail', jobId, 'as-built'] as const,
  signatures: (jobId: string) => ['jobs', 'detail', jobId, 'signatures'] as const,
  packets: (jobId: string) => ['jobs', 'detail', jobId, 'packets'] as const,
};
