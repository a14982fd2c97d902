import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// A stand-in web build as `vite build` writes it (web/vite.config.ts, `precompress`): a hashed script and
// stylesheet with their .br and .gz copies, a hashed image with none, index.html and the two pages of their
// own: the public locate view's, locate.html, and the sign-in page, sign-in.html.
const WEB_DIST_DIR = mkdtempSync(join(tmpdir(), 'loamline-web-compress-'));
const SCRIPT = `export const rows = [${Array.from({ length: 400 }, (_, i) => `{"run":${i},"depth":"18 in"}`).join(',')}];\n`;
const STYLE = `.row{margin:0;padding:0}\n`.repeat(200);
const INDEX = `<!doctype html><html><head><script type="module" src="/assets/index-Ab12Cd34.js"></script></head><body><div id="root"></div>${'<!-- - -->'.repeat(150)}</body></html>`;
const LOCATE = `<!doctype html><html><head><script type="module" src="/assets/locate-Ij90Kl12.js"></script></head><body><div id="root"></div>${'<!-- + -->'.repeat(150)}</body></html>`;
const SIGN_IN = `<!doctype html><html><head><script type="module" src="/assets/sign-in-Mn34Op56.js"></script></head><body><div id="root"></div>${'<!-- * -->'.repeat(150)}</body></html>`;
mkdirSync(join(WEB_DIST_DIR, 'assets'));
for (const [name, text] of [
  ['assets/index-Ab12Cd34.js', SCRIPT],
  ['assets/index-Ef56Gh78.css', STYLE],
  ['index.html', INDEX],
  ['locate.html', LOCATE],
  ['sign-in.html', SIGN_IN],
] as const) {
  writeFileSync(join(WEB_DIST_DIR, name), text);
  writeFileSync(join(WEB_DIST_DIR, `${name}.br`), brotliCompressSync(text));
  writeFileSync(join(WEB_DIST_DIR, `${name}.gz`), gzipSync(text));
}
// The service worker (vite-plugin-pwa's sw.js, compressed like any script) and the web app manifest (too
// small for copies), as the PWA build writes them at the root.
const SW = `self.__WB_MANIFEST=${JSON.stringify(Array.from({ length: 200 }, (_, i) => ({ url: `assets/chunk-${i}.js`, revision: null })))};\n`;
const MANIFEST = '{"name":"Loamline","start_url":"/"}';
writeFileSync(join(WEB_DIST_DIR, 'sw.js'), SW);
writeFileSync(join(WEB_DIST_DIR, 'sw.js.br'), brotliCompressSync(SW));
writeFileSync(join(WEB_DIST_DIR, 'sw.js.gz'), gzipSync(SW));
writeFileSync(join(WEB_DIST_DIR, 'manifest.webmanifest'), MANIFEST);
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a1d1f1b80000000049454e44ae426082', 'hex');
writeFileSync(join(WEB_DIST_DIR, 'assets', 'logo-Zz99Yy88.png'), PNG);

type Answer = { status: number; headers: Record<string, string | string[] | undefined>; body: Buffer };

let app: NestExpressApplication;
let port: number;

