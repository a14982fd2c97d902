import { makeStyles, Text, tokens } from '@fluentui/react-components';
import { MailError20Regular } from '@fluentui/react-icons';

import { useFailedDeliveries } from '../api/get-failed-deliveries';

import { DeliveryStatusList } from './delivery-status-list';

const useStyles = makeStyles({
  card: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow4,
    borderInlineStartWidth: '4px',
    borderInlineStartStyle: 'solid',
    borderInlineStartColor: tokens.colorPaletteRedBorder2,
    marginBottom: tokens.spacingVerticalXL,
  },
  head: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS, margin: 0, color: tokens.colorPaletteRedForeground1 },
  muted: { color: tokens.colorNeutralForeground2 },
});

/**
 * The office's home page: packet e-mails that failed and are still waiting for someone (sent again or
 * dismissed, they leave). Shows nothing when there are none, or while the list loads.
 */
export function FailedDeliveriesCard() {
  const styles = useStyles();
  const failed = useFailedDeliveries();
  if (!failed.data || failed.data.length === 0) return null;
  return (
    <section className={styles.card} aria-labelledby="failed-deliveries-title">
      <Text as="h3" id="failed-deliveries-title" size={500} weight="semibold" className={styles.head}>
        <MailError20Regular aria-hidden />
        Packets that did not reach the homeowner
      </Text>
      <Text className={styles.muted}>Send again once the reason is fixed, or dismiss when the homeowner has the packet another way.</Text>
      <DeliveryStatusList
        label="Failed packet e-mails"
        canAct
        deliveries={failed.data.map((d) => ({ ...d, context: { jobId: d.jobId, jobTitle: d.jobTitle, siteLabel: d.siteLabel, revision: d.revision } }))}
      />
    </section>
  );
}
