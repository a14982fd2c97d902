import { Button, Text } from '@fluentui/react-components';
import { ArrowUndo20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { formatDate } from '@domain/format/date-time';
import type { JobAsBuiltResponse, SiteRecordInfo } from '@domain/jobs/job.schema';

import { useCardStyles } from '../../../components/card-styles';
import { useFormStyles } from '../../../components/form-styles';
import { useJobWriter } from '../hooks/job-writer';
import type { DeleteRequest } from '../utils/delete-requests';

/*
 * Issue 21: a job's as-built is the property's installed system. Records an earlier job installed show
 * here as already in the ground (who put them in and when), read-only until this job changes them; a
 * change by this job says so and can be undone (the record goes back to how the earlier job left it).
 */

const CHANGE_WORDS: Record<SiteRecordInfo['changedBy'][number]['change'], string> = {
  changed: 'This job changes it.',
  abandoned: 'This job abandons it in place.',
  removed: 'This job takes it out.',
};

/** The provenance of an existing record, in one line. */
export function siteRecordText(info: SiteRecordInfo, jobId: string): string {
  const parts = [
    info.isThisJob
      ? `Already in the ground: installed ${formatDate(info.installedOn)} and issued in an earlier revision of this job.`
      : `Already in the ground: installed ${formatDate(info.installedOn)} by “${info.installedBy.jobTitle}”.`,
  ];
  const mine = openChangeOf(info, jobId);
  const byWhom = (c: { jobId: string; jobTitle: string }) => (c.jobId === jobId ? 'an earlier revision of this job' : `“${c.jobTitle}”`);
  if (info.abandoned && info.abandoned.jobId !== jobId) parts.push(`Abandoned in place since ${formatDate(info.abandoned.on)} (“${info.abandoned.jobTitle}”).`);
  // Abandoned by an earlier revision of this job (not by this revision: that is its own change, below).
  if (info.abandoned && info.abandoned.jobId === jobId && mine?.change !== 'abandoned') {
    parts.push(`Abandoned in place since ${formatDate(info.abandoned.on)} by an earlier revision of this job.`);
  }
  // Changes already issued (another job's, or an earlier revision of this one), oldest first, with dates.
  const issued = info.changedBy.filter((c) => c.isIssued && c.change === 'changed');
  if (issued.length > 0) parts.push(`Changed ${issued.map((c) => `${formatDate(c.on)} by ${byWhom(c)}`).join('; ')}.`);
  parts.push(mine ? CHANGE_WORDS[mine.change] : 'Read-only until this job changes it.');
  return parts.join(' ');
}

/** This job's change to the record since its last issue (the one Undo takes back), if any. */
function openChangeOf(info: SiteRecordInfo, jobId: string): SiteRecordInfo['changedBy'][number] | undefined {
  return info.changedBy.find((c) => c.jobId === jobId && !c.isIssued);
}

function useUndo(label: string, recordId: string) {
  const writer = useJobWriter();
  const [error, setError] = useState<string | undefined>();
  const [isBusy, setBusy] = useState(false);
  const undo = async () => {
    setBusy(true);
    setError(undefined);
    try {
      await writer.save({ endpoint: 'undoSiteChange', params: { recordId }, label: `Undoing this job’s change to “${label}”` });
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The change could not be undone.');
    } finally {
      setBusy(false);
    }
  };
  return { undo, error, isBusy };
}

type NoteProps = { data: JobAsBuiltResponse; recordId: string; label: string; canRecord: boolean };

/**
 * Under a run or item card: for an earlier job's record, who put it in and when; for this job's own,
 * only once an earlier revision issued it (a reopened job) and this revision changes it; nothing else.
 */
export function SiteRecordNote({ data, recordId, label, canRecord }: NoteProps) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const { undo, error, isBusy } = useUndo(label, recordId);
  const info = data.records.siteRecords?.[recordId];
  // Only a change since this job's last issue can be undone; an issued one belongs to its revision.
  const isChangedHere = info !== undefined && openChangeOf(info, data.job.id) !== undefined;
  // This job's own record: only while this revision has an unissued change to what an earlier one issued.
  const isOwnChangedNow = info?.isIssued === true && isChangedHere;
  if (!info || (info.isThisJob && !isOwnChangedNow)) return null;
  return (
    <div role="note" aria-label={`Installed earlier: ${label}`}>
      <Text block className={styles.empty}>
        {siteRecordText(info, data.job.id)}
      </Text>
      {isChangedHere && canRecord && (
        <Button className={formStyles.bigButton} icon={<ArrowUndo20Regular />} disabled={isBusy} onClick={() => void undo()}>
          Undo this job’s change
        </Button>
      )}
      {error && (
        <Text block role="alert" className={styles.warn}>
          {error}
        </Text>
      )}
    </div>
  );
}

/**
 * Whether deleting the record takes it out of the ground (recorded as removed by this job, dated)
 * rather than deleting it: an earlier job's record, or this job's own issued in an earlier revision.
 */
export function isInSiteRecord(info: SiteRecordInfo | undefined): boolean {
  return info !== undefined && (!info.isThisJob || info.isIssued === true);
}

/**
 * Deleting a run or item already in the site's record (an earlier job's, or with `isThisJob` this job's
 * own from an issued revision) records that this job took it out; Undo puts it back.
 */
export function existingRemoveRequest(kind: 'run' | 'item', record: { id: string; label: string }, isThisJob = false): DeleteRequest {
  const noun = kind === 'run' ? 'run' : 'equipment';
  return {
    title: `Take out the ${noun} “${record.label}”?`,
    consequences: `${isThisJob ? 'This job installed it in a revision already issued.' : 'An earlier job installed it.'} It is recorded as taken out by this job, on this job’s work date, and leaves the system from this job on; the earlier packet still shows it as it was.`,
    write: { ...(kind === 'run' ? { endpoint: 'deleteRun' as const, params: { runId: record.id } } : { endpoint: 'deleteItem' as const, params: { itemId: record.id } }), label: `Taking out the ${noun} “${record.label}”` },
    doneTitle: `“${record.label}” taken out`,
    undo: { endpoint: 'undoSiteChange', params: { recordId: record.id }, label: `Putting back “${record.label}”` },
  };
}

/** Under the runs (or equipment): what this job took out of the ground, each with Put back. */
export function RemovedRecords({ data, kind, canRecord }: { data: JobAsBuiltResponse; kind: 'run' | 'item'; canRecord: boolean }) {
  const styles = useCardStyles();
  const removed = (data.records.removedByThisJob ?? []).filter((r) => r.kind === kind);
  if (removed.length === 0) return null;
  return (
    <div aria-label={kind === 'run' ? 'Runs taken out by this job' : 'Equipment taken out by this job'}>
      <Text as="h4" size={400} weight="semibold" className={styles.title}>
        Taken out by this job
      </Text>
      <ul className={styles.list}>
        {removed.map((r) => (
          <RemovedRow key={r.id} id={r.id} label={r.label} on={r.removedOn} canRecord={canRecord} />
        ))}
      </ul>
    </div>
  );
}

function RemovedRow({ id, label, on, canRecord }: { id: string; label: string; on: string; canRecord: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const { undo, error, isBusy } = useUndo(label, id);
  return (
    <li className={styles.card}>
      <Text block>
        {label} — taken out {formatDate(on)}
      </Text>
      {canRecord && (
        <Button className={formStyles.bigButton} icon={<ArrowUndo20Regular />} disabled={isBusy} onClick={() => void undo()}>
          Put back
        </Button>
      )}
      {error && (
        <Text block role="alert" className={styles.warn}>
          {error}
        </Text>
      )}
    </li>
  );
}
