/** The customers' query keys: the options factories and the invalidations beside them take them from here. */
export const customerKeys = {
  all: ['customers'] as const,
  list: (params: { q: string; page: number }) => ['customers', 'list', params] as const,
  detail: (customerId: string) => ['customers', 'detail', customerId] as const,
};
