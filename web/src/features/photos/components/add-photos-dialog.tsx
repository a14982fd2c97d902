import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  Field,
  Input,
  makeStyles,
  Text,
  tokens,
} from '@fluentui/react-components';
import { Camera24Regular, ImageMultiple24Regular } from '@fluentui/react-icons';
import { useEffect, useRef, useState, type ChangeEvent } from 'react';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import { useFormStyles } from '../../../components/form-styles';
import { getUploadQueue } from '../hooks/use-upload-queue';
import type { TargetOption } from '../utils/photo-targets';

import { TargetSelect } from './target-select';

/** What phones and browsers may offer; the server sniffs the bytes and refuses anything else (HEIC too). */
const ACCEPT = 'image/jpeg,image/png,image/webp';

const useStyles = makeStyles({
  pickers: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: tokens.spacingVerticalM, '@media (min-width: 480px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' } },
  picker: { minHeight: '64px', fontSize: tokens.fontSizeBase400 },
  hidden: { position: 'absolute', width: '1px', height: '1px', opacity: 0, overflow: 'hidden', pointerEvents: 'none' },
  hint: { color: tokens.colorNeutralForeground2 },
});

type AddPhotosDialogProps = {
  jobId: string;
  /** The pre-chosen target, or `undefined` while closed. */
  target: PhotoTarget | undefined;
  options: readonly TargetOption[];
  onClose: () => void;
};

/**
 * Take photos with the camera or pick several from the library. Picked files are queued at once (kept
 * on the device until the server has them) and the dialog closes; progress shows where the photos go.
 */
export function AddPhotosDialog({ jobId, target, options, onClose }: AddPhotosDialogProps) {
  const styles = useStyles();
  const formStyles = useFormStyles();
  const cameraRef = useRef<HTMLInputElement>(null);
  const libraryRef = useRef<HTMLInputElement>(null);
  const [chosen, setChosen] = useState<PhotoTarget>({ type: 'job' });
  const [caption, setCaption] = useState('');

  useEffect(() => {
    if (target) {
      setChosen(target);
      setCaption('');
    }
  }, [target]);

  const onFiles = async (event: ChangeEvent<HTMLInputElement>) => {
    const files = [...(event.target.files ?? [])];
    event.target.value = '';
    if (files.length === 0) return;
    // No toast: the photos appear at once, with their progress, where the button was.
    await getUploadQueue().add(jobId, files, { target: chosen, caption });
    onClose();
  };

  return (
    <Dialog open={target !== undefined} onOpenChange={(_event, data) => !data.open && onClose()}>
      <DialogSurface>
        <DialogBody>
          <DialogTitle>Add photos</DialogTitle>
          <DialogContent className={formStyles.form}>
            <TargetSelect label="The photos show" options={options} value={chosen} onChange={setChosen} className={formStyles.control} />
            <Field label="Caption (optional, for every photo picked now)">
              <Input className={formStyles.control} value={caption} onChange={(_event, data) => setCaption(data.value)} maxLength={500} />
            </Field>
            <div className={styles.pickers}>
              <Button appearance="primary" className={styles.picker} icon={<Camera24Regular />} onClick={() => cameraRef.current?.click()}>
                Take photos
              </Button>
              <Button className={styles.picker} icon={<ImageMultiple24Regular />} onClick={() => libraryRef.current?.click()}>
                Choose from library
              </Button>
            </div>
            <input
              ref={cameraRef}
              className={styles.hidden}
              type="file"
              accept={ACCEPT}
              capture="environment"
              multiple
              tabIndex={-1}
              aria-label="Take photos with the camera"
              onChange={(event) => void onFiles(event)}
            />
            <input
              ref={libraryRef}
              className={styles.hidden}
              type="file"
              accept={ACCEPT}
              multiple
              tabIndex={-1}
              aria-label="Choose photos from the library"
              onChange={(event) => void onFiles(event)}
            />
            <Text size={200} className={styles.hint}>
              JPEG, PNG or WebP. If the phone saves photos in its high-efficiency format (HEIC), set its camera to the most compatible format so photos are saved as JPEG.
            </Text>
          </DialogContent>
          <DialogActions>
            <Button className={formStyles.button} onClick={onClose}>
              Cancel
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
