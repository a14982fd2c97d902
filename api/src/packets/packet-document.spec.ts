import { describe, expect, it } from 'vitest';

import { demoPacketSnapshot } from '../domain/packet/demo-packet-snapshot.js';
import { buildPacketViewModel } from '../domain/packet/packet.view-model.js';
import { planImageForDrawing } from '../drawings/job-drawings.js';
import { drawPacketDrawings, renderPacketHtml } from './packet-document.js';

/** A 1×1 PNG; the drawing only embeds it, so its content does not matter. */
const PNG = 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=';

describe('drawPacketDrawings', () => {
  const snapshot = demoPacketSnapshot();
  const vm = buildPacketViewModel({ snapshot, locateUrl: 'https://loamline.example/locate/x' });

  it('should draw the site plan over the site’s plan image when there is one, and without it otherwise', async () => {
    const planImage = planImageForDrawing({ href: PNG, widthPx: 3000, heightPx: 2000, calibration: { a: { x: 100, y: 1900 }, b: { x: 2900, y: 1900 }, distanceM: 28 } });
    const withImage = await drawPacketDrawings(snapshot, vm, planImage);
    expect(withImage.sitePlan).toContain(`href="${PNG}"`);
    expect(withImage.sitePlan).toContain('data-layer="plan-image"');
    const without = await drawPacketDrawings(snapshot, vm);
    expect(without.sitePlan).not.toContain('<image');
    // Everything but the underlay is the same drawing.
    expect(withImage.schematic).toBe(without.schematic);
    // The file's first drawings load the drawing modules (elkjs, svg.js): seconds on a crowded machine.
  }, 30_000);

  it('labels each run of the site record with when it went in, by which job, and since when it is abandoned (issue 21)', async () => {
    const [first, second] = snapshot.asBuilt.runs;
    const provenance = (jobTitle: string, on: string) => ({ isThisJob: false, installedBy: { jobId: 'job-a', jobTitle }, installedOn: on, changedBy: [] });
    const siteRecords = {
      [first!.id]: { kind: 'run' as const, ...provenance('Garden speakers', '2026-05-14'), abandoned: null },
      [second!.id]: { kind: 'run' as const, ...provenance('Garden speakers', '2026-05-14'), abandoned: { jobId: 'job-b', jobTitle: 'Lawn rework', on: '2027-06-02' } },
    };
    const { sitePlan } = await drawPacketDrawings({ ...snapshot, settings: { ...snapshot.settings, timeZone: 'UTC', locale: 'en-US' }, siteRecords }, vm);
    expect(sitePlan).toContain('In since May 14, 2026, Garden speakers');
    expect(sitePlan).toContain('Abandoned since Jun 2, 2027, Lawn rework');
    // A revision issued before the site record has no provenance and prints as it did.
    expect((await drawPacketDrawings(snapshot, vm)).sitePlan).not.toContain('In since');
  });

  // Spellings: Merriam-Webster (American "color") and the Oxford English Dictionary (British "colour").
  it.each([
    ['en-US', 'color'],
    ['en-GB', 'colour'],
  ] as const)('spells the site plan legend and the locate page colour key for the company locale %s ("%s", issue 16)', async (locale, color) => {
    const localeSnapshot = { ...snapshot, settings: { ...snapshot.settings, locale } };
    const drawings = await drawPacketDrawings(localeSnapshot, vm);
    expect(drawings.sitePlan).toContain(`(APWA ${color} code)`);
    const html = renderPacketHtml({ vm, drawings, qrSvg: '<svg></svg>', locale });
    expect(html).toContain(`(APWA uniform ${color} code)`);
    expect(html).not.toContain(color === 'color' ? 'colour code' : 'color code');
  });
});
