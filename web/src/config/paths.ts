/**
 * Every route path in one place. Routes use `path`; links use `getHref()` so a path change is one edit.
 */
export const paths = {
  home: {
    path: '/',
    getHref: () => '/',
  },
  status: {
    path: '/status',
    getHref: () => '/status',
  },
  /**
   * A page of its own, not a route of the app (web/sign-in.html, issue 17): reach it with a full page load
   * (`window.location`, `<Link reloadDocument>`, `redirectDocument`), never a client-side navigation.
   */
  signIn: {
    path: '/sign-in',
    /**
     * `next`: where to go after signing in (a path in this app, with its query); `expired`: the session
     * ended under the user (the page says so).
     */
    getHref: (next?: string, { expired = false }: { expired?: boolean } = {}) => {
      const query = new URLSearchParams();
      if (next && next !== '/') query.set('next', next);
      if (expired) query.set('expired', '1');
      return query.size > 0 ? `/sign-in?${query}` : '/sign-in';
    },
  },
  signUp: {
    path: '/sign-up',
    getHref: () => '/sign-up',
  },
  signUpVerify: {
    path: '/sign-up/verify',
    getHref: (token: string) => `/sign-up/verify?${new URLSearchParams({ token })}`,
  },
  forgotPassword: {
    path: '/forgot-password',
    getHref: (email?: string) => (email ? `/forgot-password?${new URLSearchParams({ email })}` : '/forgot-password'),
  },
  resetPassword: {
    path: '/reset-password',
    getHref: (token: string) => `/reset-password?${new URLSearchParams({ token })}`,
  },
  acceptInvitation: {
    path: '/accept-invitation',
    getHref: (token: string) => `/accept-invitation?${new URLSearchParams({ token })}`,
  },
  users: {
    path: '/users',
    getHref: () => '/users',
  },
  settings: {
    path: '/settings',
    getHref: () => '/settings',
  },
  jobs: {
    path: '/jobs',
    /** `search`: the list's query string (q, status, sort, page, mine) without the leading `?`. */
    getHref: (search?: string) => (search ? `/jobs?${search}` : '/jobs'),
  },
  job: {
    path: '/jobs/:jobId',
    getHref: (jobId: string, section?: string) =>
      `/jobs/${encodeURIComponent(jobId)}${section ? `?section=${encodeURIComponent(section)}` : ''}`,
  },
  jobPlan: {
    path: '/jobs/:jobId/plan',
    getHref: (jobId: string) => `/jobs/${encodeURIComponent(jobId)}/plan`,
  },
  jobDrawings: {
    path: '/jobs/:jobId/drawings',
    getHref: (jobId: string) => `/jobs/${encodeURIComponent(jobId)}/drawings`,
  },
  customers: {
    path: '/customers',
    getHref: () => '/customers',
  },
  customer: {
    path: '/customers/:customerId',
    getHref: (customerId: string) => `/customers/${encodeURIComponent(customerId)}`,
  },
  site: {
    path: '/sites/:siteId',
    getHref: (siteId: string) => `/sites/${encodeURIComponent(siteId)}`,
  },
  outbox: {
    path: '/outbox',
    getHref: (page = 1) => (page > 1 ? `/outbox?page=${page}` : '/outbox'),
  },
  outboxMessage: {
    path: '/outbox/:messageId',
    getHref: (messageId: string) => `/outbox/${encodeURIComponent(messageId)}`,
  },
  portal: {
    path: '/portal',
    getHref: () => '/portal',
  },
  portalSite: {
    path: '/portal/sites/:siteId',
    getHref: (siteId: string) => `/portal/sites/${encodeURIComponent(siteId)}`,
  },
} as const;
