/**
 * Packet benchmark: `npx tsx bench/packet.bench.ts` (part of `npm run bench`).
 * Renders the demo job's handover packet with 24 photos through the whole pipeline (view model,
 * drawings, QR code, template, the page-numbering first pass and the final print) on a warm browser,
 * and compares it with Chromium printing the same final HTML alone (goal: pipeline ≤ 1.2 × print, issue 16),
 * side by side in one run, with where the pipeline's time goes (median per stage).
 * The photos are generated 12 MP JPEGs downscaled to print size (1200 px) as the photo module does.
 */
import sharp from 'sharp';

import { demoPacketSnapshot } from '../api/src/domain/packet/demo-packet-snapshot.js';
import type { PacketPhoto } from '../api/src/domain/packet/packet-snapshot.js';
import { ChromiumPrinter } from '../api/src/packets/chromium-printer.js';
import { renderFooterTemplate, renderPacket } from '../api/src/packets/packet-document.js';
import { buildPacketViewModel } from '../api/src/domain/packet/packet.view-model.js';
import { recordResults } from './results.js';

const ITERATIONS = 5;
const WIDTH = 4000;
const HEIGHT = 3000;

/** A 12 MP photo-like image (smooth gradients plus texture, so JPEG has real work), downscaled for print. */
async function makePhoto(i: number): Promise<PacketPhoto> {
  const raw = Buffer.alloc(WIDTH * HEIGHT * 3);
  for (let y = 0; y < HEIGHT; y += 1) {
    for (let x = 0; x < WIDTH; x += 1) {
      const o = (y * WIDTH + x) * 3;
      const n = ((x * 7919 + y * 104_729 + i * 31) % 97) - 48;
      raw[o] = Math.max(0, Math.min(255, 90 + ((x + i * 150) % 255) / 3 + n));
      raw[o + 1] = Math.max(0, Math.min(255, 110 + (y % 255) / 3 + n));
      raw[o + 2] = Math.max(0, Math.min(255, 70 + ((x + y) % 255) / 4 + n));
    }
  }
  const original = await sharp(raw, { raw: { width: WIDTH, height: HEIGHT, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();
  const print = await sharp(original).resize({ width: 1200, withoutEnlargement: true }).jpeg({ quality: 80, mozjpeg: true }).toBuffer();
  return {
    caption: `Trench photo ${i + 1}: run to satellite before backfill`,
    takenAt: `2026-05-13T${String(8 + (i % 10)).padStart(2, '0')}:15:00Z`,
    dataUri: `data:image/jpeg;base64,${print.toString('base64')}`,
  };
}

function median(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

console.log(`Loamline packet benchmark — node ${process.version}`);
const prepStart = performance.now();
const photos: PacketPhoto[] = [];
for (let i = 0; i < 24; i += 1) photos.push(await makePhoto(i));
console.log(`prepared 24 photos (12 MP → 1200 px JPEG, ${Math.round(photos.reduce((s, p) => s + p.dataUri.length, 0) / 1024)} KiB as data URIs) in ${Math.round(performance.now() - prepStart)} ms`);

const printer = new ChromiumPrinter({
  executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
  concurrency: 1,
  contentTimeoutMs: 60_000,
  pdfTimeoutMs: 60_000,
});
const input = { snapshot: demoPacketSnapshot(), locateUrl: 'http://127.0.0.1:3000/locate/00000000-0000-4000-8000-000000000000', photos };
try {
  // Warm-up: launches Chromium and primes caches; not measured.
  const warm = await renderPacket(printer, input);
  const footerTemplate = renderFooterTemplate(buildPacketViewModel(input));
  await printer.print({ html: warm.html, footerTemplate });

  const stages = new Map<string, number[]>();
  const onStage = (name: string, ms: number) => stages.set(name, [...(stages.get(name) ?? []), ms]);
  const pipeline: number[] = [];
  const printOnly: number[] = [];
  let pages = 0;
  let bytes = 0;
  for (let i = 0; i < ITERATIONS; i += 1) {
    let start = performance.now();
    const out = await renderPacket(printer, { ...input, onStage });
    pipeline.push(performance.now() - start);
    pages = out.pageCount;
    bytes = out.pdf.length;
    start = performance.now();
    await printer.print({ html: out.html, footerTemplate });
    printOnly.push(performance.now() - start);
  }
  const p = median(pipeline);
  const c = median(printOnly);
  console.log(`demo packet, 24 photos: ${pages} pages, ${(bytes / 1024 / 1024).toFixed(1)} MiB PDF; median of ${ITERATIONS}, warm browser`);
  console.log(`  whole pipeline (view model + drawings + QR + template + draft + final) ${p.toFixed(0).padStart(5)} ms`);
  console.log(`  Chromium printing the final HTML alone                             ${c.toFixed(0).padStart(6)} ms`);
  console.log(`  ratio pipeline / print alone                                       ${(p / c).toFixed(2).padStart(6)} ×  (goal ≤ 1.20)`);
  for (const [name, samples] of stages) console.log(`    stage: ${name.padEnd(62)}${median(samples).toFixed(0).padStart(6)} ms`);
  recordResults('packet', [
    { label: `packet render, whole pipeline (${pages} pages, 24 photos), median`, value: p, unit: 'ms' },
    { label: 'Chromium printing the final HTML alone, median', value: c, unit: 'ms' },
    { label: 'pipeline / Chromium print alone', value: p / c, unit: '×', goal: '≤ 1.2 ×', isMet: p / c <= 1.2 },
    ...[...stages].map(([name, samples]) => ({ label: `pipeline stage: ${name}, median`, value: median(samples), unit: 'ms' })),
  ]);
} finally {
  await printer.close();
}
