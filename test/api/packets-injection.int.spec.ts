import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { demoPacketSnapshot } from '../../api/src/domain/packet/demo-packet-snapshot.js';
import { buildPacketViewModel } from '../../api/src/domain/packet/packet.view-model.js';
import { ChromiumPrinter } from '../../api/src/packets/chromium-printer.js';
import { renderFooterTemplate, renderPacket } from '../../api/src/packets/packet-document.js';
import { makeFieldPhoto } from '../fixtures/photos/make-photos.js';
import { pdfPages } from '../print/packet-pdf.js';

/** Each page's text, size (points, width × height) and images (poppler's pdfimages: page, width, height). */
async function pageFacts(pdf: Buffer) {
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  const sizes: string[] = [];
  for (let p = 1; p <= doc.numPages; p++) {
    const [x0, y0, x1, y1] = (await doc.getPage(p)).view;
    sizes.push(`${Math.round(x1! - x0!)}x${Math.round(y1! - y0!)}`);
  }
  await doc.destroy();
  const file = join(mkdtempSync(join(tmpdir(), 'packet-pages-')), 'packet.pdf');
  writeFileSync(file, pdf);
  const images = execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' })
    .split('\n')
    .slice(2)
    .filter(Boolean)
    .map((row) => row.trim().split(/\s+/).filter((_, i) => i === 0 || i === 3 || i === 4).join(' '));
  return { texts: await pdfPages(pdf), sizes, images };
}

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

  it('should print the packet as Chromium prints its own HTML: drawings, photos and contents numbers are written into the loaded page', async () => {
    const photo = `data:image/jpeg;base64,${(await makeFieldPhoto({ width: 1200, height: 900 })).toString('base64')}`;
    // The demo site four times as wide: its site plan and ties sheet print on pages turned landscape.
    const wide = JSON.parse(JSON.stringify(DEMO_AS_BUILT), (_key, value: unknown) =>
      value && typeof value === 'object' && 'x' in value && 'y' in value && typeof value.x === 'number' ? { ...value, x: value.x * 4 } : value,
    ) as AsBuilt;
    const input = {
      snapshot: demoPacketSnapshot({ asBuilt: wide }),
      locateUrl: 'https://loamline.example/locate/x',
      photos: [1, 2, 3].map((n) => ({ caption: `Trench photo ${n}`, takenAt: null, dataUri: photo })),
    };
    const packet = await renderPacket(printer, input);
    const alone = await printer.print({ html: packet.html, footerTemplate: renderFooterTemplate(buildPacketViewModel(input)) });
    const facts = await pageFacts(packet.pdf);
    expect(facts).toEqual(await pageFacts(alone));
    // What the edits put in: the three photos, each drawing page turned the way its drawing chose, the numbers.
    expect(facts.images).toHaveLength(3);
    const { orientation, ties } = packet.drawings;
    const drawingPages = [orientation?.sitePlan, ...(ties ? [orientation?.ties] : []), orientation?.schematic];
    const landscapePages = facts.sizes.filter((size) => Number(size.split('x')[0]) > Number(size.split('x')[1]));
    expect(drawingPages.filter((o) => o === 'landscape')).toHaveLength(2);
    expect(landscapePages).toHaveLength(2);
    expect(facts.texts[1]).toMatch(/Site plan \d+/);
    // Two prints of the whole packet: seconds on a crowded machine.
  }, 90_000);

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
