import { describe, expect, it } from 'vitest';

import { demoPacketSnapshot } from '../domain/packet/demo-packet-snapshot.js';
import { buildPacketViewModel } from '../domain/packet/packet.view-model.js';
import { planImageForDrawing } from '../drawings/job-drawings.js';
import { drawPacketDrawings } from './packet-document.js';

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
  });
});
