/** The sites' query keys: the options factories and the invalidations beside them take them from here. */
export const siteKeys = {
  all: ['sites'] as const,
  list: (params: { q?: string; customerId?: string }) => ['sites', 'list', params] as const,
  detail: (siteId: string) => ['sites', 'detail', siteId] as const,
};
