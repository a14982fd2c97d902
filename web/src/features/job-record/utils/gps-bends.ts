import type { RoutePoint } from '@domain/as-built/run.schema';

import { formatLength, type LengthSystem } from '../../../lib/units';

/** A point of a run's route placed by a phone's GPS fix: its number along the route (from 1) and accuracy. */
export type GpsBend = { pointNumber: number; accuracyM: number };

/** The points of a route placed by a phone's GPS fix, in route order. */
export function gpsBends(route: readonly RoutePoint[] | undefined): GpsBend[] {
  return (route ?? []).flatMap((point, index) =>
    point.source === 'gps' && point.accuracyM !== undefined ? [{ pointNumber: index + 1, accuracyM: point.accuracyM }] : [],
  );
}

/**
 * What a run's card says about its GPS points, as an item says "Placed by GPS, ±…": e.g. "Route points
 * 2 and 4 by GPS, ±4.8 m and ±6 m". Undefined when no point of the route came from the phone.
 */
export function gpsBendsText(route: readonly RoutePoint[] | undefined, system: LengthSystem): string | undefined {
  const bends = gpsBends(route);
  if (bends.length === 0) return undefined;
  const list = (parts: string[]) => (parts.length === 1 ? parts[0]! : `${parts.slice(0, -1).join(', ')} and ${parts.at(-1)!}`);
  const numbers = list(bends.map((b) => String(b.pointNumber)));
  const accuracies = list(bends.map((b) => `±${formatLength(b.accuracyM, system, 'long')}`));
  return `${bends.length === 1 ? 'Route point' : 'Route points'} ${numbers} by GPS, ${accuracies}`;
}
