import {
  createTableColumn,
  DataGrid,
  DataGridBody,
  DataGridCell,
  DataGridHeader,
  DataGridHeaderCell,
  DataGridRow,
  makeStyles,
  mergeClasses,
  Text,
  tokens,
  type SortDirection,
  type TableColumnDefinition,
  type TableColumnId,
} from '@fluentui/react-components';
import { ChevronRight20Regular } from '@fluentui/react-icons';
import { useMemo } from 'react';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';
import { formatDate, formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import type { JobSummaryResponse } from '../api/get-jobs';

import { JobStatusBadge } from './job-status-badge';

const useStyles = makeStyles({
  grid: {
    backgroundColor: tokens.colorNeutralBackground1,
    borderRadius: tokens.borderRadiusLarge,
    boxShadow: tokens.shadow2,
    overflow: 'hidden',
  },
  row: { minHeight: '56px' },
  title: { flex: '2 1 0' },
  site: { flex: '1.6 1 0' },
  customer: { flex: '1.3 1 0' },
  status: { flex: '1.5 1 0', whiteSpace: 'nowrap' },
  crewLead: { flex: '1.1 1 0' },
  updatedAt: { flex: '1.2 1 0' },
  link: {
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { textDecorationLine: 'underline' },
  },
  ellipsis: { overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  // A job's title is how people tell jobs apart ("Back yard sound, patio and spa"): up to two lines
  // before it is cut, so two jobs on one property do not read the same.
  twoLines: {
    display: '-webkit-box',
    WebkitLineClamp: 2,
    WebkitBoxOrient: 'vertical',
    overflow: 'hidden',
    overflowWrap: 'anywhere',
    paddingBlock: tokens.spacingVerticalXS,
  },
  stack: { display: 'flex', flexDirection: 'column', minWidth: 0 },
  muted: { color: tokens.colorNeutralForeground3 },
  stale: { opacity: 0.6 },
  cards: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  card: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) auto',
    alignItems: 'center',
    columnGap: tokens.spacingHorizontalM,
    rowGap: tokens.spacingVerticalXS,
    minHeight: '72px',
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
    color: tokens.colorNeutralForeground1,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
    ':focus-visible': { outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}` },
  },
  cardMain: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, minWidth: 0 },
  cardFacts: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: `${tokens.spacingVerticalXS} ${tokens.spacingHorizontalM}` },
  empty: {
    margin: 0,
    padding: tokens.spacingHorizontalXL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
  },
});

type JobsTableProps = {
  jobs: readonly JobSummaryResponse[];
  /** The server's sort, e.g. `-updatedAt`. */
  sort: string;
  onSortChange: (sort: string) => void;
  isPhone: boolean;
  isStale?: boolean;
  emptyText: string;
};

// The server sorts; the grid only shows the arrow. Fluent treats a column as sortable when its compare
// function takes two arguments, so this one declares both.
const serverSorted = (_a: JobSummaryResponse, _b: JobSummaryResponse) => 0;

/** The jobs of one page: a grid sorted by the server on wide screens, one card per job on a phone. */
export function JobsTable({ jobs, sort, onSortChange, isPhone, isStale = false, emptyText }: JobsTableProps) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const sortColumn = sort.replace(/^-/, '');
  const sortDirection: SortDirection = sort.startsWith('-') ? 'descending' : 'ascending';

  const columns = useMemo<TableColumnDefinition<JobSummaryResponse>[]>(
    () => [
      createTableColumn<JobSummaryResponse>({
        columnId: 'title',
        compare: serverSorted,
        renderHeaderCell: () => 'Job',
        renderCell: (job) => (
          <Link to={paths.job.getHref(job.id)} className={mergeClasses(styles.link, styles.twoLines)} title={job.title}>
            {job.title}
          </Link>
        ),
      }),
      createTableColumn<JobSummaryResponse>({
        columnId: 'site',
        compare: serverSorted,
        renderHeaderCell: () => 'Site',
        renderCell: (job) => (
          <span className={styles.stack}>
            <span className={styles.ellipsis}>{job.site.label}</span>
            <Text size={200} className={mergeClasses(styles.muted, styles.ellipsis)}>
              {job.site.city}
            </Text>
          </span>
        ),
      }),
      createTableColumn<JobSummaryResponse>({
        columnId: 'customer',
        compare: serverSorted,
        renderHeaderCell: () => 'Customer',
        renderCell: (job) => <span className={styles.ellipsis}>{job.customer.name}</span>,
      }),
      createTableColumn<JobSummaryResponse>({
        columnId: 'status',
        compare: serverSorted,
        renderHeaderCell: () => 'Status',
        renderCell: (job) => <JobStatusBadge status={job.status} />,
      }),
      createTableColumn<JobSummaryResponse>({
        columnId: 'crewLead',
        renderHeaderCell: () => 'Crew lead',
        renderCell: (job) =>
          job.crewLead ? <span className={styles.ellipsis}>{job.crewLead.name}</span> : <span className={styles.muted}>Nobody yet</span>,
      }),
      createTableColumn<JobSummaryResponse>({
        columnId: 'updatedAt',
        compare: serverSorted,
        renderHeaderCell: () => 'Last change',
        renderCell: (job) => formatDateTime(job.updatedAt, dateStyle),
      }),
    ],
    [dateStyle, styles],
  );
  const columnClass = (columnId: TableColumnId) => (styles as Record<string, string>)[String(columnId)];

  if (jobs.length === 0) {
    return (
      <Text as="p" block size={400} className={styles.empty}>
        {emptyText}
      </Text>
    );
  }

  if (isPhone) {
    return (
      <ul className={mergeClasses(styles.cards, isStale && styles.stale)} aria-label="Jobs">
        {jobs.map((job) => (
          <li key={job.id}>
            <Link to={paths.job.getHref(job.id)} className={styles.card}>
              <span className={styles.cardMain}>
                <Text weight="semibold" size={400}>
                  {job.title}
                </Text>
                <Text>
                  {job.site.label}, {job.site.city}
                </Text>
                <span className={styles.cardFacts}>
                  <JobStatusBadge status={job.status} />
                  <Text size={200} className={styles.muted}>
                    {job.startDate ? `Starts ${formatDate(job.startDate, dateStyle)}` : `Changed ${formatDate(job.updatedAt, dateStyle)}`}
                  </Text>
                </span>
              </span>
              <ChevronRight20Regular aria-hidden />
            </Link>
          </li>
        ))}
      </ul>
    );
  }

  return (
    <DataGrid
      items={[...jobs]}
      columns={columns}
      sortable
      sortState={{ sortColumn, sortDirection }}
      onSortChange={(_event, next) => {
        if (next.sortColumn === undefined) return;
        onSortChange(`${next.sortDirection === 'descending' ? '-' : ''}${String(next.sortColumn)}`);
      }}
      getRowId={(job: JobSummaryResponse) => job.id}
      resizableColumns={false}
      className={mergeClasses(styles.grid, isStale && styles.stale)}
      aria-label="Jobs"
    >
      <DataGridHeader>
        <DataGridRow>
          {({ renderHeaderCell, columnId }) => (
            <DataGridHeaderCell className={columnClass(columnId)}>{renderHeaderCell()}</DataGridHeaderCell>
          )}
        </DataGridRow>
      </DataGridHeader>
      <DataGridBody<JobSummaryResponse>>
        {({ item, rowId }) => (
          <DataGridRow<JobSummaryResponse> key={rowId} className={styles.row}>
            {({ renderCell, columnId }) => <DataGridCell className={columnClass(columnId)}>{renderCell(item)}</DataGridCell>}
          </DataGridRow>
        )}
      </DataGridBody>
    </DataGrid>
  );
}
