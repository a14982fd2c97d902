import { Badge, Button, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { ArrowDownload20Regular, Checkmark16Filled, ShieldCheckmark20Regular } from '@fluentui/react-icons';
import { useState } from 'react';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format-date';
import { saveFile } from '../../../lib/save-file';
import { useDateStyle } from '../../../lib/use-date-style';
import type { PortalPacket } from '../api/get-portal-site';
import { getPacketFile } from '../api/get-packet-file';
import { sha256Hex } from '../utils/sha256';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalS,
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  title: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: tokens.spacingHorizontalS },
  files: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  file: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: tokens.spacingHorizontalS },
  button: { minHeight: '44px' },
  hash: { fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase200, overflowWrap: 'anywhere', color: tokens.colorNeutralForeground2 },
  ok: { color: tokens.colorPaletteGreenForeground1 },
  bad: { color: tokens.colorPaletteRedForeground1 },
  muted: { color: tokens.colorNeutralForeground2 },
});

type Verdict = { state: 'pending' } | { state: 'match' } | { state: 'mismatch'; actual: string } | { state: 'failed'; message: string };

function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

function PacketFile({ label, file, fileName }: { label: string; file: PortalPacket['pdf']; fileName: string }) {
  const styles = useStyles();
  const notify = useNotify();
  const [downloading, setDownloading] = useState(false);
  const [verdict, setVerdict] = useState<Verdict | undefined>();

  const download = async () => {
    setDownloading(true);
    try {
      saveFile(await getPacketFile(file.url), fileName);
    } catch (error) {
      notify.error('Could not download the file', describeRequestError(error));
    } finally {
      setDownloading(false);
    }
  };

  const verify = async () => {
    setVerdict({ state: 'pending' });
    try {
      const actual = await sha256Hex(await getPacketFile(file.url));
      setVerdict(actual === file.sha256.toLowerCase() ? { state: 'match' } : { state: 'mismatch', actual });
    } catch (error) {
      setVerdict({ state: 'failed', message: describeRequestError(error) });
    }
  };

  return (
    <div className={styles.files}>
      <div className={styles.file}>
        <Button
          className={styles.button}
          icon={downloading ? <Spinner size="tiny" /> : <ArrowDownload20Regular />}
          disabled={downloading}
          onClick={() => void download()}
        >
          {label} ({formatBytes(file.bytes)})
        </Button>
        <Button
          appearance="subtle"
          className={styles.button}
          icon={verdict?.state === 'pending' ? <Spinner size="tiny" /> : <ShieldCheckmark20Regular />}
          disabled={verdict?.state === 'pending'}
          onClick={() => void verify()}
          aria-label={`Verify ${label}`}
        >
          Verify
        </Button>
        <span role="status">
          {verdict?.state === 'match' && (
            <Text className={styles.ok} weight="semibold">
              <Checkmark16Filled aria-hidden="true" /> Checksum matches
            </Text>
          )}
          {verdict?.state === 'mismatch' && (
            <Text className={styles.bad} weight="semibold">
              Checksum does not match (got {verdict.actual.slice(0, 12)}…)
            </Text>
          )}
          {verdict?.state === 'failed' && <Text className={styles.bad}>Could not verify: {verdict.message}</Text>}
        </span>
      </div>
      <Text className={styles.hash}>SHA-256 {file.sha256}</Text>
    </div>
  );
}

/** Every issued revision at the site, newest first, with its downloads and checksums. */
export function PacketList({ packets }: { packets: PortalPacket[] }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  if (packets.length === 0) return <Text className={styles.muted}>No handover packet has been issued for this site yet.</Text>;
  return (
    <ul className={styles.list} aria-label="Handover packets">
      {packets.map((packet) => (
        <li key={packet.id} className={styles.row}>
          <div className={styles.title}>
            <Text weight="semibold">{packet.jobTitle}</Text>
            <Text>revision {packet.revision}</Text>
            <Text className={styles.muted}>issued {formatDate(packet.issuedAt, dateStyle)}</Text>
            {packet.isLatest && (
              <Badge appearance="tint" color="brand">
                latest
              </Badge>
            )}
          </div>
          <PacketFile label="PDF" file={packet.pdf} fileName={`packet-${packet.jobTitle}-rev${packet.revision}.pdf`} />
          <PacketFile label="Archive (zip)" file={packet.archive} fileName={`packet-${packet.jobTitle}-rev${packet.revision}.zip`} />
        </li>
      ))}
    </ul>
  );
}
