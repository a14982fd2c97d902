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

  it('should still place a label when no spot is clear', () => {
    const crowd = Array.from({ length: 6 }, (_v, i) => ({ id: `p${i}`, x: 200 + i, y: 150, text: 'Crowded point', fontSize: 12 }));
    expect(layoutLabels(crowd, VIEW).size).toBe(6);
  });
});
