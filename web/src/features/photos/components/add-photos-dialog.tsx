import { makeStyles, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import { Camera24Regular, ImageMultiple24Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { PhotoTargetSchema, UploadPhotosFieldsSchema, type PhotoTarget } from '@domain/photos/photo.schema';

import { FormDialog, FormFilePicker, FormTextField } from '../../../components/form-dialog';
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
  hint: { color: tokens.colorNeutralForeground2 },
});

/** What the photos show and their caption, as the upload's shared fields have them, and the files picked. */
const AddPhotosFormSchema = z.object({
  target: PhotoTargetSchema,
  caption: UploadPhotosFieldsSchema.shape.caption,
  files: z.array(z.instanceof(File)).min(1, { error: 'Pick at least one photo.' }),
});
type AddPhotosForm = z.input<typeof AddPhotosFormSchema>;

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
  /** HEIC photos being turned into JPEG now (0: none). */
  const [converting, setConverting] = useState(0);
  const [problems, setProblems] = useState<readonly string[]>([]);
  const isConverting = converting > 0;
  const defaultValues: AddPhotosForm = { target: target ?? { type: 'job' }, caption: '', files: [] };

  return (
    <FormDialog
      open={target !== undefined}
      title="Add photos"
      schema={AddPhotosFormSchema}
      defaultValues={defaultValues}
      isPending={isConverting}
      // Picking the photos sends them: no submit button.
      submitLabel={null}
      cancelLabel={problems.length > 0 ? 'Close' : 'Cancel'}
      onOpenChange={(open) => {
        if (open) return;
        setProblems([]);
        onClose();
      }}
      onSubmit={async ({ files, target: chosen, caption }, { close }) => {
        setProblems([]);
        const prepared = await preparePhotos(files, { onConverting: setConverting }).finally(() => setConverting(0));
        // No toast: the photos appear at once, with their progress, where the button was.
        if (prepared.files.length > 0) await getUploadQueue().add(jobId, prepared.files, { target: chosen, caption });
        // A photo that could not be converted keeps the dialog open with the reason; the others are queued.
        if (prepared.problems.length > 0) setProblems(prepared.problems);
        else close();
      }}
    >
      {(form, fieldError) => (
        <>
          <Controller
            control={form.control}
            name="target"
            render={({ field }) => <TargetSelect label="The photos show" options={options} value={field.value} onChange={field.onChange} className={formStyles.control} />}
          />
          <FormTextField form={form} name="caption" label="Caption (optional, for every photo picked now)" error={fieldError('caption')} />
          <div className={styles.pickers}>
            <FormFilePicker
              form={form}
              name="files"
              appearance="primary"
              className={styles.picker}
              icon={<Camera24Regular />}
              accept={ACCEPT}
              capture="environment"
              isMultiple
              inputLabel="Take photos with the camera"
            >
              Take photos
            </FormFilePicker>
            <FormFilePicker
              form={form}
              name="files"
              className={styles.picker}
              icon={<ImageMultiple24Regular />}
              accept={ACCEPT}
              isMultiple
              inputLabel="Choose photos from the library"
            >
              Choose from library
            </FormFilePicker>
          </div>
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
        </>
      )}
    </FormDialog>
  );
}
