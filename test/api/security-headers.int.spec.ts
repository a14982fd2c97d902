import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany } from '../support/fixtures.js';

// A stand-in web build (index.html, locate.html, sign-in.html and one hashed asset), served by the API as `npm start` serves web/dist.
const WEB_DIST_DIR = mkdtempSync(join(tmpdir(), 'loamline-web-dist-'));
mkdirSync(join(WEB_DIST_DIR, 'assets'));
writeFileSync(join(WEB_DIST_DIR, 'index.html'), '<!doctype html><html><body><div id="root"></div><script type="module" src="/assets/index-abc.js"></script></body></html>');
writeFileSync(join(WEB_DIST_DIR, 'locate.html'), '<!doctype html><html><body><div id="root"></div><script type="module" src="/assets/locate-abc.js"></script></body></html>');
writeFileSync(join(WEB_DIST_DIR, 'sign-in.html'), '<!doctype html><html><body><div id="root"></div><script type="module" src="/assets/sign-in-abc.js"></script></body></html>');
writeFileSync(join(WEB_DIST_DIR, 'assets', 'index-abc.js'), 'console.log("app")');

/** The directives of a Content-Security-Policy header, by name. */
function directives(header: string | undefined): Map<string, string[]> {
  return new Map(
    (header ?? '')
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((parts) => parts[0])
      .map(([name, ...values]) => [name!.toLowerCase(), values]),
  );
}

