import { describe, expect, it } from 'vitest';

import { boxesOverlap, EDGE_PX, labelBox, landmarkSpots, layoutLabels, type LabelRequest } from './label-layout';

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

  it('should keep a landmark’s name off an item’s name and symbol: moved when it can be, else left off', () => {
    // The patio's centroid is (150, 100): its name centred there would run over the satellite's name
    // (right of the symbol at 100, 100), so it goes on the line above or below.
    const patio = [{ x: 110, y: 70 }, { x: 190, y: 70 }, { x: 190, y: 130 }, { x: 110, y: 130 }];
    const requests: LabelRequest[] = [
      { id: 'item', x: 100, y: 100, text: 'Patio satellite', fontSize: 12 },
      { id: 'patio', text: 'Back patio', fontSize: 12, spots: landmarkSpots('polygon', patio, { text: 'Back patio', fontSize: 12 }, VIEW) },
    ];
    const placed = layoutLabels(requests, VIEW);
    expect(placed.get('item')).toEqual({ x: 115, y: 104, textAnchor: 'start' });
    const itemBox = labelBox(requests[0]!, placed.get('item')!);
    const patioBox = labelBox(requests[1]!, placed.get('patio')!);
    expect(boxesOverlap(labelBox(requests[1]!, landmarkSpots('polygon', patio, { text: 'Back patio', fontSize: 12 }, VIEW)[0]!), itemBox)).toBe(true);
    expect(boxesOverlap(patioBox, itemBox)).toBe(false);
    expect(boxesOverlap(patioBox, { left: 89, top: 89, right: 111, bottom: 111 })).toBe(false);

    // A landmark whose only spot is the item's name's is left off, and the item keeps its name.
    const crowded = layoutLabels([requests[0]!, { id: 'patio', text: 'Back patio', fontSize: 12, spots: [{ x: 140, y: 104, textAnchor: 'middle' }] }], VIEW);
    expect(crowded.has('patio')).toBe(false);
    expect(crowded.get('item')).toEqual({ x: 115, y: 104, textAnchor: 'start' });
  });

  it('should never write a landmark’s name over an item’s symbol, even with nothing else near', () => {
    const placed = layoutLabels(
      [
        { id: 'item', x: 150, y: 100, text: 'Amp', fontSize: 12 },
        { id: 'fence', text: 'East fence', fontSize: 12, spots: [{ x: 150, y: 104, textAnchor: 'middle' }, { x: 150, y: 130, textAnchor: 'middle' }] },
      ],
      VIEW,
    );
    expect(placed.get('fence')).toEqual({ x: 150, y: 130, textAnchor: 'middle' });
  });

  it('should show a selected landmark’s name even where it overlaps, before the others', () => {
    const placed = layoutLabels(
      [
        { id: 'item', x: 100, y: 100, text: 'Patio satellite', fontSize: 12 },
        { id: 'patio', text: 'Back patio', fontSize: 12, isPinned: true, spots: [{ x: 140, y: 104, textAnchor: 'middle' }] },
      ],
      VIEW,
    );
    expect(placed.get('patio')).toEqual({ x: 140, y: 104, textAnchor: 'middle' });
    expect(placed.get('item')?.textAnchor).not.toBe('start');
  });

  it('should move a name off the controls’ box, or leave it off when every spot is under the controls', () => {
    // Zoom buttons in the bottom right corner, 56 px wide and 170 px tall.
    const buttons = { left: 340, top: 126, right: 400, bottom: 300 };
    const request = { id: 'a', x: 240, y: 200, text: 'Spa splice box', fontSize: 12 };
    expect(labelBox(request, layoutLabels([request], VIEW).get('a')!).right).toBeGreaterThan(buttons.left);
    const moved = layoutLabels([request], VIEW, { blocked: [buttons] }).get('a')!;
    expect(moved.textAnchor).toBe('end');
    expect(boxesOverlap(labelBox(request, moved), buttons)).toBe(false);

    // A symbol under the middle of a wide control: no spot around it is clear.
    const hint = { left: 0, top: 0, right: 400, bottom: 120 };
    expect(layoutLabels([{ id: 'b', x: 200, y: 40, text: 'Gate post', fontSize: 12 }], VIEW, { blocked: [hint] }).has('b')).toBe(false);
    // Pinned, it still shows, on a spot off the controls when there is one, even where every such spot
    // runs over a symbol (a row of them just below it).
    const pinned = { id: 'c', x: 200, y: 110, text: 'Gate post', fontSize: 12, isPinned: true };
    const row = Array.from({ length: 21 }, (_v, i) => ({ id: `s${i}`, x: 120 + i * 8, y: 140, text: '', fontSize: 12 }));
    expect(layoutLabels([{ ...pinned, isPinned: false }, ...row], VIEW, { blocked: [hint] }).has('c')).toBe(false);
    const spot = layoutLabels([pinned, ...row], VIEW, { blocked: [hint] }).get('c')!;
    expect(spot).toEqual({ x: 200, y: 137, textAnchor: 'middle' });
    expect(boxesOverlap(labelBox(pinned, spot), hint)).toBe(false);
  });

  it('should keep every name inside the frame, clear of its edges', () => {
    // Right of the symbol the name would end 2.4 px from the right edge: inside the view, not clear of its edge.
    const request = { id: 'a', x: 313, y: 100, text: 'Spa lights', fontSize: 12 };
    const end = 313 + 15 + labelBox(request, { x: 0, y: 0, textAnchor: 'start' }).right;
    expect(end).toBeGreaterThan(VIEW.width - EDGE_PX);
    expect(end).toBeLessThan(VIEW.width);
    expect(layoutLabels([request], VIEW).get('a')?.textAnchor).toBe('end');
    // A landmark whose spots are all off screen is left off rather than cut.
    expect(layoutLabels([{ id: 'f', text: 'Driveway', fontSize: 12, spots: [{ x: 5, y: 100, textAnchor: 'middle' }] }], VIEW).has('f')).toBe(false);
  });
});

