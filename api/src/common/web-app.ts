import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import express, { type NextFunction, type Request, type Response } from 'express';

/**
 * Serves the built single-page app from `dir` on the same port as the API: hashed assets with a long
 * cache lifetime, and `index.html` (never cached) for any other GET outside `/api` so client-side
 * routes survive a reload.
 */
export function serveWebApp(app: NestExpressApplication, dir: string): void {
  const root = resolve(dir);
  const indexHtml = join(root, 'index.html');
  if (!existsSync(indexHtml)) throw new Error(`WEB_DIST_DIR has no index.html: ${root}`);

  app.use(
    '/assets',
    express.static(join(root, 'assets'), { immutable: true, maxAge: '1y', index: false, fallthrough: false }),
  );
  app.use(express.static(root, { index: false, maxAge: '1h' }));
  app.use((req: Request, res: Response, next: NextFunction) => {
    const isPageRequest = (req.method === 'GET' || req.method === 'HEAD') && !/^\/api(\/|$)/.test(req.path);
    if (!isPageRequest) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
}
