import { makeStyles, MessageBar, MessageBarBody, MessageBarTitle, Spinner, Text, tokens } from '@fluentui/react-components';

import { describeRequestError } from '../../../lib/form-errors';
import { useJobDeliveries } from '../api/get-job-deliveries';

import { DeliveryStatusList } from './delivery-status-list';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  heading: { margin: 0 },
  failed: { color: tokens.colorPaletteRedForeground1 },
});

/**
 * The job's packet e-mails (every revision), newest first, with a warning at the top while one has
 * failed and was neither sent again nor dismissed. Office and admin only (the API refuses others).
 */
export function JobDeliveries({ jobId }: { jobId: string }) {
  const styles = useStyles();
  const deliveries = useJobDeliveries(jobId);
  if (deliveries.isPending) return <Spinner size="small" label="Loading e-mails" />;
  if (deliveries.isError) return <Text className={styles.failed}>{describeRequestError(deliveries.error)}</Text>;
  if (deliveries.data.length === 0) return null;
  const openFailures = deliveries.data.filter((d) => d.status === 'failed' && d.dismissedAt === null);
  return (
    <div className={styles.root}>
      <Text as="h3" size={400} weight="semibold" className={styles.heading}>
        E-mails to the homeowner
      </Text>
      {openFailures.length > 0 && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>
            <MessageBarTitle>{openFailures.length === 1 ? 'An e-mail did not arrive' : `${openFailures.length} e-mails did not arrive`}</MessageBarTitle>
            {openFailures.map((d) => d.to).join(', ')}: send again, or dismiss once the homeowner has the packet another way.
          </MessageBarBody>
        </MessageBar>
      )}
      <DeliveryStatusList deliveries={deliveries.data} label="E-mails to the homeowner" canAct />
    </div>
  );
}
