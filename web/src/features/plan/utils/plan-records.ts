import type { AsBuiltAnalysis } from '@domain/analysis/analyze';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';
import type { Item, ReferencePoint } from '@domain/as-built/item.schema';
import type { InstallMethod, Run } from '@domain/as-built/run.schema';
import type { Role } from '@domain/auth/roles';
import { solvePositionFromTies, type TieObservation, type TieSolution } from '@domain/geometry/ties';
import { runStyleKey } from '@drawings/marking-palette';

import { parseLength, type LengthSystem } from '../../../lib/units';
import type { TieDraft } from '../../jobs';

/** A tie as typed: the reference point and the distance in the user's units (the workspace ties editor's own draft). */
export type { TieDraft };

/** Layers the editor can hide. */
export type PlanLayers = { image: boolean; references: boolean; labels: boolean; runs: boolean; spareAndAbandoned: boolean };

export const DEFAULT_PLAN_LAYERS: PlanLayers = { image: true, references: true, labels: true, runs: true, spareAndAbandoned: true };

/**
 * Who may upload or replace the site-plan image (the API's PUT /api/sites/:id/plan-image roles: the
 * office and crew leads, who photograph the drawing on site).
 */
export function canUploadPlanImage(role: Role): boolean {
  return role === 'admin' || role === 'office' || role === 'lead';
}

/**
 * Who may calibrate the image and set north (PATCH /api/sites/:id): the office, and the crew lead who
 * sets the plan up on site (the API lets a lead change only these two fields of a site).
 */
export function canChangeSitePlan(role: Role): boolean {
  return role === 'admin' || role === 'office' || role === 'lead';
}

/** Who may add reference points to a site (the same roles as the API's reference-point routes). */
export function canAddReferencePoint(role: Role): boolean {
  return role === 'admin' || role === 'office' || role === 'lead';
}

/** How a run is drawn: by its installation method, or as spare or abandoned (as in print; indoor stays indoor). */
export type RunStyle = InstallMethod | 'spare' | 'abandoned';

export function runStyleOf(run: Run): RunStyle {
  return runStyleKey(run);
}

/** The points a run is drawn with: its recorded route, or a straight line between its ends' positions. */
export function runPoints(run: Run, positions: ReadonlyMap<string, PlanPoint>): { points: PlanPoint[]; isRouteRecorded: boolean } | undefined {
  if (run.route !== undefined) return { points: run.route, isRouteRecorded: true };
  const from = positions.get(run.fromItemId);
  const to = positions.get(run.toItemId);
  return from && to ? { points: [from, to], isRouteRecorded: false } : undefined;
}

/** Item positions the analysis settled on (from ties, by hand or GPS). */
export function positionsOf(analysis: AsBuiltAnalysis): Map<string, PlanPoint> {
  return new Map(analysis.positions.map((p) => [p.itemId, { x: p.x, y: p.y }]));
}

/** The PUT body of a run with a new route. Depth readings are left out, so the server keeps them as they are. */
export function runBodyWithRoute(run: Run, route: readonly PlanPoint[]): Record<string, unknown> {
  const { id: _id, depthReadings: _readings, ...rest } = run;
  return { ...rest, route: [...route] };
}

/** The PUT body of an item at a new position (amplifier channels keep their ids, so runs stay attached). */
export function itemBodyWith(item: Item, change: Partial<Pick<Item, 'position' | 'ties' | 'sideHint'>>): Record<string, unknown> {
  const { id: _id, ...rest } = item;
  return { ...rest, ...change };
}

/** Ties typed so far as solver input: rows without a point or a readable positive distance are skipped. */
export function tieObservations(ties: readonly TieDraft[], referencePoints: readonly ReferencePoint[], system: LengthSystem): TieObservation[] {
  const out: TieObservation[] = [];
  for (const tie of ties) {
    const point = referencePoints.find((candidate) => candidate.id === tie.referencePointId);
    const distance = parseLength(tie.distance, system, 'long');
    if (point && distance.ok && distance.metres > 0) out.push({ x: point.x, y: point.y, distanceM: distance.metres });
  }
  return out;
}

/** The position the typed ties give, with the shared domain solver the analysis uses (undefined under two ties). */
export function solveTies(
  ties: readonly TieDraft[],
  sideHint: '' | 'left' | 'right',
  referencePoints: readonly ReferencePoint[],
  system: LengthSystem,
): TieSolution | undefined {
  const observations = tieObservations(ties, referencePoints, system);
  return observations.length >= 2 ? solvePositionFromTies(observations, { sideHint: sideHint || undefined }) : undefined;
}

/** The short text of a run's route-length finding, for a badge on the plan (undefined when there is none). */
export function routeBadge(analysis: AsBuiltAnalysis, runId: string, format: (metres: number) => string): string | undefined {
  const result = analysis.runs.find((r) => r.runId === runId);
  if (!result?.lengthCheck?.isMismatch) return undefined;
  const diff = result.lengthCheck.differenceM;
  return diff > 0 ? `Drawn ${format(diff)} short` : `Drawn ${format(-diff)} long`;
}

/** Items with an open position finding (ties that fail, weak geometry, no position …). */
export function itemsWithPositionFindings(analysis: AsBuiltAnalysis): Set<string> {
  return new Set(analysis.findings.filter((f) => f.code.startsWith('POSITION_') && f.itemId !== undefined).map((f) => f.itemId!));
}

/** Items that can be placed by ties (an amplifier sits indoors, as in the item form). */
export function tieableItems(asBuilt: AsBuilt): Item[] {
  return asBuilt.items.filter((item) => item.kind !== 'amplifier');
}

/** The ties of an item as typed drafts, distances in the user's unit. */
export function tieDraftsOf(item: Item | undefined, toInput: (metres: number) => string): TieDraft[] {
  const ties = item?.ties ?? [];
  return ties.length > 0
    ? ties.map((tie) => ({ referencePointId: tie.referencePointId, distance: toInput(tie.distanceM) }))
    : [
        { referencePointId: '', distance: '' },
        { referencePointId: '', distance: '' },
      ];
}
