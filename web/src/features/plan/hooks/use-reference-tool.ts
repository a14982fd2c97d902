import { useState } from 'react';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import type { SiteResponse } from '../../sites';
import { useSaveReferencePoint, type useSiteConflict } from '../../sites';
import { roundPlanPoint } from '../utils/plan-geometry';

/** The plan editor's reference tool: a tap on the plan asks for the point's label, then adds it to the site. */
export function useReferenceTool({ site, siteConflict }: { site: SiteResponse; siteConflict: ReturnType<typeof useSiteConflict> }) {
  const notify = useNotify();
  const saveReference = useSaveReferencePoint();
  const [pending, setPending] = useState<{ key: number; point: PlanPoint } | undefined>();
  const [error, setError] = useState<string | undefined>();

  const add = (label: string): void => {
    if (!pending) return;
    const point = roundPlanPoint(pending.point);
    setError(undefined);
    saveReference.mutate(
      { siteId: site.id, input: { label, x: point.x, y: point.y } },
      {
        onSuccess: (created) => {
          setPending(undefined);
          notify.success('Reference point added', created.label);
        },
        onError: (failure) => {
          if (!siteConflict.handle(failure, `adding the reference point “${label}”`, () => add(label))) setError(describeRequestError(failure));
        },
      },
    );
  };

  return {
    tap: (point: PlanPoint) => {
      setError(undefined);
      setPending({ key: Date.now(), point });
    },
    /** A new dialog (fresh input) for every tap. */
    dialogKey: pending?.key ?? 0,
    dialog: {
      point: pending?.point,
      isSaving: saveReference.isPending,
      error,
      onSave: add,
      onCancel: () => setPending(undefined),
    },
  };
}
