import { describe, expect, it } from 'vitest';

import { gpsBends, gpsBendsText } from './gps-bends';

describe('gpsBends', () => {
  it('should list only the route points placed by GPS, numbered from 1 along the route', () => {
    const route = [{ x: 0, y: 0 }, { x: 1, y: 1, source: 'gps' as const, accuracyM: 4.8 }, { x: 2, y: 2, source: 'manual' as const }, { x: 3, y: 3, source: 'gps' as const, accuracyM: 6 }];
    expect(gpsBends(route)).toEqual([
      { pointNumber: 2, accuracyM: 4.8 },
      { pointNumber: 4, accuracyM: 6 },
    ]);
    expect(gpsBends(undefined)).toEqual([]);
  });
});

describe('gpsBendsText', () => {
  it('should say nothing for a route drawn by hand or without a source', () => {
    expect(gpsBendsText([{ x: 0, y: 0 }, { x: 1, y: 0, source: 'manual' }], 'metric')).toBeUndefined();
    expect(gpsBendsText(undefined, 'metric')).toBeUndefined();
  });

  it('should name each GPS point and its accuracy', () => {
    expect(gpsBendsText([{ x: 0, y: 0 }, { x: 1, y: 0, source: 'gps', accuracyM: 5 }], 'metric')).toBe('Route point 2 by GPS, ±5 m');
    const text = gpsBendsText(
      [
        { x: 0, y: 0, source: 'gps', accuracyM: 3 },
        { x: 1, y: 0, source: 'gps', accuracyM: 5 },
        { x: 2, y: 0, source: 'gps', accuracyM: 7 },
      ],
      'metric',
    );
    expect(text).toBe('Route points 1, 2 and 3 by GPS, ±3 m, ±5 m and ±7 m');
  });
});