const STACK_TRACE = /\bat [\w.<>]+ \(|node_modules|\.[jt]s:\d+:\d+/;

async function startApp(env: Record<string, string | undefined>): Promise<NestExpressApplication> {
  for (const [key, value] of Object.entries({ WEB_DIST_DIR, ...env })) {
    if (value === undefined) delete process.env[key];
    else process.env[key] = value;
  }
  const { createTestApp } = await import('../support/test-app.js');
  return createTestApp();
}

describe('security of the HTTP surface', () => {
  let app: NestExpressApplication;
  let company: TestCompany;

  beforeAll(async () => {
    app = await startApp({ TRUST_PROXY: undefined });
    company = await createCompany('Security Headers');
  });

  afterAll(async () => {
    await app?.close();
  });

  describe('the web app page', () => {
    it('should carry a strict Content-Security-Policy', async () => {
      const res = await request(app.getHttpServer()).get('/jobs').expect(200);
      expect(res.headers['content-type']).toMatch(/text\/html/);
      const csp = directives(res.headers['content-security-policy']);
      expect(csp.get('default-src')).toEqual(["'self'"]);
      // Scripts only from our own origin: no inline script, no eval. WebAssembly may be compiled (the
      // HEIC photo converter's libheif), which runs nothing that is not already our own file.
      expect(csp.get('script-src')).toEqual(["'self'", "'wasm-unsafe-eval'"]);
      expect(csp.get('script-src-attr')).toEqual(["'none'"]);
      expect(csp.get('object-src')).toEqual(["'none'"]);
      expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
      expect(csp.get('base-uri')).toEqual(["'self'"]);
      expect(csp.get('form-action')).toEqual(["'self'"]);
      expect(csp.get('connect-src')).toEqual(["'self'"]);
    });

    it('should have no inline script in the pages’ source that such a policy would block (the app, the locate view, sign-in)', () => {
      for (const page of ['index.html', 'locate.html', 'sign-in.html']) {
        const html = readFileSync(join(import.meta.dirname, '../../web', page), 'utf8');
        const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
        expect(scripts.length, page).toBeGreaterThan(0);
        for (const [, attributes, body] of scripts) {
          expect(attributes, page).toMatch(/\bsrc=/);
          expect(body!.trim(), page).toBe('');
        }
        expect(html, page).not.toMatch(/\son[a-z]+=/i);
      }
    });

    it('should send the other protective headers and no X-Powered-By', async () => {
      for (const path of ['/', '/assets/index-abc.js', '/api/health']) {
        const res = await request(app.getHttpServer()).get(path);
        expect(res.status, path).toBe(200);
        expect(res.headers['strict-transport-security'], path).toMatch(/^max-age=(\d+); includeSubDomains$/);
        expect(Number(/max-age=(\d+)/.exec(res.headers['strict-transport-security'] ?? '')![1]), path).toBeGreaterThanOrEqual(15_552_000);
        expect(res.headers['x-content-type-options'], path).toBe('nosniff');
        expect(res.headers['referrer-policy'], path).toBe('no-referrer');
        expect(res.headers['x-frame-options'], path).toBe('SAMEORIGIN');
        expect(res.headers['cross-origin-opener-policy'], path).toBe('same-origin');
        expect(res.headers['x-powered-by'], path).toBeUndefined();
      }
    });
  });

  describe('the refresh cookie', () => {
    it('should be HttpOnly, SameSite=Strict, limited to /api/auth, and not Secure over plain HTTP', async () => {
      const res = await request(app.getHttpServer())
        .post('/api/auth/sign-in')
        .send({ email: company.users.office.email, password: 'fixture-password-123' })
        .expect(200);
      const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('loamline_refresh='));
      expect(cookie).toBeDefined();
      const attributes = cookie!.split(';').map((a) => a.trim().toLowerCase());
      expect(attributes).toContain('httponly');
      expect(attributes).toContain('samesite=strict');
      expect(attributes).toContain('path=/api/auth');
      expect(attributes).not.toContain('secure');
      // The access token travels in the body, never in a cookie a cross-site request would carry.
      expect(([] as string[]).concat(res.headers['set-cookie'] ?? [])).toHaveLength(1);
    });

    it('should ignore X-Forwarded-Proto unless TRUST_PROXY says a proxy is in front', async () => {
      const res = await request(app.getHttpServer())
        .post('/api/auth/sign-in')
        .set('X-Forwarded-Proto', 'https')
        .send({ email: company.users.office.email, password: 'fixture-password-123' })
        .expect(200);
      expect(String(res.headers['set-cookie'])).not.toMatch(/;\s*Secure/i);
    });
  });

  describe('cross-origin requests', () => {
    it('should give another origin no CORS permission, on a preflight or a simple request', async () => {
      const preflight = await request(app.getHttpServer())
        .options('/api/jobs')
        .set('Origin', 'https://elsewhere.example')
        .set('Access-Control-Request-Method', 'POST')
        .set('Access-Control-Request-Headers', 'authorization, content-type');
      expect(preflight.headers['access-control-allow-origin']).toBeUndefined();
      expect(preflight.headers['access-control-allow-credentials']).toBeUndefined();
      expect(preflight.headers['access-control-allow-methods']).toBeUndefined();
      const simple = await request(app.getHttpServer()).get('/api/health').set('Origin', 'https://elsewhere.example');
      expect(simple.headers['access-control-allow-origin']).toBeUndefined();
    });
  });

  describe('error responses', () => {
    it('should answer a missing asset with a plain 404 and no stack trace', async () => {
      const res = await request(app.getHttpServer()).get('/assets/no-such-file.js');
      expect(res.status).toBe(404);
      expect(res.text).not.toMatch(STACK_TRACE);
    });

    it('should answer malformed JSON with the common 400 body and no parser detail or stack', async () => {
      const res = await request(app.getHttpServer())
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send('{"email": ');
      expect(res.status).toBe(400);
      expect(res.body).toMatchObject({ statusCode: 400, error: 'Bad Request' });
      expect(res.text).not.toMatch(STACK_TRACE);
    });

    it('should answer an over-large body with 413 in the common body and no stack', async () => {
      const res = await request(app.getHttpServer())
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send(JSON.stringify({ email: 'x'.repeat(6 * 1024 * 1024) }));
      expect(res.status).toBe(413);
      expect(res.body).toMatchObject({ statusCode: 413 });
      expect(res.text).not.toMatch(STACK_TRACE);
    });
  });
});

describe('behind a TLS-terminating proxy (TRUST_PROXY set)', () => {
  let app: NestExpressApplication;
  let company: TestCompany;

  beforeAll(async () => {
    app = await startApp({ TRUST_PROXY: 'loopback' });
    company = await createCompany('Security Proxy');
  });

  afterAll(async () => {
    await app?.close();
    delete process.env.TRUST_PROXY;
    rmSync(WEB_DIST_DIR, { recursive: true, force: true });
  });

  it('should mark the refresh cookie Secure when the proxy reports HTTPS', async () => {
    const res = await request(app.getHttpServer())
      .post('/api/auth/sign-in')
      .set('X-Forwarded-Proto', 'https')
      .send({ email: company.users.office.email, password: 'fixture-password-123' })
      .expect(200);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('loamline_refresh='));
    expect(cookie!.split(';').map((a) => a.trim().toLowerCase())).toEqual(
      expect.arrayContaining(['secure', 'httponly', 'samesite=strict', 'path=/api/auth']),
    );
  });
});