/** A GET with the raw bytes of the answer (fetch and supertest would undo the compression). */
function get(path: string, acceptEncoding?: string): Promise<Answer> {
  return new Promise((resolvePromise, reject) => {
    const req = httpRequest(
      { host: '127.0.0.1', port, path, headers: acceptEncoding === undefined ? {} : { 'Accept-Encoding': acceptEncoding } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => resolvePromise({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end();
  });
}

const varyNames = (answer: Answer) =>
  String(answer.headers.vary ?? '')
    .split(',')
    .map((v) => v.trim().toLowerCase());

describe('the built web app, precompressed (issue 17: fast on a weak signal)', () => {
  beforeAll(async () => {
    process.env.WEB_DIST_DIR = WEB_DIST_DIR;
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    await app.listen(0, '127.0.0.1');
    port = (app.getHttpServer().address() as AddressInfo).port;
  });

  afterAll(async () => {
    await app?.close();
    delete process.env.WEB_DIST_DIR;
    rmSync(WEB_DIST_DIR, { recursive: true, force: true });
  });

  it('should send the brotli copy of a hashed script to a browser that takes brotli, cached for a year as immutable', async () => {
    const res = await get('/assets/index-Ab12Cd34.js', 'gzip, deflate, br, zstd');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/^text\/javascript|^application\/javascript/);
    expect(varyNames(res)).toContain('accept-encoding');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(Number(res.headers['content-length'])).toBe(res.body.length);
    expect(res.body.length).toBeLessThan(Buffer.byteLength(SCRIPT) / 4);
    expect(brotliDecompressSync(res.body).toString()).toBe(SCRIPT);
  });

  it('should send the gzip copy when brotli is not accepted, or refused with q=0', async () => {
    for (const header of ['gzip, deflate', 'br;q=0, gzip']) {
      const res = await get('/assets/index-Ef56Gh78.css', header);
      expect(res.headers['content-encoding'], header).toBe('gzip');
      expect(res.headers['content-type'], header).toMatch(/^text\/css/);
      expect(varyNames(res), header).toContain('accept-encoding');
      expect(res.headers['cache-control'], header).toBe('public, max-age=31536000, immutable');
      expect(gunzipSync(res.body).toString(), header).toBe(STYLE);
    }
  });

  it('should send the file itself, still varying on Accept-Encoding, when no encoding is accepted', async () => {
    for (const header of [undefined, 'identity', 'gzip;q=0, br;q=0']) {
      const res = await get('/assets/index-Ab12Cd34.js', header);
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding'], String(header)).toBeUndefined();
      expect(varyNames(res), String(header)).toContain('accept-encoding');
      expect(res.headers['cache-control'], String(header)).toBe('public, max-age=31536000, immutable');
      expect(res.body.toString(), String(header)).toBe(SCRIPT);
    }
  });

  it('should send a hashed file that has no compressed copy as it is, immutable', async () => {
    const res = await get('/assets/logo-Zz99Yy88.png', 'br, gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.headers['content-type']).toBe('image/png');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.body.equals(PNG)).toBe(true);
  });

  it('should answer a missing asset 404, not index.html', async () => {
    const res = await get('/assets/index-Missing0.js', 'br');
    expect(res.status).toBe(404);
    expect(res.headers['content-encoding']).toBeUndefined();
  });

  /** `path` answers the page `html` as a page: brotli when asked, revalidated, under the Content-Security-Policy. */
  async function expectHtmlPage(path: string, html: string) {
    const res = await get(path, 'gzip, deflate, br');
    expect(res.status, path).toBe(200);
    expect(res.headers['content-type'], path).toMatch(/^text\/html/);
    expect(res.headers['content-encoding'], path).toBe('br');
    expect(varyNames(res), path).toContain('accept-encoding');
    expect(res.headers['cache-control'], path).toBe('no-cache');
    expect(String(res.headers['content-security-policy']), path).toContain("script-src 'self'");
    expect(brotliDecompressSync(res.body).toString(), path).toBe(html);
  }

  it('should send index.html for a client route, compressed, with no-cache and the Content-Security-Policy', async () => {
    for (const path of ['/', '/jobs', '/jobs/4f1c', '/locate', '/locate/some-token/more', '/sign-in/more', '/sign-inside', '/index.html']) {
      await expectHtmlPage(path, INDEX);
    }
    const plain = await get('/jobs');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers['cache-control']).toBe('no-cache');
    expect(plain.body.toString()).toBe(INDEX);
  });

  it('should send locate.html, not the app, for a locate link: compressed, with no-cache and the Content-Security-Policy', async () => {
    for (const path of ['/locate/some-token', '/locate/Ab_9-xY/', '/locate.html']) {
      await expectHtmlPage(path, LOCATE);
    }
    // The view's data starts with the page: one preload of the API address, the token encoded as the page's fetch encodes it.
    expect((await get('/locate/Ab_9-xY', 'br')).headers.link).toBe('</api/locate/Ab_9-xY>; rel=preload; as=fetch; crossorigin=use-credentials');
    expect((await get('/locate/a%20b%3E', 'br')).headers.link).toBe('</api/locate/a%20b%3E>; rel=preload; as=fetch; crossorigin=use-credentials');
    expect((await get('/locate.html', 'br')).headers.link).toBeUndefined();
    expect((await get('/jobs', 'br')).headers.link).toBeUndefined();
    const gzip = await get('/locate/some-token', 'gzip');
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(gzip.body).toString()).toBe(LOCATE);
    const plain = await get('/locate/some-token');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers['cache-control']).toBe('no-cache');
    expect(plain.body.toString()).toBe(LOCATE);
    // The locate view's data stays the API's: JSON, never the page.
    const api = await get('/api/locate/some-token', 'br, gzip');
    expect(api.headers['content-type']).toMatch(/^application\/json/);
  });

  it('should send sign-in.html, not the app, for the sign-in page with or without a query: compressed, with no-cache and the Content-Security-Policy', async () => {
    for (const path of ['/sign-in', '/sign-in/', `/sign-in?${new URLSearchParams({ next: '/jobs/4f1c?section=runs', expired: '1' })}`, '/sign-in.html']) {
      await expectHtmlPage(path, SIGN_IN);
    }
    expect((await get('/sign-in', 'br')).headers.link).toBeUndefined();
    const gzip = await get('/sign-in?next=%2Fjobs', 'gzip');
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(gzip.body).toString()).toBe(SIGN_IN);
    const plain = await get('/sign-in');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers['cache-control']).toBe('no-cache');
    expect(plain.body.toString()).toBe(SIGN_IN);
    // The sign-in request itself stays the API's.
    const api = await get('/api/auth/sign-in', 'br, gzip');
    expect(api.headers['content-type']).toMatch(/^application\/json/);
  });

  it('should leave the API uncompressed by these copies and uncached', async () => {
    const res = await get('/api/health', 'br, gzip');
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('should make the browser ask about the service worker and the manifest every time (an installed app updates at once)', async () => {
    // sw.js compressed or not: never served from an HTTP cache without revalidating.
    for (const header of ['br', 'gzip', undefined]) {
      const res = await get('/sw.js', header);
      expect(res.status, String(header)).toBe(200);
      expect(res.headers['cache-control'], String(header)).toBe('no-cache');
      expect(res.headers['content-type'], String(header)).toMatch(/^(text|application)\/javascript/);
    }
    const manifest = await get('/manifest.webmanifest', 'br, gzip');
    expect(manifest.status).toBe(200);
    expect(manifest.headers['cache-control']).toBe('no-cache');
    expect(manifest.headers['content-type']).toMatch(/^application\/manifest\+json/);
    expect(manifest.body.toString()).toBe(MANIFEST);
  });
});
