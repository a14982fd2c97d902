import type { CreateSiteFeatureInput } from './site-feature.schema.js';

/** An octagon of radius `r` around (cx, cy): a tree canopy or a round spa. */
function octagon(cx: number, cy: number, r: number): { x: number; y: number }[] {
  return Array.from({ length: 8 }, (_, i) => {
    const a = ((i * 45 + 22.5) * Math.PI) / 180;
    return { x: Math.round((cx + Math.cos(a) * r) * 100) / 100, y: Math.round((cy + Math.sin(a) * r) * 100) / 100 };
  });
}

/**
 * The invented demo yard's landmarks, in the plan frame of DEMO_AS_BUILT (house corners at (0, 0) and
 * (14, 0), the yard to the north, side gate post at (22, 16)): what a landscaper would orient by.
 */
export const DEMO_SITE_FEATURES: readonly CreateSiteFeatureInput[] = [
  { kind: 'house', name: 'House', shape: 'polygon', points: [{ x: 0, y: 0 }, { x: 14, y: 0 }, { x: 14, y: -9 }, { x: 0, y: -9 }] },
  { kind: 'driveway', name: 'Driveway', shape: 'polygon', points: [{ x: -8, y: -9 }, { x: -3.5, y: -9 }, { x: -3.5, y: 0 }, { x: -8, y: 0 }] },
  { kind: 'patio', name: 'Back patio (concrete slab)', shape: 'polygon', points: [{ x: 7.5, y: 6.5 }, { x: 14.5, y: 6.5 }, { x: 14.5, y: 9 }, { x: 7.5, y: 9 }] },
  { kind: 'spa', name: 'Spa', shape: 'polygon', points: octagon(22.5 - 2.2, 5.2, 1.2) },
  { kind: 'fence', name: 'West fence', shape: 'line', points: [{ x: -3, y: 0 }, { x: -3, y: 18 }] },
  { kind: 'fence', name: 'Back fence', shape: 'line', points: [{ x: -3, y: 18 }, { x: 22, y: 18 }] },
  { kind: 'fence', name: 'East fence and side gate', shape: 'line', points: [{ x: 14, y: 0 }, { x: 22, y: 0 }, { x: 22, y: 18 }] },
  { kind: 'path', name: 'Stepping-stone path', shape: 'line', points: [{ x: 0.5, y: 0 }, { x: 1, y: 5 }, { x: 3.5, y: 12 }, { x: 8, y: 16.5 }] },
  { kind: 'bed', name: 'Vegetable bed', shape: 'polygon', points: [{ x: -2, y: 13.5 }, { x: 1.5, y: 13.5 }, { x: 1.5, y: 17 }, { x: -2, y: 17 }] },
  { kind: 'tree', name: 'Old oak', shape: 'polygon', points: octagon(17.5, 15.5, 1.6) },
];
