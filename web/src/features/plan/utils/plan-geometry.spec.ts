import { describe, expect, it } from 'vitest';
import { analyzeAsBuilt } from '@domain/analysis/analyze';
import type { AsBuilt } from '@domain/as-built/as-built.schema';

// The server's own site-plan layout: the editor must place the image exactly as the packet does.
import { layoutSitePlan } from '../../../../../api/src/drawings/site-plan-layout';

import {
  imagePlanBox,
  imageToPlan,
  insertRoutePoint,
  moveRoutePoint,
  nearestSegment,
  normalizeDegrees,
  placementOf,
  planToImage,
  provisionalPlacement,
  removeRoutePoint,
  roundPlanPoint,
  scaleBarFor,
  snapPoint,
  UNCALIBRATED_IMAGE_WIDTH_M,
} from './plan-geometry';

// Worked by hand: A = (100, 400) px and B = (600, 400) px are 500 px apart; 10 m between them gives
// 0.02 m per pixel, with A at plan (0, 0), image y down and plan y up.
const CALIBRATION = { a: { x: 100, y: 400 }, b: { x: 600, y: 400 }, distanceM: 10 };

describe('image ↔ plan', () => {
  const placement = placementOf(CALIBRATION);

  it('should put calibration point A at the plan origin and B the given distance away', () => {
    expect(placement.metresPerPixel).toBeCloseTo(0.02, 12);
    expect(imageToPlan(CALIBRATION.a, placement)).toEqual({ x: 0, y: 0 });
    const b = imageToPlan(CALIBRATION.b, placement);
    expect(b.x).toBeCloseTo(10, 12);
    expect(b.y).toBeCloseTo(0, 12);
  });

  it.each([
    // pixel → plan, by hand: x = (u − 100)·0.02, y = −(v − 400)·0.02
    [{ x: 0, y: 0 }, { x: -2, y: 8 }],
    [{ x: 100, y: 0 }, { x: 0, y: 8 }],
    [{ x: 350, y: 650 }, { x: 5, y: -5 }],
  ])('should map pixel %o to plan %o and back', (pixel, plan) => {
    const p = imageToPlan(pixel, placement);
    expect(p.x).toBeCloseTo(plan.x, 9);
    expect(p.y).toBeCloseTo(plan.y, 9);
    const back = planToImage(p, placement);
    expect(back.x).toBeCloseTo(pixel.x, 9);
    expect(back.y).toBeCloseTo(pixel.y, 9);
  });

  it('should use the distance between A and B whatever their direction', () => {
    // A 3-4-5 triangle: 300 px across and 400 px down is 500 px; 25 m → 0.05 m/px.
    const diagonal = placementOf({ a: { x: 0, y: 0 }, b: { x: 300, y: 400 }, distanceM: 25 });
    expect(diagonal.metresPerPixel).toBeCloseTo(0.05, 12);
    expect(imageToPlan({ x: 300, y: 400 }, diagonal)).toEqual({ x: 15, y: -20 });
  });

  it('should refuse a calibration whose points coincide', () => {
    expect(() => placementOf({ a: { x: 5, y: 5 }, b: { x: 5, y: 5 }, distanceM: 3 })).toThrow(/two distinct points/);
  });

  it('should show an uncalibrated image at a working width with its corner at the origin', () => {
    const provisional = provisionalPlacement(2000);
    const box = imagePlanBox(2000, 1000, provisional);
    expect(box.topLeft).toEqual({ x: 0, y: 0 });
    expect(box.widthM).toBeCloseTo(UNCALIBRATED_IMAGE_WIDTH_M, 9);
    expect(box.heightM).toBeCloseTo(UNCALIBRATED_IMAGE_WIDTH_M / 2, 9);
  });

  it('should place the image where the printed site plan places it', () => {
    const widthPx = 1000;
    const heightPx = 500;
    const asBuilt: AsBuilt = {
      zones: [],
      referencePoints: [],
      items: [
        { id: 'a', kind: 'junction', label: 'J1', position: { x: 0, y: 0, source: 'manual' } },
        { id: 'b', kind: 'junction', label: 'J2', position: { x: 10, y: 0, source: 'manual' } },
        { id: 'c', kind: 'junction', label: 'J3', position: { x: 3, y: 6.5, source: 'manual' } },
      ],
      runs: [],
      checks: [],
    };
    const layout = layoutSitePlan(asBuilt, analyzeAsBuilt(asBuilt), {
      planImage: {
        href: 'data:image/png;base64,AAAA',
        widthPx,
        heightPx,
        calibration: { imageA: CALIBRATION.a, imageB: CALIBRATION.b, distanceM: CALIBRATION.distanceM },
      },
    });
    const box = layout.image!.box;
    const ours = imagePlanBox(widthPx, heightPx, placement);
    expect(box.width / layout.ptPerMetre).toBeCloseTo(ours.widthM, 9);
    expect(box.height / layout.ptPerMetre).toBeCloseTo(ours.heightM, 9);
    // Each item must sit on the same image pixel in print as in the editor.
    for (const item of layout.items) {
      const position = asBuilt.items.find((candidate) => candidate.id === item.itemId)!.position!;
      const pixel = planToImage(position, placement);
      expect(box.x + (pixel.x / widthPx) * box.width).toBeCloseTo(item.point.x, 6);
      expect(box.y + (pixel.y / heightPx) * box.height).toBeCloseTo(item.point.y, 6);
    }
  });
});

