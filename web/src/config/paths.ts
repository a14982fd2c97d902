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
} as const;
