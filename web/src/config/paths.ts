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
  signIn: {
    path: '/sign-in',
    /** `next`: where to go after signing in (a path in this app, with its query). */
    getHref: (next?: string) => (next && next !== '/' ? `/sign-in?${new URLSearchParams({ next })}` : '/sign-in'),
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
  outbox: {
    path: '/outbox',
    getHref: (page = 1) => (page > 1 ? `/outbox?page=${page}` : '/outbox'),
  },
  outboxMessage: {
    path: '/outbox/:messageId',
    getHref: (messageId: string) => `/outbox/${encodeURIComponent(messageId)}`,
  },
} as const;
