import { Button, makeStyles, ProgressBar, Spinner, Text, tokens } from '@fluentui/react-components';
import {
  ArrowDownload20Regular,
  CheckmarkCircle20Filled,
  ErrorCircle20Filled,
  HourglassHalf20Regular,
} from '@fluentui/react-icons';

import { describeRequestError } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { useSessionUser } from '../../../lib/session';
import { JobDeliveries } from '../../delivery';
import { SendPacketDialog } from '../../delivery';
import { useDownloadPacketFile } from '../api/get-packet-file';
import { isPacketInProgress, useJobPackets, type PacketRevision, type PacketStatus } from '../../delivery';

import { useCardStyles } from '../../../components/card-styles';

const useStyles = makeStyles({
  row: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS, paddingBlock: tokens.spacingVerticalS },
  status: { display: 'inline-flex', alignItems: 'center', gap: tokens.spacingHorizontalXS, fontWeight: tokens.fontWeightSemibold },
  failed: { color: tokens.colorPaletteRedForeground1 },
  ready: { color: tokens.colorPaletteGreenForeground1 },
  action: { minHeight: '44px' },
});

const STATUS_WORDS: Record<PacketStatus, string> = {
  queued: 'Queued for rendering',
  rendering: 'Rendering the PDF',
  ready: 'Ready',
  failed: 'Failed',
};

type PacketCardProps = {
  jobId: string;
};

/**
 * The job's handover packet: follow each revision's render, download its files; the office sends a
 * ready revision to the homeowner and follows its e-mails here. Issuing is at the top of the job page
 * (`IssuePacketDialog`, with its confirmation step).
 */
export function PacketCard({ jobId }: PacketCardProps) {
  const card = useCardStyles();
  const styles = useStyles();
  const user = useSessionUser();
  // Sending (and the delivery log) is for admin and office, as the API allows.
  const canSend = user?.role === 'admin' || user?.role === 'office';
  const packets = useJobPackets(jobId);
  const download = useDownloadPacketFile();

  return (
    <section className={card.card} aria-labelledby="packet-card-title">
      <div className={card.sectionHead}>
        <Text as="h2" size={500} weight="semibold" id="packet-card-title" className={card.title}>
          Handover packet
        </Text>
      </div>
      {packets.isPending && <Spinner size="small" label="Loading revisions" />}
      {packets.isError && <Text className={styles.failed}>{describeRequestError(packets.error)}</Text>}
      {packets.data?.length === 0 && <Text>No revision issued yet.</Text>}
      {packets.data && packets.data.length > 0 && (
        <ul className={card.list} aria-label="Packet revisions">
          {packets.data.map((p) => (
            <RevisionRow key={p.id} packet={p} canSend={canSend} onDownload={(url, fileName) => download.mutate({ url, fileName })} />
          ))}
        </ul>
      )}
      {download.isError && <Text className={styles.failed}>{describeRequestError(download.error)}</Text>}
      {canSend && <JobDeliveries jobId={jobId} />}
    </section>
  );
}

function RevisionRow({ packet, canSend, onDownload }: { packet: PacketRevision; canSend: boolean; onDownload: (url: string, fileName: string) => void }) {
  const styles = useStyles();
  const dateStyle = useDateStyle();
  const card = useCardStyles();
  const inProgress = isPacketInProgress(packet.status);
  const icon =
    packet.status === 'ready' ? <CheckmarkCircle20Filled aria-hidden /> : packet.status === 'failed' ? <ErrorCircle20Filled aria-hidden /> : <HourglassHalf20Regular aria-hidden />;
  const base = `packet-rev-${packet.revision}`;
  return (
    <li className={styles.row} aria-label={`Revision ${packet.revision}`}>
      <Text weight="semibold">Revision {packet.revision}</Text>
      <span className={`${styles.status} ${packet.status === 'failed' ? styles.failed : packet.status === 'ready' ? styles.ready : ''}`} role="status">
        {icon}
        {STATUS_WORDS[packet.status]}
        {packet.status === 'ready' && packet.pageCount !== null && `, ${packet.pageCount} pages`}
      </span>
      {inProgress && <ProgressBar thickness="large" value={packet.status === 'queued' ? 0.15 : undefined} aria-label={STATUS_WORDS[packet.status]} />}
      {packet.status === 'failed' && packet.failureReason && <Text className={styles.failed}>Reason: {packet.failureReason}</Text>}
      <Text size={200}>Issued {formatDateTime(packet.issuedAt, dateStyle)}</Text>
      {packet.status === 'ready' && (
        <div className={card.actions}>
          {packet.pdf && (
            <Button className={styles.action} icon={<ArrowDownload20Regular />} onClick={() => onDownload(packet.pdf!.url, `${base}.pdf`)}>
              Download PDF
            </Button>
          )}
          {packet.archive && (
            <Button className={styles.action} icon={<ArrowDownload20Regular />} onClick={() => onDownload(packet.archive!.url, `${base}.zip`)}>
              Download archive (zip)
            </Button>
          )}
          {canSend && <SendPacketDialog revisionId={packet.id} revision={packet.revision} />}
        </div>
      )}
    </li>
  );
}
