import { useState } from 'react';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';
import type { RoutePoint } from '@domain/as-built/run.schema';

import { usePersistedDraft } from '../../../lib/drafts';
import { gpsBends } from '../../job-record';
import { requestPhoneFix, type useJobWriter } from '../../jobs';
import type { PlanHit } from '../components/plan-canvas';
import type { RouteMode } from '../components/route-panel';
import { insertRoutePoint, moveRoutePoint, removeRoutePoint, roundPlanPoint } from '../utils/plan-geometry';
import { runBodyWithRoute } from '../utils/plan-records';

type JobWrite = Parameters<ReturnType<typeof useJobWriter>['save']>[0];
type SaveOutcome = Awaited<ReturnType<ReturnType<typeof useJobWriter>['save']>>;

/** "Use my position" on a route point: waiting for the phone, or what went wrong. */
type PhoneState = { status: 'idle' | 'waiting' } | { status: 'error'; message: string };

type RouteToolOptions = {
  jobId: string;
  asBuilt: AsBuilt;
  saveJobWrite: (write: JobWrite, done: string) => Promise<SaveOutcome | undefined>;
  /** The point picked on the canvas (shared with the landmark tool's picked corner). */
  selectedVertex: number | undefined;
  setSelectedVertex: (index: number | undefined) => void;
};

/**
 * The plan editor's route tool: choose a run, tap the trench's bends (snapped) to draw its route, then
 * drag, insert or delete points; the route is kept on the device until saved with the run.
 */
export function useRouteTool({ jobId, asBuilt, saveJobWrite, selectedVertex, setSelectedVertex }: RouteToolOptions) {
  const [runId, setRunId] = useState('');
  const [mode, setMode] = useState<RouteMode>('draw');
  const run = asBuilt.runs.find((candidate) => candidate.id === runId);
  const draftKey = `job:${jobId}:plan-route:${runId || 'none'}`;
  const draft = usePersistedDraft<RoutePoint[]>(draftKey, run?.route ?? []);
  const points = runId ? draft.value : [];
  const [phone, setPhone] = useState<PhoneState>({ status: 'idle' });
  const hasOrigin = Boolean(asBuilt.site?.origin);

  const start = (next: string) => {
    setRunId(next);
    const chosen = asBuilt.runs.find((candidate) => candidate.id === next);
    setMode(chosen?.route ? 'edit' : 'draw');
    setSelectedVertex(undefined);
    setPhone({ status: 'idle' });
  };

  /**
   * "Use my position" (issue 17): the phone's fix through the site's local tangent plane, as the item
   * form does. Drawing, it adds the next point; changing a drawn route, it moves the picked point.
   */
  const placeAtPhonePosition = () => {
    if (!run) return;
    const target = mode === 'edit' ? selectedVertex : undefined;
    if (mode === 'edit' && target === undefined) return;
    setPhone({ status: 'waiting' });
    requestPhoneFix(asBuilt.site).then(
      (fix) => {
        // Kept with its source and accuracy, so the record says this bend is a phone fix (issue 17).
        const point: RoutePoint = { x: fix.x, y: fix.y, source: 'gps', accuracyM: fix.accuracyM };
        draft.setValue((current) => (target === undefined ? [...current, point] : moveRoutePoint(current, target, point)));
        setPhone({ status: 'idle' });
      },
      (error: Error) => setPhone({ status: 'error', message: error.message }),
    );
  };

  const save = async () => {
    if (!run || points.length < 2) return;
    const outcome = await saveJobWrite(
      {
        endpoint: 'replaceRun',
        params: { runId: run.id },
        body: runBodyWithRoute(run, points.map((p) => ({ ...p, ...roundPlanPoint(p) }))),
        draftKey,
        label: `Route of "${run.label}"`,
      },
      'Route saved',
    );
    if (outcome === 'saved' || outcome === 'queued') {
      setMode('edit');
      setSelectedVertex(undefined);
    }
  };

  const hint = (): string => {
    if (!run) return 'Choose the run whose route you are drawing.';
    if (mode === 'draw') {
      const from = asBuilt.items.find((item) => item.id === run.fromItemId)?.label ?? 'its start';
      const to = asBuilt.items.find((item) => item.id === run.toItemId)?.label ?? 'its end';
      return points.length === 0 ? `Tap where the trench starts, at ${from}.` : `Tap the next bend of the trench, toward ${to}. Point ${points.length + 1}.`;
    }
    return `Drag a point to move it. Tap the line to add a point. Tap a point to pick it for deleting${hasOrigin ? ' or for your phone position' : ''}.`;
  };

  return {
    runId,
    run,
    mode,
    points,
    start,
    hint: hint(),
    /** A tap while the tool is open. Returns what to say when the tap cannot be used. */
    tap: (point: PlanPoint, hit: PlanHit | undefined, snapped: (p: PlanPoint) => PlanPoint): string | undefined => {
      if (!run) return 'Choose the run first: pick the run whose route you are drawing.';
      if (mode === 'draw') {
        draft.setValue([...points, snapped(point)]);
        return undefined;
      }
      if (hit?.type === 'vertex') setSelectedVertex(hit.index === selectedVertex ? undefined : hit.index);
      else if (hit?.type === 'segment') {
        draft.setValue(insertRoutePoint(points, hit.index, point));
        setSelectedVertex(hit.index + 1);
      } else setSelectedVertex(undefined);
      return undefined;
    },
    /** A point dragged to `point`. */
    dragEnd: (hit: PlanHit, point: PlanPoint, snapped: (p: PlanPoint) => PlanPoint) => {
      if (hit.type !== 'vertex') return;
      draft.setValue(moveRoutePoint(points, hit.index, snapped(point)));
      setSelectedVertex(hit.index);
    },
    panel: {
      asBuilt,
      runId,
      mode,
      points,
      selectedIndex: selectedVertex,
      hasDraft: draft.hasDraft,
      /** The points that stand at a phone fix (dragging one moves it off the fix and it becomes a drawn point). */
      gpsPoints: gpsBends(points),
      onUndo: () => draft.setValue(points.slice(0, -1)),
      onDeletePoint: () => {
        if (selectedVertex === undefined) return;
        draft.setValue(removeRoutePoint(points, selectedVertex));
        setSelectedVertex(undefined);
      },
      onRedraw: () => {
        draft.setValue([]);
        setMode('draw');
        setSelectedVertex(undefined);
      },
      onContinue: () => {
        setMode('draw');
        setSelectedVertex(undefined);
      },
      onSave: () => void save(),
      /** Absent where the site has no GPS origin: a phone position cannot be put on the plan. */
      phonePosition: hasOrigin
        ? {
            action: mode === 'edit' ? ('move' as const) : ('add' as const),
            canUse: mode === 'draw' || selectedVertex !== undefined,
            isWaiting: phone.status === 'waiting',
            error: phone.status === 'error' ? phone.message : undefined,
            onUse: placeAtPhonePosition,
          }
        : undefined,
      onDiscard: () => {
        draft.clear();
        setMode(run?.route ? 'edit' : 'draw');
        setSelectedVertex(undefined);
      },
    },
  };
}
