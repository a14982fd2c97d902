import { Button, Spinner, Text } from '@fluentui/react-components';
import { Checkmark24Regular, ImageAdd24Regular } from '@fluentui/react-icons';
import { useRef } from 'react';

import { LengthInput } from '../../jobs';
import { PLAN_IMAGE_TYPES } from '../api/upload-plan-image';
import type { ImagePoint } from '../utils/plan-geometry';

import { usePanelStyles } from './panel-styles';

type CalibratePanelProps = {
  hasImage: boolean;
  /** May set the scale (a change to the site); without it only the image can be uploaded. */
  canCalibrate: boolean;
  canUpload: boolean;
  isCalibrated: boolean;
  a: ImagePoint | undefined;
  b: ImagePoint | undefined;
  distance: string;
  onDistanceChange: (value: string) => void;
  distanceError?: string;
  isUploading: boolean;
  isSaving: boolean;
  onUpload: (file: File) => void;
  onPickAgain: () => void;
  onSave: () => void;
};

function statusText(hasImage: boolean, isCalibrated: boolean, canCalibrate: boolean): string {
  if (!hasImage) return 'No site-plan image yet. Upload a photo or scan of the plan (JPEG, PNG or WebP).';
  if (!canCalibrate) {
    return isCalibrated
      ? 'The image is to scale. The office sets the scale and north.'
      : 'The image is not to scale yet: the office sets its scale (two points on it and the distance between them).';
  }
  return isCalibrated
    ? 'The image is to scale. To calibrate it again, tap two points on it and give the distance.'
    : 'The image is not to scale yet: tap two points on it that you can measure, then give the real distance.';
}

/** Upload the site-plan image, then tap two points on it and give the real distance between them. */
export function CalibratePanel(props: CalibratePanelProps) {
  const { hasImage, canCalibrate, canUpload, isCalibrated, a, b, distance, isUploading, isSaving } = props;
  const styles = usePanelStyles();
  const fileRef = useRef<HTMLInputElement>(null);
  return (
    <section className={styles.panel} aria-label="Plan image and scale">
      <input
        ref={fileRef}
        type="file"
        accept={PLAN_IMAGE_TYPES.join(',')}
        hidden
        aria-label="Site-plan image file"
        data-testid="plan-image-input"
        onChange={(event) => {
          const file = event.target.files?.[0];
          if (file) props.onUpload(file);
          event.target.value = '';
        }}
      />
      <Text>{statusText(hasImage, isCalibrated, canCalibrate)}</Text>
      {canUpload && (
        <div className={styles.actions}>
          <Button
            appearance={hasImage ? 'secondary' : 'primary'}
            className={styles.button}
            icon={isUploading ? <Spinner size="tiny" /> : <ImageAdd24Regular />}
            disabled={isUploading}
            onClick={() => fileRef.current?.click()}
          >
            {hasImage ? 'Replace image' : 'Upload plan image'}
          </Button>
        </div>
      )}
      {canUpload && hasImage && isCalibrated && !a && <Text className={styles.muted}>Replacing the image clears its scale.</Text>}
      {hasImage && canCalibrate && (
        <>
          <Text weight="semibold">
            Point A: {a ? `picked (${Math.round(a.x)}, ${Math.round(a.y)} px)` : 'tap it on the image'} · Point B:{' '}
            {b ? `picked (${Math.round(b.x)}, ${Math.round(b.y)} px)` : a ? 'tap it on the image' : 'after A'}
          </Text>
          {a && b && (
            <LengthInput
              id="plan-calibration-distance"
              label="Real distance from A to B"
              scale="long"
              value={distance}
              onChange={props.onDistanceChange}
              error={props.distanceError}
            />
          )}
          <div className={styles.actions}>
            {a && (
              <Button className={styles.button} disabled={isSaving} onClick={props.onPickAgain}>
                Pick the points again
              </Button>
            )}
            {a && b && (
              <Button
                appearance="primary"
                className={styles.button}
                icon={isSaving ? <Spinner size="tiny" /> : <Checkmark24Regular />}
                disabled={isSaving || distance.trim() === ''}
                onClick={props.onSave}
              >
                Save scale
              </Button>
            )}
          </div>
        </>
      )}
    </section>
  );
}
