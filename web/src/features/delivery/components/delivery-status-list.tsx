import { Button, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import {
  ArrowClockwise20Regular,
  CheckmarkCircle20Filled,
  Dismiss20Regular,
  ErrorCircle20Filled,
  HourglassHalf20Regular,
  Send20Regular,
} from '@fluentui/react-icons';
import type { ReactNode } from 'react';
import { Link } from 'react-router';
import type { DeliveryStatus, PacketDeliveryResponse } from '@domain/delivery/delivery.schema';

import { useNotify } from '../../../components/notify';
import { paths } from '../../../config/paths';
import { describeRequestError } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { useDismissDelivery } from '../api/dismiss-delivery';
import { useResendDelivery } from '../api/resend-delivery';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    minHeight: '56px',
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}`,
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke2}`,
  },
  failedRow: { border: `1px solid ${tokens.colorPaletteRedBorder2}`, backgroundColor: tokens.colorPaletteRedBackground1 },
  who: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXS, minWidth: 0, overflowWrap: 'anywhere', flexGrow: 1, flexBasis: '14rem' },
  status: { display: 'inline-flex', alignItems: 'center', gap: tokens.spacingHorizontalXS, fontWeight: tokens.fontWeightSemibold },
  sent: { color: tokens.colorPaletteGreenForeground1 },
  failed: { color: tokens.colorPaletteRedForeground1 },
  muted: { color: tokens.colorNeutralForeground2 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  action: { minHeight: '44px' },
  link: { color: tokens.colorBrandForegroundLink, fontWeight: tokens.fontWeightSemibold },
});

const STATUS_WORDS: Record<DeliveryStatus, string> = { queued: 'Queued', sending: 'Sending', sent: 'Sent', failed: 'Failed' };

export type DeliveryRow = PacketDeliveryResponse & {
  /** Shown on lists that span jobs (the home page). */
  context?: { jobId: string; jobTitle: string; siteLabel: string; revision: number };
};

type DeliveryStatusListProps = {
  deliveries: readonly DeliveryRow[];
  label: string;
  /** Office and admin may send again and dismiss. */
  canAct: boolean;
};

/** One row per e-mail: recipient, queued / sending / sent (time) / failed (plain reason), Send again and Dismiss. */
export function DeliveryStatusList({ deliveries, label, canAct }: DeliveryStatusListProps) {
  const styles = useStyles();
  return (
    <ul className={styles.list} aria-label={label}>
      {deliveries.map((d) => (
        <DeliveryRowItem key={d.id} delivery={d} canAct={canAct} />
      ))}
    </ul>
  );
}

function DeliveryRowItem({ delivery: d, canAct }: { delivery: DeliveryRow; canAct: boolean }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const notify = useNotify();
  const resend = useResendDelivery();
  const dismiss = useDismissDelivery();
  const isFailed = d.status === 'failed';
  const isOpenFailure = isFailed && d.dismissedAt === null;
  const busy = resend.isPending || dismiss.isPending;

  const icon: ReactNode =
    d.status === 'sent' ? (
      <CheckmarkCircle20Filled aria-hidden />
    ) : isFailed ? (
      <ErrorCircle20Filled aria-hidden />
    ) : d.status === 'sending' ? (
      <Send20Regular aria-hidden />
    ) : (
      <HourglassHalf20Regular aria-hidden />
    );

  const onError = (title: string) => (error: unknown) => notify.error(title, describeRequestError(error));

  return (
    <li className={`${styles.row} ${isOpenFailure ? styles.failedRow : ''}`} aria-label={`E-mail to ${d.to}`}>
      <span className={styles.who}>
        <Text weight="semibold">{d.to}</Text>
        {d.context && (
          <Text size={200}>
            <Link to={paths.job.getHref(d.context.jobId)} className={styles.link}>
              {d.context.jobTitle}
            </Link>{' '}
            · {d.context.siteLabel} · revision {d.context.revision}
          </Text>
        )}
        <span role="status" className={`${styles.status} ${d.status === 'sent' ? styles.sent : isFailed ? styles.failed : ''}`}>
          {icon}
          {STATUS_WORDS[d.status]}
          {d.status === 'sent' && d.sentAt && ` ${formatDateTime(d.sentAt, dateStyle)}`}
          {d.status === 'sending' && <Spinner size="extra-tiny" aria-hidden />}
        </span>
        {isFailed && d.failureReason && <Text className={styles.failed}>{d.failureReason}</Text>}
        {d.status === 'queued' && d.failureReason && <Text className={styles.muted}>Trying again: {d.failureReason}</Text>}
        <Text size={200} className={styles.muted}>
          {[
            d.status === 'sent' ? (d.isPdfAttached ? 'PDF attached' : 'Link to the portal only') : d.pdf === 'link' ? 'Link only' : 'PDF attached',
            d.isInvited ? 'with an invitation to the portal' : undefined,
            d.dismissedAt ? `dismissed ${formatDateTime(d.dismissedAt, dateStyle)}` : undefined,
          ]
            .filter(Boolean)
            .join(' · ')}
        </Text>
      </span>
      {canAct && (d.status === 'failed' || d.status === 'sent') && (
        <span className={styles.actions}>
          <Button
            className={styles.action}
            appearance={isFailed ? 'primary' : 'secondary'}
            icon={resend.isPending ? <Spinner size="tiny" /> : <ArrowClockwise20Regular />}
            disabled={busy}
            aria-label={`Send again to ${d.to}`}
            onClick={() => resend.mutate(d.id, { onError: onError('Could not send again') })}
          >
            Send again
          </Button>
          {isOpenFailure && (
            <Button
              className={styles.action}
              icon={dismiss.isPending ? <Spinner size="tiny" /> : <Dismiss20Regular />}
              disabled={busy}
              aria-label={`Dismiss the failed e-mail to ${d.to}`}
              onClick={() => dismiss.mutate(d.id, { onError: onError('Could not dismiss') })}
            >
              Dismiss
            </Button>
          )}
        </span>
      )}
    </li>
  );
}
