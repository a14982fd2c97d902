import { describe, expect, it } from 'vitest';

import { layoutLabels } from './label-layout';

const VIEW = { width: 400, height: 300 };

describe('layoutLabels', () => {
  it('should put a lone label right of its symbol', () => {
    expect(layoutLabels([{ id: 'a', x: 100, y: 100, text: 'Amp', fontSize: 12 }], VIEW).get('a')).toEqual({ x: 115, y: 104, textAnchor: 'start' });
  });

  it('should put a label left of its symbol when the right would leave the view', () => {
    expect(layoutLabels([{ id: 'a', x: 380, y: 100, text: 'Spa satellite', fontSize: 12 }], VIEW).get('a')?.textAnchor).toBe('end');
  });

  it('should move the second of two neighbours off the first one’s label', () => {
    const placed = layoutLabels(
      [
        { id: 'left', x: 100, y: 100, text: 'Patio splice box', fontSize: 12 },
        // 60 px to the right: its label would run into nothing, but the first label runs over its symbol,
        // so the first one goes elsewhere and both stay clear.
        { id: 'right', x: 160, y: 100, text: 'Spa splice box', fontSize: 12 },
      ],
      VIEW,
    );
    expect(placed.get('left')?.textAnchor).not.toBe('start');
    expect(placed.get('right')).toEqual({ x: 175, y: 104, textAnchor: 'start' });
  });

  it('should leave off a label with no clear spot rather than write it over another, but never the pinned one', () => {
    // Twenty symbols on one spot: sixteen places around it at most, so some names cannot be written.
    const crowd = Array.from({ length: 20 }, (_v, i) => ({ id: `p${i}`, x: 200 + i, y: 150, text: 'Crowded point', fontSize: 12 }));
    const placed = layoutLabels(crowd, VIEW);
    expect(placed.size).toBeGreaterThan(0);
    expect(placed.size).toBeLessThan(20);
    expect(placed.has('p19')).toBe(false);
    expect(layoutLabels([...crowd.slice(0, 19), { ...crowd[19]!, isPinned: true }], VIEW).has('p19')).toBe(true);
  });

  it('should never let two placed labels overlap, however crowded', () => {
    const crowd = Array.from({ length: 40 }, (_v, i) => ({ id: `p${i}`, x: 60 + (i % 8) * 40, y: 60 + Math.floor(i / 8) * 40, text: `Satellite ${i}`, fontSize: 12 }));
    const placed = layoutLabels(crowd, VIEW);
    const boxes = [...placed].map(([id, spot]) => {
      const width = crowd.find((c) => c.id === id)!.text.length * 12 * 0.58;
      const left = spot.textAnchor === 'start' ? spot.x : spot.textAnchor === 'end' ? spot.x - width : spot.x - width / 2;
      return { left, right: left + width, top: spot.y - 12, bottom: spot.y + 3 };
    });
    for (const [i, a] of boxes.entries()) for (const b of boxes.slice(i + 1)) expect(a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom).toBe(false);
  });
});
