import { Button, makeStyles, mergeClasses, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import { Camera20Regular, CheckmarkCircle20Regular, Delete20Regular, Edit20Regular, Warning20Filled } from '@fluentui/react-icons';
import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import type { RunDepthResult } from '@domain/depth/depth-check';
import { checkRunDepth } from '@domain/depth/depth-check';
import { DEFAULT_DEPTH_RULES, findDepthRule, nominalCoverInches } from '@domain/depth/depth-rules';
import type { Run } from '@domain/as-built/run.schema';
import { METRES_PER_INCH } from '@domain/as-built/units';
import { DepthReadingInputSchema, type DepthReadingInput } from '@domain/jobs/job-record.schema';

import { useNotify } from '../../../components/notify';
import { useDraftForm, writeDraft } from '../../../lib/drafts';
import { toSentence } from '../../../lib/form-errors';
import { formatLength, lengthInputValue, type UnitPreferences } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { PhotoStrip } from '../../photos';
import { usePhotoActions } from '../../photos';
import { useJobWriter } from '../hooks/job-writer';
import { depthReadingDeleteRequest } from '../utils/delete-requests';
import { fieldDomId } from '../utils/finding-target';
import { saveErrors } from '../utils/save-errors';

import { useDeleteRecord } from './delete-record';
import { useFormStyles } from '../../../components/form-styles';
import { LengthInput, readLength } from './length-input';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  rule: { color: tokens.colorNeutralForeground2 },
  inputs: { display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: tokens.spacingHorizontalM, '& > *': { minWidth: 0 } },
  verdict: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS, minHeight: '28px' },
  shallow: { color: tokens.colorPaletteDarkOrangeForeground1, fontWeight: tokens.fontWeightSemibold },
  ok: { color: tokens.colorPaletteGreenForeground1 },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS },
  reading: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) auto auto auto',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    paddingInlineStart: tokens.spacingHorizontalS,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
    ':focus-visible': { outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}` },
  },
  readingPhotos: { gridColumn: '1 / -1', paddingBlockEnd: tokens.spacingVerticalS, paddingInlineEnd: tokens.spacingHorizontalS, ':empty': { display: 'none' } },
  readingText: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
  targeted: { outline: `${tokens.strokeWidthThick} solid ${tokens.colorPaletteDarkOrangeBorder2}` },
});

/** The two fields as typed (in the person's units), and which saved reading is being changed. */
type DepthDraft = { station: string; depth: string; editing?: number };
type DepthReadingOutput = { body: DepthReadingInput; editing?: number };
const EMPTY_DRAFT: DepthDraft = { station: '', depth: '' };

/**
 * Reads the typed lengths in the person's units (conversions in lib/units) into the shared domain shape,
 * and checks them against the shared schema; every problem lands under the field it is about.
 */
function depthReadingFormSchema(units: UnitPreferences) {
  return z
    .object({ station: z.string(), depth: z.string(), editing: z.number().int().min(0).optional() })
    .transform((draft, ctx): DepthReadingOutput => {
      const station = readLength(draft.station, units, 'long', 'Station');
      const cover = readLength(draft.depth, units, 'short', 'Cover depth');
      if (station.error) ctx.addIssue({ code: 'custom', path: ['station'], message: station.error });
      if (cover.error) ctx.addIssue({ code: 'custom', path: ['depth'], message: cover.error });
      if (station.metres === undefined || cover.metres === undefined) return z.NEVER;
      const parsed = DepthReadingInputSchema.safeParse({ stationM: station.metres, depthM: cover.metres });
      if (!parsed.success) {
        for (const issue of parsed.error.issues) {
          ctx.addIssue({ code: 'custom', path: [issue.path[0] === 'stationM' ? 'station' : 'depth'], message: toSentence(issue.message) });
        }
        return z.NEVER;
      }
      return { body: parsed.data, editing: draft.editing };
    });
}

type DepthReadingPanelProps = {
  jobId: string;
  run: Run;
  depth: RunDepthResult | undefined;
  readingIds: string[];
  canWrite: boolean;
  /** A finding pointed at this reading. */
  targetReading?: number;
  onClose: () => void;
};

/**
 * The one-handed "add depth reading" flow: station and depth, one big button, and it stays open for
 * the next reading. Says at once whether the reading is shallow, before and after saving.
 */
export function DepthReadingPanel({ jobId, run, depth, readingIds, canWrite, targetReading, onClose }: DepthReadingPanelProps) {
  const styles = useStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const deletion = useDeleteRecord();
  const photos = usePhotoActions();
  const [units] = useUnitPreferences();
  const draftKey = `job:${jobId}:depth:${run.id}`;
  const schema = useMemo(() => depthReadingFormSchema(units), [units]);
  const { form, hasDraft, clear } = useDraftForm<DepthDraft, DepthReadingOutput>(draftKey, EMPTY_DRAFT, zodResolver(schema));
  const [message, setMessage] = useState<string | undefined>();
  const stationRef = useRef<HTMLInputElement>(null);
  const depthRef = useRef<HTMLInputElement>(null);
  const readings = run.depthReadings ?? [];
  const [typedStationText, typedDepthText, editing] = form.watch(['station', 'depth', 'editing']);

  // The rule the server used; before the first reading, the default table's rule for this method.
  const rule = depth?.rule ?? findDepthRule(DEFAULT_DEPTH_RULES, run.method, run.location ?? 'general') ?? null;
  // An imperial screen shows a rule written in inches as those inches (150 mm → 6 in, not 5 7/8 in).
  const ruleCoverM = rule?.minCoverM ?? null;
  const nominalInches = ruleCoverM === null || units.length !== 'imperial' ? undefined : nominalCoverInches(ruleCoverM);
  const minCoverM = nominalInches === undefined ? ruleCoverM : nominalInches * METRES_PER_INCH;

  useEffect(() => {
    if (targetReading === undefined) return;
    document.getElementById(fieldDomId(run.id, 'depth', targetReading))?.focus();
  }, [run.id, targetReading]);

  const typedDepth = typedDepthText.trim() === '' ? undefined : readLength(typedDepthText, units, 'short').metres;
  const typedStation = readLength(typedStationText, units, 'long').metres ?? 0;
  const verdict =
    typedDepth === undefined || minCoverM === null || rule === null
      ? undefined
      : checkRunDepth(
          { ...run, depthReadings: [{ stationM: typedStation, depthM: typedDepth }] },
          0,
          { name: 'current', rules: [rule] },
          [],
        ).shallowStations.length > 0
        ? 'shallow'
        : 'ok';

  const save = form.handleSubmit(async ({ body, editing: index }) => {
    setMessage(undefined);
    const editingId = index === undefined ? undefined : readingIds[index];
    const label = `Depth reading on "${run.label}" at ${formatLength(body.stationM, units.length, 'long')}`;
    try {
      const outcome = await writer.save(
        editingId
          ? { endpoint: 'updateDepthReading', params: { runId: run.id, readingId: editingId }, body, draftKey, label }
          : { endpoint: 'addDepthReading', params: { runId: run.id }, body, draftKey, label },
      );
      if (outcome === 'queued') {
        // Kept in the waiting list; free the form for the next reading.
        clear();
        notify.success('Reading kept on this phone', 'It is sent when the connection returns.');
      } else if (outcome === 'saved') {
        notify.success(editingId ? 'Reading changed' : 'Reading saved', label);
      }
      stationRef.current?.focus();
    } catch (error) {
      const { fields, message: text } = saveErrors(error);
      if (fields.stationM) form.setError('station', { message: fields.stationM });
      if (fields.depthM) form.setError('depth', { message: fields.depthM });
      setMessage(text);
    }
  });
  const isSaving = form.formState.isSubmitting;

  return (
    <section className={styles.root} aria-label={`Depth readings of ${run.label}`}>
      <Text className={styles.rule}>
        {minCoverM === null
          ? 'This run is not buried, so no cover is required.'
          : `At least ${formatLength(minCoverM, units.length, 'short')} of cover is required here (${rule?.basis === 'code' ? 'code' : 'common practice'}).`}
      </Text>
      {readings.length > 0 && (
        <ul className={styles.list} aria-label="Readings">
          {readings.map((reading, index) => {
            const station = depth?.stations.find((s) => s.readingIndex === index);
            const isShallow = station?.marginM !== null && station?.marginM !== undefined && station.marginM < -0.0005;
            return (
              <li
                key={readingIds[index] ?? index}
                id={fieldDomId(run.id, 'depth', index)}
                tabIndex={-1}
                className={mergeClasses(styles.reading, targetReading === index && styles.targeted)}
              >
                <span className={styles.readingText}>
                  <Text>
                    {formatLength(reading.depthM, units.length, 'short')} at {formatLength(reading.stationM, units.length, 'long')}
                  </Text>
                  {isShallow ? (
                    <Text className={styles.shallow}>
                      <Warning20Filled aria-hidden /> Too shallow
                    </Text>
                  ) : station?.marginM !== null && station?.marginM !== undefined ? (
                    <Text className={styles.ok}>Deep enough</Text>
                  ) : null}
                </span>
                {canWrite && (
                  <>
                    <Button
                      appearance="subtle"
                      className={formStyles.button}
                      icon={<Edit20Regular />}
                      aria-label={`Change the reading at ${formatLength(reading.stationM, units.length, 'long')}`}
                      onClick={() => {
                        const values = {
                          station: lengthInputValue(reading.stationM, units.length, 'long'),
                          depth: lengthInputValue(reading.depthM, units.length, 'short'),
                          editing: index,
                        };
                        form.reset(values);
                        // Changing a saved reading is unsaved input too: keep it as the draft.
                        writeDraft(draftKey, values);
                        depthRef.current?.focus();
                      }}
                    />
                    <Button
                      appearance="subtle"
                      className={formStyles.button}
                      icon={<Delete20Regular />}
                      aria-label={`Delete the reading at ${formatLength(reading.stationM, units.length, 'long')}`}
                      onClick={() => {
                        const readingId = readingIds[index];
                        if (!readingId) return;
                        const description = `${formatLength(reading.depthM, units.length, 'short')} at ${formatLength(reading.stationM, units.length, 'long')}`;
                        deletion.ask(depthReadingDeleteRequest(run, readingId, reading, description));
                      }}
                    />
                  </>
                )}
                {photos.canChange && readingIds[index] && (
                  <Button
                    appearance="subtle"
                    className={formStyles.button}
                    icon={<Camera20Regular />}
                    aria-label={`Add photos of the reading at ${formatLength(reading.stationM, units.length, 'long')}`}
                    onClick={() => photos.addPhotos({ type: 'depth_reading', id: readingIds[index]! })}
                  />
                )}
                {readingIds[index] && (
                  <div className={styles.readingPhotos}>
                    <PhotoStrip
                      target={{ type: 'depth_reading', id: readingIds[index]! }}
                      label={`the reading at ${formatLength(reading.stationM, units.length, 'long')}`}
                    />
                  </div>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {canWrite && (
        <form className={formStyles.form} onSubmit={(event) => void save(event)} noValidate aria-label={`Add a depth reading to ${run.label}`}>
          {message && (
            <MessageBar intent="error" layout="multiline">
              <MessageBarBody>{message}</MessageBarBody>
            </MessageBar>
          )}
          <div className={styles.inputs}>
            <Controller
              control={form.control}
              name="station"
              render={({ field, fieldState }) => (
                <LengthInput
                  id={fieldDomId(run.id, 'station')}
                  inputRef={stationRef}
                  label="Station (from the start)"
                  scale="long"
                  value={field.value}
                  onChange={field.onChange}
                  error={fieldState.error?.message}
                />
              )}
            />
            <Controller
              control={form.control}
              name="depth"
              render={({ field, fieldState }) => (
                <LengthInput
                  id={fieldDomId(run.id, 'depth')}
                  inputRef={depthRef}
                  label="Cover depth"
                  scale="short"
                  value={field.value}
                  onChange={field.onChange}
                  error={fieldState.error?.message}
                />
              )}
            />
          </div>
          <div className={styles.verdict} aria-live="polite">
            {verdict === 'shallow' && minCoverM !== null && typedDepth !== undefined && (
              <Text className={styles.shallow}>
                <Warning20Filled aria-hidden /> Shallow: {formatLength(minCoverM - typedDepth, units.length, 'short')} short of{' '}
                {formatLength(minCoverM, units.length, 'short')}
              </Text>
            )}
            {verdict === 'ok' && (
              <Text className={styles.ok}>
                <CheckmarkCircle20Regular aria-hidden /> Deep enough
              </Text>
            )}
            {hasDraft && verdict === undefined && <Text className={formStyles.unsaved}>Not saved yet</Text>}
          </div>
          <div className={formStyles.actions}>
            <Button
              type="submit"
              appearance="primary"
              className={formStyles.bigButton}
              disabled={isSaving}
              icon={isSaving ? <Spinner size="tiny" /> : undefined}
            >
              {editing === undefined ? 'Save reading' : 'Save change'}
            </Button>
            {editing !== undefined && (
              <Button className={formStyles.bigButton} onClick={() => clear()}>
                Stop changing
              </Button>
            )}
            <Button className={formStyles.bigButton} onClick={onClose}>
              Done
            </Button>
          </div>
        </form>
      )}
      {deletion.dialog}
    </section>
  );
}
