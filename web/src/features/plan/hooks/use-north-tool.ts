import { useState } from 'react';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import type { SiteResponse } from '../../sites';
import type { useSiteConflict } from '../../sites';
import { useUpdateSitePlan } from '../api/update-site-plan';

/**
 * The plan editor's north tool: the bearing of the plan's top, typed or turned on the canvas, saved to
 * the site (its version checked; a conflict asks through `siteConflict`).
 */
export function useNorthTool({ site, siteConflict }: { site: SiteResponse; siteConflict: ReturnType<typeof useSiteConflict> }) {
  const notify = useNotify();
  const updateSite = useUpdateSitePlan();
  const [draft, setDraft] = useState<string | undefined>();
  const [error, setError] = useState<string | undefined>();
  const saved = site.northAzimuthDeg ?? 0;

  const change = (value: string) => {
    setDraft(value);
    setError(undefined);
  };

  const save = (): void => {
    const value = Number((draft ?? '').replace(',', '.'));
    if (draft === undefined || draft.trim() === '' || !Number.isFinite(value) || value < -360 || value > 360) {
      setError('Enter a bearing in degrees, from 0 to 360.');
      return;
    }
    setError(undefined);
    updateSite.mutate(
      { siteId: site.id, change: { northAzimuthDeg: value } },
      {
        onSuccess: () => {
          setDraft(undefined);
          notify.success('North saved', `The plan’s top faces ${value}°.`);
        },
        onError: (failure) => {
          if (!siteConflict.handle(failure, 'the plan’s north', save)) setError(describeRequestError(failure));
        },
      },
    );
  };

  return {
    /** The bearing to draw while the tool is open: the typed one as soon as it reads as a number. */
    previewDeg: draft !== undefined && Number.isFinite(Number(draft)) ? Number(draft) : (site.northAzimuthDeg ?? null),
    /** The arrow turned on the canvas. */
    turn: (deg: number) => change(String(deg)),
    panel: {
      value: draft ?? String(saved),
      onChange: change,
      error,
      isSaving: updateSite.isPending,
      isChanged: draft !== undefined && Number(draft) !== saved,
      onSave: save,
    },
  };
}
