import {
  Card,
  makeStyles,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  Spinner,
  tokens,
} from '@fluentui/react-components';
import type { ReactNode } from 'react';

import { formatLatency, formatUptime } from '../utils/format';
import type { HealthSummary } from '../utils/summarize-health';

import { ServiceStatusBadge } from './service-status-badge';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  card: { padding: tokens.spacingHorizontalXL },
  list: {
    display: 'grid',
    gridTemplateColumns: 'minmax(9rem, max-content) minmax(0, 1fr)',
    alignItems: 'center',
    columnGap: tokens.spacingHorizontalXXL,
    margin: 0,
  },
  term: {
    color: tokens.colorNeutralForeground2,
    paddingBlock: tokens.spacingVerticalM,
  },
  value: {
    margin: 0,
    minWidth: 0,
    paddingBlock: tokens.spacingVerticalM,
    overflowWrap: 'anywhere',
    fontWeight: tokens.fontWeightSemibold,
  },
  figure: { fontVariantNumeric: 'tabular-nums', fontWeight: tokens.fontWeightRegular },
  divider: {
    gridColumn: '1 / -1',
    borderTop: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
});

type HealthReportProps = {
  summary: HealthSummary;
  /** When the last answer (or failure) arrived, in ms since the epoch; 0 before the first. */
  checkedAt: number;
};

/** The full health check: a plain-language verdict, then each figure the server reported. */
export function HealthReport({ summary, checkedAt }: HealthReportProps) {
  const styles = useStyles();
  const { report } = summary;
  const database = report?.database;

  const rows: [string, ReactNode][] = [
    ['Server (API)', <ServiceStatusBadge key="api" state={summary.api} />],
    ['Database', <ServiceStatusBadge key="db" state={summary.database} />],
    [
      'Database response time',
      database?.status === 'up' ? <span className={styles.figure}>{formatLatency(database.latencyMs)}</span> : '—',
    ],
    ['Version', report ? <span className={styles.figure}>{report.version}</span> : '—'],
    ['Running for', report ? formatUptime(report.uptimeSeconds) : '—'],
    ['Last checked', checkedAt > 0 ? new Date(checkedAt).toLocaleTimeString() : '—'],
  ];

  return (
    <div className={styles.root}>
      <Verdict summary={summary} />
      <Card className={styles.card}>
        <dl className={styles.list} aria-label="Health details">
          {rows.map(([term, value], index) => (
            <Row key={term} term={term} value={value} isFirst={index === 0} />
          ))}
        </dl>
      </Card>
    </div>
  );
}

function Row({ term, value, isFirst }: { term: string; value: ReactNode; isFirst: boolean }) {
  const styles = useStyles();
  return (
    <>
      {!isFirst && <div className={styles.divider} role="presentation" />}
      <dt className={styles.term}>{term}</dt>
      <dd className={styles.value}>{value}</dd>
    </>
  );
}

function Verdict({ summary }: { summary: HealthSummary }) {
  switch (summary.overall) {
    case 'checking':
      return <Spinner size="small" labelPosition="after" label="Checking the server and database…" />;
    case 'ok':
      return (
        <MessageBar intent="success" layout="multiline">
          <MessageBarBody>
            <MessageBarTitle>Everything is working</MessageBarTitle>
            The server and its database are answering.
          </MessageBarBody>
        </MessageBar>
      );
    case 'database-down': {
      const reason = summary.report?.database.status === 'down' ? summary.report.database.error : undefined;
      return (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>
            <MessageBarTitle>The database is down</MessageBarTitle>
            The server is running but cannot reach its database, so jobs cannot be opened or saved until it
            is back.{reason ? ` The server reports: ${reason}` : ''}
          </MessageBarBody>
        </MessageBar>
      );
    }
    case 'unreachable':
      return (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>
            <MessageBarTitle>The server cannot be reached</MessageBarTitle>
            {summary.problem} Check that Loamline is running and this device is online, then refresh.
          </MessageBarBody>
        </MessageBar>
      );
  }
}
