import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { lineLabelCandidates, placeLabels, pointLabelCandidates, type LabelRequest } from './label-placement.js';
import { boxContains, boxesIntersect } from './text-box.js';

const BOUNDS = { x: 0, y: 0, width: 300, height: 200 };

function pointLabel(id: string, x: number, y: number, width = 40, height = 9, priority = 1): LabelRequest {
  return { id, width, height, priority, anchor: { x, y }, preferred: pointLabelCandidates({ x, y }, 5, width, height) };
}

function expectNoOverlaps(placed: { box: { x: number; y: number; width: number; height: number } }[]): void {
  for (let i = 0; i < placed.length; i += 1) {
    for (let j = i + 1; j < placed.length; j += 1) {
      expect(boxesIntersect(placed[i]!.box, placed[j]!.box), `labels ${i} and ${j} overlap`).toBe(false);
    }
  }
}

describe(placeLabels.name, () => {
  it('should put a lone label at its first preferred spot, without a leader', () => {
    const { placed, unplaced } = placeLabels([pointLabel('a', 100, 100)], { bounds: BOUNDS });
    expect(unplaced).toEqual([]);
    // right of the symbol: centre at x = 100 + 5 + 2 + 20
    expect(placed[0]!.box).toEqual({ x: 107, y: 95.5, width: 40, height: 9 });
    expect(placed[0]!.leader).toBeNull();
  });

  it('should give the higher priority label the best spot and move the other', () => {
    const { placed } = placeLabels([pointLabel('low', 100, 100, 40, 9, 1), pointLabel('high', 102, 100, 40, 9, 5)], { bounds: BOUNDS });
    const high = placed.find((p) => p.id === 'high')!;
    const low = placed.find((p) => p.id === 'low')!;
    expect(high.box.x).toBe(109);
    expect(boxesIntersect(high.box, low.box)).toBe(false);
  });

  it('should avoid covering a symbol when another spot is free', () => {
    const obstacle = { x: 105, y: 94, width: 50, height: 12 };
    const { placed } = placeLabels([pointLabel('a', 100, 100)], { bounds: BOUNDS, obstacles: [obstacle] });
    expect(boxesIntersect(placed[0]!.box, obstacle)).toBe(false);
  });

  it('should displace a label with a leader when every preferred spot is taken', () => {
    const requests = [pointLabel('first', 100, 100, 40, 9, 9), ...[1, 2, 3, 4, 5, 6, 7].map((i) => pointLabel(`n${i}`, 100, 100, 40, 9, 9 - i / 10)), pointLabel('last', 100, 100, 40, 9, 0)];
    const { placed, unplaced } = placeLabels(requests, { bounds: BOUNDS });
    expect(unplaced).toEqual([]);
    expect(placed.find((p) => p.id === 'last')!.leader).not.toBeNull();
    expectNoOverlaps(placed);
  });

  it('should leave a label off rather than overlap when there is no room at all', () => {
    const tiny = { x: 0, y: 0, width: 60, height: 12 };
    const { placed, unplaced } = placeLabels([pointLabel('a', 10, 6, 40, 9, 2), pointLabel('b', 10, 6, 40, 9, 1)], { bounds: tiny });
    expect(placed.map((p) => p.id)).toEqual(['a']);
    expect(unplaced).toEqual(['b']);
  });

  it('should be deterministic', () => {
    const requests = [0, 1, 2, 3, 4, 5].map((i) => pointLabel(`l${i}`, 100 + i * 3, 100 + i, 50, 9));
    expect(placeLabels(requests, { bounds: BOUNDS })).toEqual(placeLabels([...requests].reverse(), { bounds: BOUNDS }));
  });

  it('should place labels the same whatever their ids (a recorded job has random uuids)', () => {
    const requests = [0, 1, 2, 3, 4, 5].map((i) => pointLabel(`l${i}`, 100 + (i % 2) * 3, 100 + i, 50, 9));
    const renamed = requests.map((r, i) => ({ ...r, id: `z${5 - i}` }));
    const boxes = (placed: ReturnType<typeof placeLabels>['placed'], ids: string[]) => ids.map((id) => placed.find((p) => p.id === id)?.box);
    expect(boxes(placeLabels(renamed, { bounds: BOUNDS }).placed, renamed.map((r) => r.id))).toEqual(
      boxes(placeLabels(requests, { bounds: BOUNDS }).placed, requests.map((r) => r.id)),
    );
  });

  it('should never overlap two labels or leave the bounds, however crowded (property)', () => {
    const label = fc.record({
      x: fc.double({ min: 0, max: 300, noNaN: true }),
      y: fc.double({ min: 0, max: 200, noNaN: true }),
      chars: fc.integer({ min: 1, max: 40 }),
      lines: fc.integer({ min: 1, max: 3 }),
      priority: fc.integer({ min: 0, max: 3 }),
      isLine: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.array(label, { minLength: 1, maxLength: 80 }), (specs) => {
        const requests: LabelRequest[] = specs.map((s, i) => {
          const width = s.chars * 6.5 * 0.6 + 2;
          const height = s.lines * 6.5 * 1.2 + 2;
          const anchor = { x: s.x, y: s.y };
          const preferred = s.isLine
            ? lineLabelCandidates([anchor, { x: Math.min(300, s.x + 40), y: Math.min(200, s.y + 25) }], width, height)
            : pointLabelCandidates(anchor, 5, width, height);
          return { id: `l${i}`, width, height, priority: s.priority, anchor, preferred };
        });
        const { placed, unplaced } = placeLabels(requests, { bounds: BOUNDS });
        expect(placed.length + unplaced.length).toBe(requests.length);
        for (const p of placed) expect(boxContains(BOUNDS, p.box)).toBe(true);
        expectNoOverlaps(placed);
      }),
      { numRuns: 150 },
    );
  });
});

