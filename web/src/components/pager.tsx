import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { ChevronLeft20Regular, ChevronRight20Regular } from '@fluentui/react-icons';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    marginBlockStart: tokens.spacingVerticalL,
  },
  buttons: { display: 'flex', gap: tokens.spacingHorizontalS },
  button: { minHeight: '48px', minWidth: '48px' },
});

type PagerProps = {
  page: number;
  pageSize: number;
  total: number;
  /** What is counted, plural: "jobs". */
  noun: string;
  onPageChange: (page: number) => void;
};

/** "21–40 of 57 jobs" with previous/next buttons; hidden when everything fits on one page. */
export function Pager({ page, pageSize, total, noun, onPageChange }: PagerProps) {
  const styles = useStyles();
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav className={styles.root} aria-label="Pages">
      <Text>{total === 0 ? `No ${noun}` : `${first}–${last} of ${total} ${noun}`}</Text>
      {pages > 1 && (
        <div className={styles.buttons}>
          <Button className={styles.button} icon={<ChevronLeft20Regular />} disabled={page <= 1} onClick={() => onPageChange(page - 1)}>
            Previous
          </Button>
          <Button
            className={styles.button}
            icon={<ChevronRight20Regular />}
            iconPosition="after"
            disabled={page >= pages}
            onClick={() => onPageChange(page + 1)}
          >
            Next
          </Button>
        </div>
      )}
    </nav>
  );
}
