import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';

import { requireJsonOrMultipartBody } from './common/body-content-type.js';
import { HttpExceptionFilter } from './common/http-exception.filter.js';
import { serveWebApp } from './common/web-app.js';
import { APP_VERSION, type Env } from './config/env.schema.js';

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
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
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

  const document = SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setTitle('Loamline API')
      .setDescription('As-built records, cable and load computation, and handover packets.')
      .setVersion(APP_VERSION)
      .addBearerAuth()
      .build(),
  );
  SwaggerModule.setup('api/docs', app, document, {
    jsonDocumentUrl: 'api/docs-json',
    customSiteTitle: 'Loamline API',
    customCss: '.swagger-ui .topbar { display: none }',
  });

  if (env.WEB_DIST_DIR) serveWebApp(app, env.WEB_DIST_DIR);
}

/** `TRUST_PROXY` as Express reads it: true/false, a hop count, or a list of addresses and subnets. */
export function trustProxySetting(value: string): boolean | number | string {
  if (value === 'true' || value === 'false') return value === 'true';
  return /^\d+$/.test(value) ? Number(value) : value;
}
