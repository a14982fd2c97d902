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
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  tokens,
} from '@fluentui/react-components';
import { Camera24Regular, ImageMultiple24Regular } from '@fluentui/react-icons';
import { useEffect, useRef, useState, type ChangeEvent } from 'react';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import { useFormStyles } from '../../../components/form-styles';
import { getUploadQueue } from '../hooks/use-upload-queue';
import { preparePhotos } from '../utils/heic-conversion';
import type { TargetOption } from '../utils/photo-targets';

import { TargetSelect } from './target-select';

/**
 * What phones and browsers may offer. HEIC/HEIF (a phone set to high efficiency) is converted to JPEG on
 * the device before it is queued (utils/heic-conversion.ts); the server sniffs the bytes and refuses
 * anything else.
 */
const ACCEPT = 'image/jpeg,image/png,image/webp,image/heic,image/heif,.heic,.heif';

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
  /** HEIC photos being turned into JPEG now (0: none). */
  const [converting, setConverting] = useState(0);
  const [problems, setProblems] = useState<readonly string[]>([]);

  useEffect(() => {
    if (target) {
      setChosen(target);
      setCaption('');
      setProblems([]);
    }
  }, [target]);

  const onFiles = async (event: ChangeEvent<HTMLInputElement>) => {
    const picked = [...(event.target.files ?? [])];
    event.target.value = '';
    if (picked.length === 0) return;
    setProblems([]);
    const prepared = await preparePhotos(picked, { onConverting: setConverting }).finally(() => setConverting(0));
    // No toast: the photos appear at once, with their progress, where the button was.
    if (prepared.files.length > 0) await getUploadQueue().add(jobId, prepared.files, { target: chosen, caption });
    // A photo that could not be converted keeps the dialog open with the reason; the others are queued.
    if (prepared.problems.length > 0) setProblems(prepared.problems);
    else onClose();
  };
  const isConverting = converting > 0;

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
              <Button
                appearance="primary"
                className={styles.picker}
                icon={<Camera24Regular />}
                disabled={isConverting}
                onClick={() => cameraRef.current?.click()}
              >
                Take photos
              </Button>
              <Button className={styles.picker} icon={<ImageMultiple24Regular />} disabled={isConverting} onClick={() => libraryRef.current?.click()}>
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
            {isConverting && (
              <div role="status">
                <Spinner size="tiny" label={converting === 1 ? 'Turning 1 HEIC photo into JPEG…' : `Turning ${converting} HEIC photos into JPEG…`} />
              </div>
            )}
            {problems.length > 0 && (
              <MessageBar intent="warning" layout="multiline">
                <MessageBarBody>
                  {problems.map((problem) => (
                    <div key={problem}>{problem}</div>
                  ))}
                </MessageBarBody>
              </MessageBar>
            )}
            <Text size={200} className={styles.hint}>
              JPEG, PNG, WebP or HEIC. HEIC photos (a phone&apos;s high-efficiency format) are turned into JPEG on this device before they are sent, keeping when and where they were taken.
            </Text>
          </DialogContent>
          <DialogActions>
            <Button className={formStyles.button} onClick={onClose}>
              {problems.length > 0 ? 'Close' : 'Cancel'}
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
