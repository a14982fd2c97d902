import { existsSync, readdirSync, statSync } from 'node:fs';
import { extname, join, resolve, sep } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import express, { type NextFunction, type Request, type Response } from 'express';

/** Hashed build output (`/assets/…`): its name changes with its content, so it never goes stale. */
export const IMMUTABLE_CACHE_CONTROL = 'public, max-age=31536000, immutable';

/**
 * Files at the root of the build that must be asked about on every use: the page itself, the service
 * worker (a cached `sw.js` would hold a phone on an old version; browsers cap its HTTP cache at a day
 * anyway, but `no-cache` makes the update check immediate) and the web app manifest.
 */
const ALWAYS_REVALIDATE = new Set(['/index.html', '/locate.html', '/sign-in.html', '/sw.js', '/manifest.webmanifest']);

/** The Cache-Control for a built file at `path` (`/assets/…`, `/sw.js`, `/favicon.svg` …). */
export function cacheControlFor(path: string): string {
  if (path.startsWith('/assets/')) return IMMUTABLE_CACHE_CONTROL;
  if (ALWAYS_REVALIDATE.has(path)) return 'no-cache';
  return 'public, max-age=3600';
}

type Encoding = 'br' | 'gzip';
const SUFFIX: Record<Encoding, string> = { br: '.br', gzip: '.gz' };

/** The public locate view's links (`/locate/<token>`): answered with the build's own small page for it. */
const LOCATE_PAGE = /^\/locate\/[^/]+\/?$/;
/** The sign-in page (`/sign-in`, any query): a small page of its own too, not the app. */
const SIGN_IN_PAGE = /^\/sign-in\/?$/;

/**
 * Serves the built single-page app from `dir` on the same port as the API: hashed assets with a long,
 * immutable cache lifetime, and `index.html` (never cached without asking) for any other GET outside
 * `/api` so client-side routes survive a reload — except a locate link, `/locate/<token>`, which gets
 * `locate.html`: the public locate view as a page of its own, without the app's shell (issue 17: a
 * stranger's phone on a weak signal loads only what that view needs), and the sign-in page, `/sign-in`
 * with any query, which gets `sign-in.html` (two fields and a button, without Fluent UI, the router or
 * the session code), with the same cache rules.
 *
 * The web build writes brotli (`.br`) and gzip (`.gz`) copies beside its text files (web/vite.config.ts,
 * `precompress`); a request whose `Accept-Encoding` allows one gets that copy with `Content-Encoding`,
 * brotli first, and every answer for a file that has copies says `Vary: Accept-Encoding`. Nothing is
 * compressed per request.
 */
export function serveWebApp(app: NestExpressApplication, dir: string): void {
  const root = resolve(dir);
  const indexHtml = join(root, 'index.html');
  if (!existsSync(indexHtml)) throw new Error(`WEB_DIST_DIR has no index.html: ${root}`);
  const locateHtml = join(root, 'locate.html');
  if (!existsSync(locateHtml)) throw new Error(`WEB_DIST_DIR has no locate.html: ${root}`);
  const signInHtml = join(root, 'sign-in.html');
  if (!existsSync(signInHtml)) throw new Error(`WEB_DIST_DIR has no sign-in.html: ${root}`);
  // The build does not change while the server runs: list its compressed copies once.
  const copies = listCompressedCopies(root);

  app.use(precompressed(root, copies));
  app.use(
    '/assets',
    express.static(join(root, 'assets'), {
      index: false,
      fallthrough: false,
      setHeaders: (res) => res.setHeader('Cache-Control', IMMUTABLE_CACHE_CONTROL),
    }),
  );
  app.use(
    express.static(root, {
      index: false,
      maxAge: '1h',
      setHeaders: (res, path) => {
        const relative = '/' + path.slice(root.length + 1).split(sep).join('/');
        res.setHeader('Cache-Control', cacheControlFor(relative));
        if (relative === '/manifest.webmanifest') res.setHeader('Content-Type', 'application/manifest+json');
      },
    }),
  );
  app.use((req: Request, res: Response, next: NextFunction) => {
    const isPageRequest = (req.method === 'GET' || req.method === 'HEAD') && !/^\/api(\/|$)/.test(req.path);
    if (!isPageRequest) return next();
    if (LOCATE_PAGE.test(req.path)) {
      const preload = locateDataPreload(req.path);
      if (preload) res.setHeader('Link', preload);
      sendPage(req, res, '/locate.html', locateHtml, copies, next);
    } else if (SIGN_IN_PAGE.test(req.path)) {
      sendPage(req, res, '/sign-in.html', signInHtml, copies, next);
    } else {
      sendPage(req, res, '/index.html', indexHtml, copies, next);
    }
  });
}