describe('snapping and route edits', () => {
  const route = [
    { x: 0, y: 0 },
    { x: 10, y: 0 },
    { x: 10, y: 10 },
  ];

  it('should snap to the nearest candidate within the tolerance only', () => {
    const candidates = [
      { x: 1, y: 1, id: 'far' },
      { x: 0.2, y: 0.1, id: 'near' },
    ];
    expect(snapPoint({ x: 0, y: 0 }, candidates, 0.5)?.id).toBe('near');
    expect(snapPoint({ x: 5, y: 5 }, candidates, 0.5)).toBeUndefined();
  });

  it('should find the segment a tap is nearest to, with the foot of the perpendicular', () => {
    expect(nearestSegment(route, { x: 4, y: 1 })).toEqual({ index: 0, distanceM: 1, foot: { x: 4, y: 0 } });
    expect(nearestSegment(route, { x: 12, y: 6 })).toEqual({ index: 1, distanceM: 2, foot: { x: 10, y: 6 } });
    expect(nearestSegment([{ x: 0, y: 0 }], { x: 1, y: 1 })).toBeUndefined();
  });

  it('should insert a point into a segment, move a point and delete one', () => {
    expect(insertRoutePoint(route, 0, { x: 5, y: 0 })).toEqual([{ x: 0, y: 0 }, { x: 5, y: 0 }, { x: 10, y: 0 }, { x: 10, y: 10 }]);
    expect(insertRoutePoint(route, 1, { x: 10, y: 5 })).toEqual([{ x: 0, y: 0 }, { x: 10, y: 0 }, { x: 10, y: 5 }, { x: 10, y: 10 }]);
    expect(moveRoutePoint(route, 2, { x: 12, y: 9 })).toEqual([{ x: 0, y: 0 }, { x: 10, y: 0 }, { x: 12, y: 9 }]);
    expect(removeRoutePoint(route, 1)).toEqual([{ x: 0, y: 0 }, { x: 10, y: 10 }]);
    expect(() => insertRoutePoint(route, 2, { x: 0, y: 0 })).toThrow(RangeError);
    expect(() => removeRoutePoint(route, 3)).toThrow(RangeError);
    // The route passed in is never changed.
    expect(route).toHaveLength(3);
  });

  it('should round stored points to the millimetre', () => {
    expect(roundPlanPoint({ x: 1.23456, y: -7.0004 })).toEqual({ x: 1.235, y: -7 });
  });
});

describe('scale bar and north', () => {
  it.each([
    // 20 px per metre, 140 px at most: 7 m fit, the longest 1-2-5 length is 5 m = 100 px.
    [20, 140, 'metric', 5, 100, '5 m'],
    // 1 px per metre: 140 m fit → 100 m.
    [1, 140, 'metric', 100, 100, '100 m'],
    // 400 px per metre: 0.35 m fit → 20 cm.
    [400, 140, 'metric', 0.2, 80, '20 cm'],
  ] as const)('should pick a round length at %s px/m (metric)', (pxPerM, max, system, lengthM, pixels, label) => {
    const bar = scaleBarFor(pxPerM, max, system);
    expect(bar.lengthM).toBeCloseTo(lengthM, 9);
    expect(bar.pixels).toBeCloseTo(pixels, 6);
    expect(bar.label).toBe(label);
  });

  it('should count feet in imperial (1 ft = 0.3048 m exactly, NIST SP 811)', () => {
    // 20 px per metre = 6.096 px per foot; 140 px hold 22.97 ft → 20 ft = 6.096 m = 121.92 px.
    const bar = scaleBarFor(20, 140, 'imperial');
    expect(bar.label).toBe('20 ft');
    expect(bar.lengthM).toBeCloseTo(6.096, 9);
    expect(bar.pixels).toBeCloseTo(121.92, 6);
  });

  it.each([
    [0, 0],
    [370, 10],
    [-10, 350],
    [360, 0],
  ])('should bring %s° into [0, 360) as %s°', (input, expected) => {
    expect(normalizeDegrees(input)).toBe(expected);
  });
});
