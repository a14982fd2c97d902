import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { demoPacketSnapshot } from '../../api/src/domain/packet/demo-packet-snapshot.js';
import { ChromiumPrinter } from '../../api/src/packets/chromium-printer.js';
import { renderPacket } from '../../api/src/packets/packet-document.js';
import { pdfPages } from '../print/packet-pdf.js';

describe('packet rendering sandbox', () => {
  let server: Server;
  let port: number;
  const received: string[] = [];
  const printer = new ChromiumPrinter({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    concurrency: 1,
    contentTimeoutMs: 30_000,
    pdfTimeoutMs: 30_000,
  });

  beforeAll(async () => {
    server = createServer((req, res) => {
      received.push(`${req.method} ${req.url}`);
      res.end('x');
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    port = (server.address() as AddressInfo).port;
  });

  afterAll(async () => {
    await printer.close();
    await new Promise((resolve) => server.close(resolve));
  });

  it('should print markup typed into a label as text and let the page reach no URL', async () => {
    const hostile = `<img src="http://127.0.0.1:${port}/x"><script>fetch('http://127.0.0.1:${port}/s')</script>`;
    const asBuilt: AsBuilt = {
      ...DEMO_AS_BUILT,
      items: DEMO_AS_BUILT.items.map((item) => (item.id === 'sp-p1' ? { ...item, label: hostile, model: `<link rel="stylesheet" href="http://127.0.0.1:${port}/c">` } : item)),
      runs: DEMO_AS_BUILT.runs.map((run, i) => (i === 0 ? { ...run, cableType: `<iframe src="http://127.0.0.1:${port}/f"></iframe>` } : run)),
    };
    const snapshot = demoPacketSnapshot({ asBuilt });
    snapshot.job.title = `<style>@import url(http://127.0.0.1:${port}/i);</style>Job`;
    const blocked: string[] = [];
    const { pdf, html } = await renderPacket(printer, {
      snapshot,
      locateUrl: `http://127.0.0.1:${port}/locate/x`,
      photos: [{ caption: '<b>caption</b>', takenAt: null, dataUri: `http://127.0.0.1:${port}/photo.jpg` }],
      onBlockedRequest: (url) => blocked.push(url),
    });
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(received).toEqual([]);
    expect(blocked).toEqual([]);
    expect(html).not.toContain('<script>');
    expect(html).not.toContain('<img src="http://');
    const text = (await pdfPages(pdf)).join(' ');
    expect(text).toContain('<img src="http://127.0.0.1:');
    expect(text).toContain('<script>fetch(');
    expect(text).toContain('<iframe src=');
  });

  it('should refuse every request that is not inline, even if markup got through', async () => {
    const blocked: string[] = [];
    await printer.print({
      html: `<html><body><img src="http://127.0.0.1:${port}/direct"><link rel="stylesheet" href="file:///etc/passwd"><p>x</p></body></html>`,
      footerTemplate: '<span></span>',
      onBlockedRequest: (url) => blocked.push(url),
    });
    expect(received).toEqual([]);
    // Chromium itself refuses file: from the about:blank document before interception sees it.
    expect(blocked).toContain(`http://127.0.0.1:${port}/direct`);
    expect(blocked.every((url) => !url.startsWith('data:'))).toBe(true);
  });
});