describe('landmarkSpots', () => {
  it('should centre an area’s name on its centroid first, then on the line above and below', () => {
    // An L-shaped house: its area centroid (shoelace), not the mean of its corners.
    const house = [{ x: 0, y: 0 }, { x: 200, y: 0 }, { x: 200, y: 100 }, { x: 100, y: 100 }, { x: 100, y: 200 }, { x: 0, y: 200 }];
    const [first, above, below] = landmarkSpots('polygon', house, { text: 'House', fontSize: 12 }, { width: 400, height: 400 });
    // Centroid of the L: (3 squares of 100: centres (50,50), (150,50), (50,150)) = (83.3, 83.3).
    expect(first!.x).toBeCloseTo(250 / 3, 5);
    expect(first!.y).toBeCloseTo(250 / 3 + 4, 5);
    expect(first!.textAnchor).toBe('middle');
    expect(above!.y).toBeLessThan(first!.y);
    expect(below!.y).toBeGreaterThan(first!.y);
  });

  it('should try the middle of the part in view when an area’s centroid is off screen', () => {
    // A lawn from x −300 to 100: its centroid (−100) is off screen, the part in view is x 0..100.
    const lawn = [{ x: -300, y: 50 }, { x: 100, y: 50 }, { x: 100, y: 150 }, { x: -300, y: 150 }];
    const spots = landmarkSpots('polygon', lawn, { text: 'Lawn', fontSize: 12 }, VIEW);
    expect(spots.slice(0, 3).map((s) => s.x)).toEqual([50, 50, 50]);
    // Then the centroid's, moved sideways into the frame (the name is 27.84 px wide).
    expect(spots[3]!.x).toBeCloseTo(EDGE_PX + 13.92, 5);
    expect(layoutLabels([{ id: 'lawn', text: 'Lawn', fontSize: 12, spots }], VIEW).get('lawn')).toEqual({ x: 50, y: 104, textAnchor: 'middle' });
  });

  it('should move a long name sideways into the frame while it stays over its area', () => {
    // A patio from x −20 to 180: its name (26 characters, about 181 px) centred on x 80 would start
    // left of the frame; moved right to start 4 px inside it, its centre (94.5) is still over the patio.
    const patio = [{ x: -20, y: 130 }, { x: 180, y: 130 }, { x: 180, y: 200 }, { x: -20, y: 200 }];
    const request = { text: 'Back patio (concrete slab)', fontSize: 12 };
    const [first] = landmarkSpots('polygon', patio, request, VIEW);
    expect(labelBox(request, { ...first!, x: 80 }).left).toBeLessThan(0);
    expect(labelBox(request, first!).left).toBeCloseTo(EDGE_PX, 5);
    // A name wider than its area stays centred on it (and is left off if it does not fit).
    const bed = [{ x: -10, y: 50 }, { x: 30, y: 50 }, { x: 30, y: 90 }, { x: -10, y: 90 }];
    expect(landmarkSpots('polygon', bed, request, VIEW)[0]!.x).toBe(10);
  });

  it('should put a landmark’s name off the cable runs when it can, and on one only when nothing else is clear', () => {
    const patio = [{ x: 100, y: 80 }, { x: 300, y: 80 }, { x: 300, y: 160 }, { x: 100, y: 160 }];
    const request = { id: 'patio', text: 'Back patio', fontSize: 12, spots: landmarkSpots('polygon', patio, { text: 'Back patio', fontSize: 12 }, VIEW) };
    // A run straight across the patio's middle, through where its name would be centred.
    const run = [{ x: 60, y: 120 }, { x: 340, y: 120 }];
    expect(layoutLabels([request], VIEW).get('patio')).toEqual({ x: 200, y: 124, textAnchor: 'middle' });
    const moved = layoutLabels([request], VIEW, { lines: [run] }).get('patio')!;
    expect(moved).toEqual({ x: 200, y: 108, textAnchor: 'middle' });
    // A diagonal run crossing every spot: the name goes where it would without runs.
    const everywhere = [{ x: 0, y: 0 }, { x: 400, y: 300 }];
    const crossing = Array.from({ length: 30 }, (_v, i) => [{ x: 0, y: i * 10 }, { x: 400, y: i * 10 + 5 }]);
    expect(layoutLabels([request], VIEW, { lines: [everywhere, ...crossing] }).get('patio')).toEqual({ x: 200, y: 124, textAnchor: 'middle' });
    // Item names do not move for runs (a run ends at its item's symbol).
    expect(layoutLabels([{ id: 'amp', x: 100, y: 100, text: 'Amp', fontSize: 12 }], VIEW, { lines: [[{ x: 100, y: 100 }, { x: 200, y: 100 }]] }).get('amp')).toEqual({ x: 115, y: 104, textAnchor: 'start' });
  });

  it('should put a small area’s name beside its outline when there is no room inside', () => {
    // A spa 24 px across with an item's symbol on it: its name goes just right of the outline.
    const spa = [{ x: 188, y: 88 }, { x: 212, y: 88 }, { x: 212, y: 112 }, { x: 188, y: 112 }];
    const placed = layoutLabels([{ id: 'light', x: 200, y: 100, text: '', fontSize: 12 }, { id: 'spa', text: 'Spa', fontSize: 12, spots: landmarkSpots('polygon', spa, { text: 'Spa', fontSize: 12 }, VIEW) }], VIEW);
    expect(placed.get('spa')).toEqual({ x: 216, y: 104, textAnchor: 'start' });
  });

  it('should put a line’s name just above its middle, then below it, then farther along', () => {
    const fence = [{ x: 0, y: 100 }, { x: 100, y: 100 }, { x: 100, y: 300 }];
    const spots = landmarkSpots('line', fence, { text: 'Back fence', fontSize: 12 }, VIEW);
    // 300 px long: the middle is 150 px along, 50 px down the second leg.
    expect(spots[0]).toEqual({ x: 100, y: 145, textAnchor: 'middle' });
    expect(spots[1]).toEqual({ x: 100, y: 164, textAnchor: 'middle' });
    // 105 px along: 5 px down the second leg.
    expect(spots[2]).toEqual({ x: 100, y: 100, textAnchor: 'middle' });
  });
});