/**
 * The `Link` header that starts the locate view's own data request with the page: the browser fetches
 * `/api/locate/<token>` while it downloads the page's scripts, and the page's `fetch` of the same address
 * (features/locate/api/get-locate-view.ts, credentials included) takes that answer instead of asking
 * again, so the open is logged and counted once. A header rather than a tag in the page, so the page stays
 * one precompressed file for every token. None for a path that does not decode.
 */
export function locateDataPreload(path: string): string | undefined {
  let token: string;
  try {
    token = decodeURIComponent(path.replace(/^\/locate\//, '').replace(/\/$/, ''));
  } catch {
    return undefined;
  }
  if (!token) return undefined;
  return `</api/locate/${encodeURIComponent(token)}>; rel=preload; as=fetch; crossorigin=use-credentials`;
}

/** Relative paths (`/assets/index-abc.js.br`) of every `.br` and `.gz` file under `root`. */
function listCompressedCopies(root: string): Set<string> {
  const found = new Set<string>();
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir)) {
      if (entry === '.vite') continue;
      const path = join(dir, entry);
      if (statSync(path).isDirectory()) walk(path);
      else if (entry.endsWith('.br') || entry.endsWith('.gz')) found.add('/' + path.slice(root.length + 1).split(sep).join('/'));
    }
  };
  walk(root);
  return found;
}

/** The encodings `Accept-Encoding` allows (q above 0), of the two we keep copies in. */
export function acceptedEncodings(header: string | undefined): Set<Encoding> {
  const accepted = new Set<Encoding>();
  for (const part of (header ?? '').split(',')) {
    const [name = '', ...params] = part.trim().toLowerCase().split(';');
    const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
    if (q !== undefined && !(Number(q.slice(2)) > 0)) continue;
    if (name === 'br' || name === 'gzip') accepted.add(name);
    if (name === '*') {
      accepted.add('br');
      accepted.add('gzip');
    }
  }
  return accepted;
}

/** The copy to send for `path`, brotli before gzip, or none. */
function chooseCopy(path: string, header: string | undefined, copies: Set<string>): Encoding | undefined {
  const accepted = acceptedEncodings(header);
  return (['br', 'gzip'] as const).find((encoding) => accepted.has(encoding) && copies.has(path + SUFFIX[encoding]));
}

function hasCopies(path: string, copies: Set<string>): boolean {
  return copies.has(path + '.br') || copies.has(path + '.gz');
}

/** Sends the compressed copy of a built file when the browser takes one; otherwise leaves it to express.static. */
function precompressed(root: string, copies: Set<string>) {
  return (req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (/^\/api(\/|$)/.test(req.path)) return next();
    let path: string;
    try {
      path = decodeURIComponent(req.path);
    } catch {
      return next();
    }
    if (!hasCopies(path, copies)) return next();
    res.vary('Accept-Encoding');
    const encoding = chooseCopy(path, req.headers['accept-encoding'], copies);
    if (!encoding) return next();
    res.setHeader('Content-Encoding', encoding);
    if (path === '/manifest.webmanifest') res.type('application/manifest+json');
    else res.type(extname(path));
    // The path is one of the listed copies, so it cannot leave `root`.
    res.sendFile(join(root, path + SUFFIX[encoding]), {
      headers: { 'Cache-Control': cacheControlFor(path) },
    }, (error) => {
      if (error) next(error);
    });
  };
}

/** Sends a page of the build (`path` in it, at `htmlFile`) for a route, as its precompressed copy if taken. */
function sendPage(req: Request, res: Response, path: string, htmlFile: string, copies: Set<string>, next: NextFunction): void {
  res.setHeader('Cache-Control', 'no-cache');
  let file = htmlFile;
  if (hasCopies(path, copies)) {
    res.vary('Accept-Encoding');
    const encoding = chooseCopy(path, req.headers['accept-encoding'], copies);
    if (encoding) {
      res.setHeader('Content-Encoding', encoding);
      res.type('html');
      file = htmlFile + SUFFIX[encoding];
    }
  }
  res.sendFile(file, (error) => {
    if (error) next(error);
  });
}
