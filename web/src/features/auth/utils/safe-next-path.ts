import { paths } from '../../../config/paths';

// Pages that make no sense to come back to after signing in (and would loop).
const AUTH_PATHS: readonly string[] = [
  paths.signIn.path,
  paths.forgotPassword.path,
  paths.resetPassword.path,
  paths.acceptInvitation.path,
];

const PLACEHOLDER_ORIGIN = 'https://loamline.invalid';

/**
 * Where to go after signing in: `next` if it is a path inside this app, otherwise home. Anything that
 * could leave the app (`//elsewhere.example`, `https://…`, `/\elsewhere`, `javascript:`) is refused.
 */
export function safeNextPath(next: string | null | undefined): string {
  const fallback = paths.home.getHref();
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
  let url: URL;
  try {
    url = new URL(next, PLACEHOLDER_ORIGIN);
  } catch {
    return fallback;
  }
  if (url.origin !== PLACEHOLDER_ORIGIN || AUTH_PATHS.includes(url.pathname)) return fallback;
  return `${url.pathname}${url.search}${url.hash}`;
}

/** The current address as a `next` value. */
export function currentPathOf(location: { pathname: string; search: string; hash?: string }): string {
  return `${location.pathname}${location.search}${location.hash ?? ''}`;
}
