import type { NestExpressApplication } from '@nestjs/platform-express';
import { JwtService } from '@nestjs/jwt';
import { SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import type { NextFunction, Request, Response } from 'express';
import helmet from 'helmet';

import { AuthService, type AccessTokenPayload } from './auth/auth.service.js';
import { requireJsonOrMultipartBody } from './common/body-content-type.js';
import { HttpExceptionFilter } from './common/http-exception.filter.js';
import { buildOpenApiDocument } from './common/openapi.js';
import { serveWebApp } from './common/web-app.js';
import { APP_VERSION, type Env } from './config/env.schema.js';
import { isStaffRole } from './domain/auth/roles.js';

/**
 * Everything that shapes the HTTP surface, shared by `main.ts` and the integration tests so that the
 * tests exercise exactly what production serves.
 */
export function configureApp(app: NestExpressApplication, env: Env): void {
  app.setGlobalPrefix('api');
  app.useGlobalFilters(new HttpExceptionFilter());
  app.disable('x-powered-by');
  if (env.TRUST_PROXY) app.set('trust proxy', trustProxySetting(env.TRUST_PROXY));
  app.use(requireJsonOrMultipartBody);
  // A large job's as-built (hundreds of items and runs) is a few hundred kB of JSON.
  app.useBodyParser('json', { limit: '5mb' });
  app.use(cookieParser());
  // API answers carry customers' names, addresses, e-mails and phones: no browser or proxy keeps them.
  // A handler that means to be cached (files with an ETag) sets its own Cache-Control over this one.
  app.use('/api', (_req: Request, res: Response, next: NextFunction) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          // 'wasm-unsafe-eval' lets the page's own workers compile WebAssembly (the HEIC photo converter,
          // web/src/features/photos/utils/heic-worker.ts); it allows no JavaScript eval.
          scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
          // Fluent UI (Griffel) inserts its atomic CSS at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          upgradeInsecureRequests: null,
        },
      },
    }),
  );

  if (!serveDocsToAll(env)) app.use(['/api/docs', '/api/docs-json'], docsForStaffOnly(app));
  const document = buildOpenApiDocument(app);
  SwaggerModule.setup('api/docs', app, document, {
    jsonDocumentUrl: 'api/docs-json',
    customSiteTitle: 'Loamline API',
    customCss: '.swagger-ui .topbar { display: none }',
  });

  if (env.WEB_DIST_DIR) serveWebApp(app, env.WEB_DIST_DIR);
}

/** The OpenAPI UI and JSON are public outside production, and in production only with `API_DOCS=1`. */
export function serveDocsToAll(env: Pick<Env, 'NODE_ENV' | 'API_DOCS'>): boolean {
  return env.API_DOCS === undefined ? env.NODE_ENV !== 'production' : env.API_DOCS;
}

/**
 * Otherwise the docs answer only a request with a signed-in staff member's access token (a script or
 * tool fetching `/api/docs-json` with `Authorization: Bearer …`); everyone else gets the API's 404, so
 * nothing tells a visitor the route exists.
 */
function docsForStaffOnly(app: NestExpressApplication) {
  const jwt = app.get(JwtService, { strict: false });
  const auth = app.get(AuthService, { strict: false });
  return (req: Request, res: Response, next: NextFunction) => {
    const token = /^Bearer (\S+)$/.exec(req.get('authorization') ?? '')?.[1];
    const verified = token
      ? jwt
          .verifyAsync<AccessTokenPayload>(token, { algorithms: ['HS256'] })
          .then((payload) => auth.validateAccessToken(payload))
          .then((user) => isStaffRole(user.role))
      : Promise.resolve(false);
    verified.then(
      (isStaff) => (isStaff ? next() : notFound(req, res)),
      () => notFound(req, res),
    );
  };
}

function notFound(req: Request, res: Response): void {
  res.status(404).json({ statusCode: 404, error: 'Not Found', message: `Cannot ${req.method} ${req.originalUrl.split('?')[0]}` });
}

/** `TRUST_PROXY` as Express reads it: true/false, a hop count, or a list of addresses and subnets. */
export function trustProxySetting(value: string): boolean | number | string {
  if (value === 'true' || value === 'false') return value === 'true';
  return /^\d+$/.test(value) ? Number(value) : value;
}
