import { Button, Text } from '@fluentui/react-components';
import { Add24Regular, Camera20Regular, CheckmarkCircle20Regular, Delete20Regular, Edit20Regular, Ruler24Regular, Warning20Filled } from '@fluentui/react-icons';
import { useEffect, useState } from 'react';
import type { Run } from '@domain/as-built/run.schema';
import { formatGauge } from '@domain/cable/wire';

import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { PhotoStrip } from '../../photos';
import { usePhotoActions } from '../../photos';
import type { JobAsBuiltResponse } from '../../job-record';
import { useWorkspaceFocus } from '../hooks/workspace-focus';
import { runDeleteRequest } from '../utils/delete-requests';
import { gpsBendsText, METHOD_LABELS } from '../../job-record';

import { useCardStyles } from '../../../components/card-styles';
import { useDeleteRecord } from './delete-record';
import { DepthReadingPanel } from './depth-reading-panel';
import { useFormStyles } from '../../../components/form-styles';
import { RunForm } from './run-form';
import { existingRemoveRequest, isInSiteRecord, RemovedRecords, SiteRecordNote } from './site-record-note';

type Mode = { runId: string; view: 'edit' | 'depth'; field?: string; readingIndex?: number } | { runId: 'new'; view: 'edit'; field?: undefined; readingIndex?: undefined };

type RunsSectionProps = { data: JobAsBuiltResponse; canRecord: boolean; canAddField: boolean };

/** The cables in the ground: one card per run with its depth status and the quick depth-reading flow. */
export function RunsSection({ data, canRecord, canAddField }: RunsSectionProps) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const { target } = useWorkspaceFocus();
  const [mode, setMode] = useState<Mode | undefined>();
  const deletion = useDeleteRecord();
  const { asBuilt, job } = data;

  useEffect(() => {
    if (target?.section !== 'runs' || !target.recordId) return;
    setMode(
      target.field === 'depth'
        ? { runId: target.recordId, view: 'depth', readingIndex: target.readingIndex }
        : { runId: target.recordId, view: 'edit', field: target.field },
    );
  }, [target]);

  return (
    <section aria-labelledby="section-runs" className={formStyles.form}>
      <div className={styles.sectionHead}>
        <Text as="h3" id="section-runs" size={500} weight="semibold" className={styles.title}>
          Runs ({asBuilt.runs.length})
        </Text>
        {canRecord && mode?.runId !== 'new' && (
          <Button appearance="primary" className={formStyles.bigButton} icon={<Add24Regular />} onClick={() => setMode({ runId: 'new', view: 'edit' })}>
            Add run
          </Button>
        )}
      </div>
      {mode?.runId === 'new' && (
        <div className={styles.card}>
          <Text as="h4" size={400} weight="semibold" className={styles.title}>
            New run
          </Text>
          <RunForm jobId={job.id} asBuilt={asBuilt} onDone={() => setMode(undefined)} />
        </div>
      )}
      {asBuilt.items.length < 2 && canRecord && (
        <Text as="p" className={styles.empty}>
          A run goes between two pieces of equipment: add them under Equipment first.
        </Text>
      )}
      {asBuilt.runs.length === 0 ? (
        <Text as="p" className={styles.empty}>
          No runs recorded yet.
        </Text>
      ) : (
        <ul className={styles.list} aria-label="Runs">
          {asBuilt.runs.map((run, r) => (
            <RunCard
              key={run.id}
              run={run}
              index={r}
              data={data}
              mode={mode && mode.runId === run.id ? mode : undefined}
              canRecord={canRecord}
              canAddField={canAddField}
              onMode={setMode}
              onDelete={() => {
                const info = data.records.siteRecords?.[run.id];
                deletion.ask(isInSiteRecord(info) ? existingRemoveRequest('run', run, info!.isThisJob) : runDeleteRequest(run));
              }}
            />
          ))}
        </ul>
      )}
      <RemovedRecords data={data} kind="run" canRecord={canRecord} />
      {deletion.dialog}
    </section>
  );
}

type RunCardProps = {
  run: Run;
  index: number;
  data: JobAsBuiltResponse;
  mode: Mode | undefined;
  canRecord: boolean;
  canAddField: boolean;
  onMode: (mode: Mode | undefined) => void;
  onDelete: () => void;
};

