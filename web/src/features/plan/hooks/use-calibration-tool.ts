import { useState } from 'react';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { useNotify } from '../../../components/notify';
import { usePersistedDraft } from '../../../lib/drafts';
import { describeRequestError } from '../../../lib/form-errors';
import { formatLength, parseLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import type { SiteResponse } from '../../sites';
import type { useSiteConflict } from '../../sites';
import type { SitePlanImage } from '../api/site-plan-image';
import { useUpdateSitePlan } from '../api/update-site-plan';
import { useUploadPlanImage } from '../api/upload-plan-image';
import { planToImage, type ImagePlacement, type ImagePoint } from '../utils/plan-geometry';

type CalibrationDraft = { a?: ImagePoint; b?: ImagePoint; distance: string };
type Calibration = CalibrationDraft & { error?: string };

type CalibrationToolOptions = {
  jobId: string;
  site: SiteResponse;
  planImage: SitePlanImage | null;
  placement: ImagePlacement | undefined;
  /** May set the scale (the office; a crew lead on an open job of theirs). */
  canCalibrate: boolean;
  canUpload: boolean;
  siteConflict: ReturnType<typeof useSiteConflict>;
};

/**
 * The plan editor's calibrate tool: upload the site-plan image, tap two points A and B on it and give
 * the real distance between them. The picked points and the distance are kept on the device until
 * saved, like the job forms' drafts.
 */
export function useCalibrationTool({ jobId, site, planImage, placement, canCalibrate, canUpload, siteConflict }: CalibrationToolOptions) {
  const notify = useNotify();
  const [units] = useUnitPreferences();
  const uploadImage = useUploadPlanImage();
  const updateSite = useUpdateSitePlan();
  const draft = usePersistedDraft<CalibrationDraft>(`job:${jobId}:plan-calibration`, { distance: '' });
  const [error, setError] = useState<string | undefined>();
  const calibration: Calibration = { ...draft.value, error };
  const setCalibration = (next: Calibration | ((current: Calibration) => Calibration)) => {
    const { error: nextError, ...value } = typeof next === 'function' ? next(calibration) : next;
    setError(nextError);
    if (value.a === undefined && value.b === undefined && value.distance === '') draft.clear();
    else draft.setValue(value);
  };

  const save = (): void => {
    const { a, b } = calibration;
    if (!a || !b) return;
    const distance = parseLength(calibration.distance, units.length, 'long');
    if (!distance.ok || !(distance.metres > 0)) {
      setCalibration((current) => ({ ...current, error: distance.ok ? 'The distance must be more than zero.' : distance.message }));
      return;
    }
    const px = (p: ImagePoint) => ({ x: Math.round(p.x * 10) / 10, y: Math.round(p.y * 10) / 10 });
    updateSite.mutate(
      { siteId: site.id, change: { planCalibration: { a: px(a), b: px(b), distanceM: distance.metres } } },
      {
        onSuccess: () => {
          setCalibration({ distance: '' });
          notify.success('Scale saved', `A to B is ${formatLength(distance.metres, units.length, 'long')}.`);
        },
        onError: (failure) => {
          if (siteConflict.handle(failure, 'the plan’s scale', save)) return;
          setCalibration((current) => ({ ...current, error: describeRequestError(failure) }));
        },
      },
    );
  };

  const upload = (file: File): void => {
    uploadImage.mutate(
      { siteId: site.id, file },
      {
        onSuccess: () => {
          setCalibration({ distance: '' });
          notify.success(
            'Plan image uploaded',
            canCalibrate ? 'Now tap two points on it and give the distance between them.' : 'The office sets its scale; until then it is shown at a rough size.',
          );
        },
        onError: (failure) => {
          if (!siteConflict.handle(failure, 'the plan image', () => upload(file))) notify.error('Could not upload the image', describeRequestError(failure));
        },
      },
    );
  };

  return {
    calibration,
    /** Leaving the tool forgets a shown error (the picked points stay). */
    clearError: () => setError(undefined),
    /** A tap while the tool is open: point A, then B. Returns what to say when the tap cannot be used. */
    tap: (point: PlanPoint): string | undefined => {
      if (!planImage || !placement || !canCalibrate) return undefined;
      const px = planToImage(point, placement);
      if (px.x < 0 || px.y < 0 || px.x > planImage.widthPx || px.y > planImage.heightPx) {
        return 'That tap was off the image: both calibration points must be on the plan image.';
      }
      setCalibration((current) => (current.a && !current.b ? { ...current, b: px, error: undefined } : { distance: current.distance, a: px, b: undefined }));
      return undefined;
    },
    hint: !planImage
      ? 'Upload the site-plan image first.'
      : !canCalibrate
        ? site.planCalibration
          ? 'The image is to scale.'
          : 'The office sets the image’s scale: two points on it and the distance between them.'
        : !calibration.a
          ? 'Tap point A on the image: a corner or mark you can measure to.'
          : !calibration.b
            ? 'Now tap point B on the image, as far from A as you can.'
            : 'Type the real distance between A and B, then save.',
    panel: {
      hasImage: planImage !== null,
      canCalibrate,
      canUpload,
      isCalibrated: site.planCalibration !== null,
      a: calibration.a,
      b: calibration.b,
      distance: calibration.distance,
      onDistanceChange: (distance: string) => setCalibration((current) => ({ ...current, distance, error: undefined })),
      distanceError: calibration.error,
      isUploading: uploadImage.isPending,
      isSaving: updateSite.isPending,
      onUpload: upload,
      onPickAgain: () => setCalibration({ distance: calibration.distance }),
      onSave: save,
    },
  };
}
