import { Button, makeStyles, mergeClasses, ProgressBar, Text, tokens } from '@fluentui/react-components';
import { ArrowClockwise20Regular, CheckmarkCircle20Regular, Dismiss20Regular, ErrorCircle20Regular, WifiOff20Regular } from '@fluentui/react-icons';
import { useEffect, useState } from 'react';

import { useOnline } from '../../../lib/use-online';
import { useObjectUrl } from '../api/get-photo-file';
import { getUploadQueue } from '../hooks/use-upload-queue';
import type { UploadEntry, UploadStatus } from '../utils/upload-queue';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'grid',
    gridTemplateColumns: '48px minmax(0, 1fr) auto',
    alignItems: 'center',
    gap: tokens.spacingHorizontalM,
    padding: tokens.spacingHorizontalS,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  failedRow: { backgroundColor: tokens.colorPaletteRedBackground1 },
  preview: { width: '48px', height: '48px', objectFit: 'cover', borderRadius: tokens.borderRadiusSmall, backgroundColor: tokens.colorNeutralBackground4 },
  body: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXS, minWidth: 0 },
  name: { overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  state: { display: 'inline-flex', alignItems: 'center', gap: tokens.spacingHorizontalXS, color: tokens.colorNeutralForeground2 },
  done: { color: tokens.colorPaletteGreenForeground1 },
  warn: { color: tokens.colorPaletteDarkOrangeForeground1 },
  failed: { color: tokens.colorPaletteRedForeground1 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalXS },
  button: { minHeight: '44px', minWidth: '44px' },
});

/** A clock that ticks every second while `isOn`, for "retrying in 8 s". */
function useNow(isOn: boolean): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!isOn) return;
    const timer = window.setInterval(() => setNow(Date.now()), 1_000);
    return () => window.clearInterval(timer);
  }, [isOn]);
  return now;
}

/** The words for where an upload is. */
export function describeUploadStatus(status: UploadStatus, now: number, isOnline = true): string {
  switch (status.kind) {
    case 'waiting':
      return 'Waiting to send';
    case 'uploading':
      return status.total > 0 && status.loaded >= status.total
        ? 'Sent, the server is processing it'
        : `Uploading ${status.total > 0 ? Math.floor((status.loaded / status.total) * 100) : 0} %`;
    case 'retrying':
      return status.retryAt === null || !isOnline
        ? 'No connection: it is sent when the connection returns'
        : `${status.reason} Retrying in ${Math.max(1, Math.ceil((status.retryAt - now) / 1000))} s`;
    case 'failed':
      return `Not sent: ${status.reason}`;
    case 'done':
      return 'Uploaded';
  }
}

function UploadRow({ entry, now, isOnline }: { entry: UploadEntry; now: number; isOnline: boolean }) {
  const styles = useStyles();
  const preview = useObjectUrl(entry.file);
  const { status } = entry;
  const queue = getUploadQueue();
  const text = describeUploadStatus(status, now, isOnline);
  return (
    <li className={mergeClasses(styles.row, status.kind === 'failed' && styles.failedRow)} aria-label={entry.name} data-upload-state={status.kind}>
      {preview ? <img src={preview} alt="" className={styles.preview} /> : <span className={styles.preview} />}
      <div className={styles.body}>
        <Text weight="semibold" className={styles.name}>
          {entry.name}
        </Text>
        <Text
          size={200}
          role="status"
          className={mergeClasses(
            styles.state,
            status.kind === 'done' && styles.done,
            status.kind === 'retrying' && styles.warn,
            status.kind === 'failed' && styles.failed,
          )}
        >
          {status.kind === 'done' && <CheckmarkCircle20Regular aria-hidden />}
          {status.kind === 'retrying' && <WifiOff20Regular aria-hidden />}
          {status.kind === 'failed' && <ErrorCircle20Regular aria-hidden />}
          {text}
        </Text>
        {status.kind === 'uploading' && (
          <ProgressBar
            aria-label={`Upload of ${entry.name}`}
            value={status.total > 0 ? status.loaded / status.total : undefined}
            thickness="large"
          />
        )}
      </div>
      <div className={styles.actions}>
        {(status.kind === 'failed' || status.kind === 'retrying') && (
          <Button
            className={styles.button}
            icon={<ArrowClockwise20Regular />}
            aria-label={`Try ${entry.name} again now`}
            onClick={() => void queue.retry(entry.id)}
          />
        )}
        {status.kind !== 'uploading' && (
          <Button
            appearance="subtle"
            className={styles.button}
            icon={<Dismiss20Regular />}
            aria-label={status.kind === 'done' ? `Hide ${entry.name}` : `Discard ${entry.name}`}
            onClick={() => void queue.discard(entry.id)}
          />
        )}
      </div>
    </li>
  );
}

/** One row per picked file: preview, where it is (waiting, n %, retrying in …, refused and why, done) and its actions. */
export function UploadList({ entries, label }: { entries: readonly UploadEntry[]; label: string }) {
  const styles = useStyles();
  const isOnline = useOnline();
  const now = useNow(entries.some((entry) => entry.status.kind === 'retrying'));
  if (entries.length === 0) return null;
  return (
    <ul className={styles.list} aria-label={label}>
      {entries.map((entry) => (
        <UploadRow key={entry.id} entry={entry} now={now} isOnline={isOnline} />
      ))}
    </ul>
  );
}
