import { describe, expect, it } from 'vitest';
import { analyzeAsBuilt } from '@domain/analysis/analyze';
import type { AsBuilt } from '@domain/as-built/as-built.schema';

import { canChangeSitePlan, canUploadPlanImage, itemBodyWith, routeBadge, runBodyWithRoute, runPoints, solveTies, tieDraftsOf } from './plan-records';

function asBuiltWithRoute(route: { x: number; y: number }[], measuredLengthM: number): AsBuilt {
  return {
    zones: [],
    referencePoints: [
      { id: 'r1', label: 'Corner', x: 0, y: 0 },
      { id: 'r2', label: 'Post', x: 6, y: 0 },
    ],
    items: [
      { id: 'amp', kind: 'amplifier', label: 'Amp', channels: [{ id: 'c1', name: 'Patio' }], ratedWatts8Ohm: 50, minimumImpedanceOhm: 4, position: { x: 0, y: 0, source: 'manual' } },
      { id: 'sat', kind: 'speaker', label: 'Sat', nominalImpedanceOhm: 8, position: { x: 10, y: 0, source: 'manual' } },
    ],
    runs: [
      {
        id: 'run',
        label: 'Trunk',
        fromItemId: 'amp',
        toItemId: 'sat',
        cableType: '14/2',
        gauge: { system: 'awg', awg: 14 },
        conductors: 2,
        pairs: [{ pairIndex: 1, channel: { amplifierItemId: 'amp', channelId: 'c1' } }],
        measuredLengthM,
        method: 'direct_burial',
        ...(route.length > 0 ? { route } : {}),
        depthReadings: [{ stationM: 1, depthM: 0.2 }],
      },
    ],
    checks: [],
  };
}

describe('plan records', () => {
  it('should badge a route that disagrees with the measured length, and not one that agrees', () => {
    // The analysis allows max(1 m, 10 % of the measured length) (api/src/domain/geometry/polyline.ts,
    // common practice (no published source)): 10 m drawn against 14 m measured is 4 m short, over 1.4 m.
    const short = asBuiltWithRoute([{ x: 0, y: 0 }, { x: 10, y: 0 }], 14);
    expect(routeBadge(analyzeAsBuilt(short), 'run', (m) => `${m} m`)).toBe('Drawn 4 m short');
    const fine = asBuiltWithRoute([{ x: 0, y: 0 }, { x: 10, y: 0 }], 10.5);
    expect(routeBadge(analyzeAsBuilt(fine), 'run', (m) => `${m} m`)).toBeUndefined();
  });

  it('should draw a run without a route as a straight line between its ends', () => {
    const asBuilt = asBuiltWithRoute([], 12);
    const positions = new Map([
      ['amp', { x: 0, y: 0 }],
      ['sat', { x: 10, y: 0 }],
    ]);
    expect(runPoints(asBuilt.runs[0]!, positions)).toEqual({ points: [{ x: 0, y: 0 }, { x: 10, y: 0 }], isRouteRecorded: false });
    expect(runPoints(asBuilt.runs[0]!, new Map())).toBeUndefined();
  });

  it('should send a run without its id and readings, and an item without its id', () => {
    const asBuilt = asBuiltWithRoute([{ x: 0, y: 0 }, { x: 10, y: 0 }], 12);
    const body = runBodyWithRoute(asBuilt.runs[0]!, [{ x: 1, y: 1 }, { x: 2, y: 2 }]);
    expect(body).not.toHaveProperty('id');
    expect(body).not.toHaveProperty('depthReadings');
    expect(body.route).toEqual([{ x: 1, y: 1 }, { x: 2, y: 2 }]);
    const item = itemBodyWith(asBuilt.items[0]!, { position: { x: 3, y: 4, source: 'manual' } });
    expect(item).not.toHaveProperty('id');
    // Amplifier channels keep their ids so the runs on them stay attached.
    expect(item).toMatchObject({ channels: [{ id: 'c1', name: 'Patio' }], position: { x: 3, y: 4, source: 'manual' } });
  });

  it('should solve typed ties with the domain solver and skip unreadable rows', () => {
    const asBuilt = asBuiltWithRoute([], 12);
    // 3-4-5 triangle on the 6 m base from (0, 0) to (6, 0): the left solution is (3, 4).
    const solution = solveTies(
      [
        { referencePointId: 'r1', distance: '5' },
        { referencePointId: 'r2', distance: '5 m' },
        { referencePointId: '', distance: 'oops' },
      ],
      'left',
      asBuilt.referencePoints,
      'metric',
    );
    expect(solution?.ok && { x: solution.x, y: solution.y }).toEqual({ x: 3, y: 4 });
    expect(solveTies([{ referencePointId: 'r1', distance: '5' }], '', asBuilt.referencePoints, 'metric')).toBeUndefined();
    expect(tieDraftsOf(undefined, String)).toHaveLength(2);
  });

  it('should let crew leads and the office upload the plan image and set its scale and north, as the API does', () => {
    const roles = ['admin', 'office', 'lead', 'tech', 'homeowner'] as const;
    expect(roles.map(canUploadPlanImage)).toEqual([true, true, true, false, false]);
    expect(roles.map(canChangeSitePlan)).toEqual([true, true, true, false, false]);
  });
});
