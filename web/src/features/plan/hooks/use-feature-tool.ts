import { useState } from 'react';
import type { PlanFeature } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import type { SiteResponse } from '../../sites';
import { useCreateSiteFeature, useDeleteSiteFeature, useUpdateSiteFeature, type useSiteConflict } from '../../sites';
import type { FeatureDraft } from '../components/feature-panel';
import type { PlanHit } from '../components/plan-canvas';
import { roundPlanPoint } from '../utils/plan-geometry';

const NEW_FEATURE: FeatureDraft = { featureId: '', kind: 'house', name: '', shape: 'polygon' };

type FeatureToolOptions = {
  site: SiteResponse;
  features: readonly PlanFeature[];
  siteConflict: ReturnType<typeof useSiteConflict>;
  /** The corner picked on the canvas (shared with the route tool's picked point). */
  selectedVertex: number | undefined;
  setSelectedVertex: (index: number | undefined) => void;
};

/**
 * The plan editor's landmark tool: pick a landmark or start a new one, tap its corners (snapped), drag
 * them, and save or delete it on the site.
 */
export function useFeatureTool({ site, features, siteConflict, selectedVertex, setSelectedVertex }: FeatureToolOptions) {
  const notify = useNotify();
  const createFeature = useCreateSiteFeature();
  const updateFeature = useUpdateSiteFeature();
  const deleteFeature = useDeleteSiteFeature();
  const [draft, setDraft] = useState<FeatureDraft>(NEW_FEATURE);
  const [points, setPoints] = useState<PlanPoint[]>([]);
  const [error, setError] = useState<string | undefined>();

  const pick = (featureId: string) => {
    const f = features.find((candidate) => candidate.id === featureId);
    setError(undefined);
    setSelectedVertex(undefined);
    if (!f) {
      setDraft(NEW_FEATURE);
      setPoints([]);
      return;
    }
    setDraft({ featureId: f.id, kind: f.kind, name: f.name, shape: f.shape });
    setPoints(f.points.map((p) => ({ x: p.x, y: p.y })));
  };

  const save = (): void => {
    const input = { kind: draft.kind, name: draft.name.trim(), shape: draft.shape, points: points.map(roundPlanPoint) };
    const outcome = {
      onSuccess: () => {
        notify.success('Landmark saved', input.name);
        setDraft(NEW_FEATURE);
        setPoints([]);
        setSelectedVertex(undefined);
      },
      onError: (failure: Error) => {
        if (!siteConflict.handle(failure, `the landmark “${input.name}”`, save)) setError(describeRequestError(failure));
      },
    };
    if (draft.featureId) updateFeature.mutate({ siteId: site.id, featureId: draft.featureId, input }, outcome);
    else createFeature.mutate({ siteId: site.id, input }, outcome);
  };

  const remove = (): void => {
    const { featureId, name } = draft;
    if (!featureId) return;
    deleteFeature.mutate(
      { siteId: site.id, featureId },
      {
        onSuccess: () => {
          notify.success('Landmark deleted', name);
          setDraft(NEW_FEATURE);
          setPoints([]);
        },
        onError: (failure) => {
          if (!siteConflict.handle(failure, `deleting the landmark “${name}”`, remove)) setError(describeRequestError(failure));
        },
      },
    );
  };

  return {
    draft,
    points,
    /** A tap while the tool is open: pick a corner of the landmark, or add one (snapped). */
    tap: (point: PlanPoint, hit: PlanHit | undefined, snapped: (p: PlanPoint) => PlanPoint) => {
      setError(undefined);
      if (hit?.type === 'vertex' && hit.index < points.length) {
        setSelectedVertex(hit.index === selectedVertex ? undefined : hit.index);
        return;
      }
      setPoints([...points, snapped(point)]);
    },
    /** A corner dragged to `point`. */
    dragEnd: (hit: PlanHit, point: PlanPoint, snapped: (p: PlanPoint) => PlanPoint) => {
      if (hit.type !== 'vertex' || hit.index >= points.length) return;
      setPoints(points.map((p, i) => (i === hit.index ? snapped(point) : p)));
      setSelectedVertex(hit.index);
    },
    hint:
      points.length === 0
        ? 'Name the landmark, then tap its corners on the plan (they snap to nearby corners and reference points).'
        : `Tap the next corner (point ${points.length + 1}). Drag a corner to move it.`,
    panel: {
      features,
      draft,
      pointCount: points.length,
      isSaving: createFeature.isPending || updateFeature.isPending || deleteFeature.isPending,
      error,
      onPick: pick,
      onChange: (next: FeatureDraft) => {
        setDraft(next);
        setError(undefined);
      },
      onUndo: () => {
        setPoints(points.slice(0, -1));
        setSelectedVertex(undefined);
      },
      onClearPoints: () => {
        setPoints([]);
        setSelectedVertex(undefined);
      },
      onSave: save,
      onDelete: remove,
    },
  };
}
