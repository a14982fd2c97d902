import { Card, makeStyles, Text, tokens } from '@fluentui/react-components';
import { ChevronRight20Regular } from '@fluentui/react-icons';
import { useId } from 'react';
import { Link } from 'react-router';

import type { HealthSummary } from '../utils/summarize-health';

import { ServiceStatusBadge } from './service-status-badge';

const useStyles = makeStyles({
  card: { padding: tokens.spacingHorizontalL, gap: tokens.spacingVerticalS },
  title: { margin: 0, paddingBlockEnd: tokens.spacingVerticalXS },
  rows: {
    listStyle: 'none',
    margin: 0,
    padding: 0,
    display: 'flex',
    flexDirection: 'column',
  },
  row: {
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    minHeight: '44px',
    borderTop: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
  link: {
    display: 'inline-flex',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: tokens.spacingHorizontalXXS,
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { textDecorationLine: 'underline', color: tokens.colorBrandForegroundLinkHover },
  },
});

type HealthSummaryCardProps = {
  summary: HealthSummary;
  detailsHref: string;
};

/** A glance at whether Loamline's server and database are up, linking to the full report. */
export function HealthSummaryCard({ summary, detailsHref }: HealthSummaryCardProps) {
  const styles = useStyles();
  const titleId = useId();
  return (
    <Card className={styles.card} role="region" aria-labelledby={titleId}>
      <Text as="h3" block id={titleId} size={500} weight="semibold" className={styles.title}>
        System status
      </Text>
      <ul className={styles.rows}>
        <li className={styles.row}>
          <Text>Server</Text>
          <ServiceStatusBadge state={summary.api} />
        </li>
        <li className={styles.row}>
          <Text>Database</Text>
          <ServiceStatusBadge state={summary.database} />
        </li>
      </ul>
      <Link to={detailsHref} className={styles.link}>
        Status details
        <ChevronRight20Regular aria-hidden="true" />
      </Link>
    </Card>
  );
}
