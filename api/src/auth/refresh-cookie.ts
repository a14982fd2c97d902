import type { CookieOptions, Request, Response } from 'express';

export const REFRESH_COOKIE = 'loamline_refresh';

/** httpOnly, SameSite=Strict, scoped to the auth routes; Secure whenever the app is served over HTTPS. */
function options(req: Request, expires?: Date): CookieOptions {
  return { httpOnly: true, sameSite: 'strict', secure: req.secure, path: '/api/auth', ...(expires ? { expires } : {}) };
}

export function setRefreshCookie(req: Request, res: Response, token: string, expires: Date): void {
  res.cookie(REFRESH_COOKIE, token, options(req, expires));
}

export function clearRefreshCookie(req: Request, res: Response): void {
  res.clearCookie(REFRESH_COOKIE, options(req));
}

export function readRefreshCookie(req: Request): string | undefined {
  const value = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
  return typeof value === 'string' && value.length > 0 && value.length < 200 ? value : undefined;
}