describe('placeLabels with run lines as obstacles', () => {
  const run = { id: 'other-run', points: [{ x: 150, y: 0 }, { x: 150, y: 200 }] };

  it('moves a label off a line it does not own, with a leader, and keeps it on its own line', () => {
    // The preferred spot (right of the symbol at x 100–140 … 150+) lies across the vertical line at x = 150.
    const request: LabelRequest = { id: 'a', width: 60, height: 9, priority: 1, anchor: { x: 120, y: 100 }, preferred: [{ x: 150, y: 100 }] };
    const moved = placeLabels([request], { bounds: BOUNDS, lines: [run] }).placed[0]!;
    expect(moved.box.x + moved.box.width < 149 || moved.box.x > 151).toBe(true);
    expect(moved.leader).not.toBeNull();
    const own = placeLabels([{ ...request, ownLines: ['other-run'] }], { bounds: BOUNDS, lines: [run] }).placed[0]!;
    expect(own.box).toEqual({ x: 120, y: 95.5, width: 60, height: 9 });
    expect(own.leader).toBeNull();
  });

  it('leaves a label off (reported) when every spot lies across a line it does not own', () => {
    const grid = Array.from({ length: 31 }, (_, i) => ({ id: `l${i}`, points: [{ x: i * 10, y: 0 }, { x: i * 10, y: 200 }] }));
    const { placed, unplaced } = placeLabels([pointLabel('wide', 150, 100, 40, 9)], { bounds: BOUNDS, lines: grid });
    expect(placed).toEqual([]);
    expect(unplaced).toEqual(['wide']);
  });

  it('keeps 1 pt clear of a line by default (a stroke has width)', () => {
    const request: LabelRequest = { id: 'a', width: 20, height: 9, priority: 1, anchor: { x: 100, y: 100 }, preferred: [{ x: 139.5, y: 100 }], allowDisplacement: false };
    // Box right edge at 149.5: half a point from the line's centre.
    expect(placeLabels([request], { bounds: BOUNDS, lines: [run] }).unplaced).toEqual(['a']);
    expect(placeLabels([request], { bounds: BOUNDS, lines: [run], lineClearance: 0 }).unplaced).toEqual([]);
  });
});
