import { Button, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { ArrowDownload20Regular, Attach20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import type { OutboxMessageResponse } from '@domain/mail/outbox.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { saveFile } from '../../../lib/save-file';
import { getOutboxAttachment } from '../api/get-outbox-attachment';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  item: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: tokens.spacingHorizontalM,
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}`,
    borderRadius: tokens.borderRadiusMedium,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
  name: { flex: '1 1 12rem', minWidth: 0, display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS },
  filename: { overflowWrap: 'anywhere', fontWeight: tokens.fontWeightSemibold },
  meta: { color: tokens.colorNeutralForeground3, fontVariantNumeric: 'tabular-nums' },
  download: { minHeight: '44px' },
});

/** "812 B", "14.2 KB", "3.1 MB". */
export function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

type Attachment = OutboxMessageResponse['attachments'][number];

export function MessageAttachments({ messageId, attachments }: { messageId: string; attachments: readonly Attachment[] }) {
  const styles = useStyles();
  const notify = useNotify();
  const [downloading, setDownloading] = useState<string | undefined>();

  const download = async (attachment: Attachment) => {
    setDownloading(attachment.id);
    try {
      saveFile(await getOutboxAttachment(messageId, attachment.id), attachment.filename);
    } catch (error) {
      notify.error(`Could not download ${attachment.filename}`, describeRequestError(error));
    } finally {
      setDownloading(undefined);
    }
  };

  if (attachments.length === 0) return <Text>No attachments.</Text>;

  return (
    <ul className={styles.list}>
      {attachments.map((attachment) => (
        <li key={attachment.id} className={styles.item}>
          <span className={styles.name}>
            <Attach20Regular aria-hidden="true" />
            <span>
              <Text block className={styles.filename}>
                {attachment.filename}
              </Text>
              <Text size={200} className={styles.meta}>
                {attachment.contentType} · {formatSize(attachment.sizeBytes)}
              </Text>
            </span>
          </span>
          <Button
            className={styles.download}
            icon={downloading === attachment.id ? <Spinner size="tiny" /> : <ArrowDownload20Regular />}
            disabled={downloading !== undefined}
            aria-label={`Download ${attachment.filename}`}
            onClick={() => void download(attachment)}
          >
            Download
          </Button>
        </li>
      ))}
    </ul>
  );
}