function RunCard({ run, index, data, mode, canRecord, canAddField, onMode, onDelete }: RunCardProps) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const [units] = useUnitPreferences();
  /** Route points from a phone fix, said as an item's "Placed by GPS, ±…" is: weaker than taped ties. */
  const gpsText = gpsBendsText(run.route, units.length);
  const photos = usePhotoActions();
  const { asBuilt, analysis, records, job } = data;
  const depth = analysis.depth[index];
  const itemLabel = (id: string) => asBuilt.items.find((item) => item.id === id)?.label ?? 'unknown';
  const shallow = depth?.shallowStations.length ?? 0;

  return (
    <li className={styles.card} aria-label={`Run ${run.label}`}>
      <div className={styles.header}>
        <div>
          <Text as="h4" size={400} weight="semibold" className={styles.title}>
            {run.label}
          </Text>
          <Text block>
            {itemLabel(run.fromItemId)} → {itemLabel(run.toItemId)}
          </Text>
        </div>
        {depth?.status === 'shallow' && (
          <Text className={styles.warn}>
            <Warning20Filled aria-hidden /> {shallow} shallow {shallow === 1 ? 'spot' : 'spots'}
          </Text>
        )}
        {depth?.status === 'ok' && (
          <Text className={styles.ok}>
            <CheckmarkCircle20Regular aria-hidden /> Depth OK
          </Text>
        )}
        {depth?.status === 'not_recorded' && (
          <Text className={styles.warn}>
            <Warning20Filled aria-hidden /> No depth yet
          </Text>
        )}
      </div>
      <div className={styles.facts}>
        <span>{formatGauge(run.gauge)}, {run.conductors} conductors</span>
        <span>{formatLength(run.measuredLengthM, units.length, 'long')}</span>
        <span>{METHOD_LABELS[run.method]}</span>
        {depth && depth.minDepthM !== null && (
          <span>
            Cover {formatLength(depth.minDepthM, units.length, 'short')}
            {depth.maxDepthM !== null && depth.maxDepthM !== depth.minDepthM ? `–${formatLength(depth.maxDepthM, units.length, 'short')}` : ''}
          </span>
        )}
        {run.isSpare && <span>Spare</span>}
        {run.isAbandoned && <span>Abandoned</span>}
        {gpsText && <span>{gpsText}</span>}
      </div>
      <SiteRecordNote data={data} recordId={run.id} label={run.label} canRecord={canRecord} />
      <PhotoStrip target={{ type: 'run', id: run.id }} label={`Run ${run.label}`} />
      {mode?.view === 'edit' ? (
        <RunForm jobId={job.id} asBuilt={asBuilt} run={run} focusField={mode.field} onDone={() => onMode(undefined)} />
      ) : mode?.view === 'depth' ? (
        <DepthReadingPanel
          jobId={job.id}
          run={run}
          depth={depth}
          readingIds={records.depthReadingIds[run.id] ?? []}
          canWrite={canAddField}
          targetReading={mode.readingIndex}
          onClose={() => onMode(undefined)}
        />
      ) : (
        <div className={styles.actions}>
          {run.method !== 'indoor' && (
            <Button
              appearance={canAddField ? 'primary' : 'secondary'}
              className={formStyles.bigButton}
              icon={<Ruler24Regular />}
              onClick={() => onMode({ runId: run.id, view: 'depth' })}
            >
              {canAddField ? 'Add depth reading' : `Depth readings (${run.depthReadings?.length ?? 0})`}
            </Button>
          )}
          {canRecord && (
            <Button className={formStyles.bigButton} icon={<Edit20Regular />} onClick={() => onMode({ runId: run.id, view: 'edit' })}>
              Change run
            </Button>
          )}
          {canRecord && (
            <Button className={formStyles.bigButton} icon={<Delete20Regular />} aria-label={`Delete run ${run.label}`} onClick={onDelete}>
              Delete
            </Button>
          )}
          {photos.canChange && (
            <Button className={formStyles.bigButton} icon={<Camera20Regular />} onClick={() => photos.addPhotos({ type: 'run', id: run.id })}>
              Add photos
            </Button>
          )}
        </div>
      )}
    </li>
  );
}
