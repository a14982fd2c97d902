import { Button, makeStyles, mergeClasses, Text, tokens } from '@fluentui/react-components';
import { ChevronLeft20Regular, ChevronRight20Regular } from '@fluentui/react-icons';
import { Link } from 'react-router';
import type { OutboxListResponse } from '@domain/mail/outbox.schema';

import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  list: {
    listStyle: 'none',
    margin: 0,
    padding: 0,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
    overflow: 'hidden',
  },
  item: { ':not(:first-child)': { borderTop: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}` } },
  link: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) auto',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalXXS,
    minHeight: '64px',
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    color: tokens.colorNeutralForeground1,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
    ':focus-visible': {
      outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}`,
      outlineOffset: `calc(${tokens.strokeWidthThick} * -1)`,
    },
  },
  subject: {
    gridColumn: '1 / -1',
    fontWeight: tokens.fontWeightSemibold,
    fontSize: tokens.fontSizeBase400,
    lineHeight: tokens.lineHeightBase400,
    overflowWrap: 'anywhere',
  },
  to: { color: tokens.colorNeutralForeground2, overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  time: { color: tokens.colorNeutralForeground3, fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  pager: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
  },
  pagerButtons: { display: 'flex', gap: tokens.spacingHorizontalS },
  pagerButton: { minHeight: '44px' },
  empty: {
    margin: 0,
    padding: tokens.spacingHorizontalXL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground2,
  },
  stale: { opacity: 0.6 },
});

type OutboxListProps = {
  data: OutboxListResponse;
  onPageChange: (page: number) => void;
  isLoadingPage?: boolean;
};

/** Captured messages, newest first, one page at a time. */
export function OutboxList({ data, onPageChange, isLoadingPage = false }: OutboxListProps) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const { items, total, page, pageSize } = data;
  const pageCount = Math.max(1, Math.ceil(total / pageSize));

  if (total === 0) {
    return (
      <Text as="p" block size={400} className={styles.empty}>
        No mail yet. Invitations and password reset e-mails appear here as soon as Loamline sends them.
      </Text>
    );
  }

  const first = (page - 1) * pageSize + 1;
  const last = Math.min(total, first + items.length - 1);

  return (
    <div className={styles.root}>
      <ul className={mergeClasses(styles.list, isLoadingPage && styles.stale)} aria-label="Captured messages">
        {items.map((message) => (
          <li key={message.id} className={styles.item}>
            <Link to={paths.outboxMessage.getHref(message.id)} className={styles.link}>
              <span className={styles.subject}>{message.subject || '(no subject)'}</span>
              <span className={styles.to}>To {message.to.join(', ')}</span>
              <time dateTime={message.receivedAt} className={styles.time}>
                {formatDateTime(message.receivedAt, dateStyle)}
              </time>
            </Link>
          </li>
        ))}
      </ul>
      <div className={styles.pager}>
        <Text aria-live="polite">
          {first}–{last} of {total}
        </Text>
        {pageCount > 1 && (
          <div className={styles.pagerButtons}>
            <Button
              className={styles.pagerButton}
              icon={<ChevronLeft20Regular />}
              disabled={page <= 1}
              onClick={() => onPageChange(page - 1)}
            >
              Newer
            </Button>
            <Button
              className={styles.pagerButton}
              icon={<ChevronRight20Regular />}
              iconPosition="after"
              disabled={page >= pageCount}
              onClick={() => onPageChange(page + 1)}
            >
              Older
            </Button>
          </div>
        )}
      </div>
    </div>
  );
}
