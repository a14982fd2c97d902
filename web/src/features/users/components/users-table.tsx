import {
  Badge,
  createTableColumn,
  DataGrid,
  DataGridBody,
  DataGridCell,
  DataGridHeader,
  DataGridHeaderCell,
  DataGridRow,
  makeStyles,
  Text,
  tokens,
  type TableColumnDefinition,
  type TableColumnId,
} from '@fluentui/react-components';
import { useMemo } from 'react';
import { canManageUser, ROLE_LABELS, type Role } from '@domain/auth/roles';
import type { DateStyle } from '@domain/format/date-time';

import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { useMediaQuery } from '../../../lib/use-media-query';
import type { UserResponse } from '../api/get-users';

import { UserActions } from './user-actions';
import { UserStatusBadge } from './user-status-badge';

const useStyles = makeStyles({
  grid: {
    backgroundColor: tokens.colorNeutralBackground1,
    borderRadius: tokens.borderRadiusLarge,
    boxShadow: tokens.shadow2,
    overflow: 'hidden',
  },
  row: { minHeight: '52px' },
  // Without resizable columns every cell flexes equally; give the e-mail the room it needs.
  name: { flex: '1.3 1 0' },
  email: { flex: '1.8 1 0' },
  role: { flex: '0.9 1 0' },
  status: { flex: '0.8 1 0' },
  lastSignIn: { flex: '1.3 1 0' },
  actions: { flex: '0 0 64px' },
  nameCell: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS, minWidth: 0 },
  ellipsis: { overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  muted: { color: tokens.colorNeutralForeground3 },
  cards: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  card: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) auto',
    alignItems: 'start',
    columnGap: tokens.spacingHorizontalM,
    rowGap: tokens.spacingVerticalXS,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  cardMain: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXS, minWidth: 0 },
  cardEmail: { color: tokens.colorNeutralForeground2, overflowWrap: 'anywhere' },
  cardFacts: {
    gridColumn: '1 / -1',
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: `${tokens.spacingVerticalXS} ${tokens.spacingHorizontalM}`,
    marginBlockStart: tokens.spacingVerticalXS,
  },
});

type UsersTableProps = {
  users: readonly UserResponse[];
  /** The signed-in person: decides who may be changed (admins, never themselves). */
  actor: { id: string; role: Role };
};

function lastSignIn(user: UserResponse, dateStyle: DateStyle): string {
  return user.lastSignInAt ? formatDateTime(user.lastSignInAt, dateStyle) : 'Never';
}

// Sort by label, not by the stored value: "Crew lead" sorts under C, as people read it.
const compareText = (a: string, b: string) => a.localeCompare(b, undefined, { sensitivity: 'base' });

/**
 * Everyone with an account in the company: a sortable grid on wide screens, one card per person on a
 * phone, where five columns do not fit.
 */
export function UsersTable({ users, actor }: UsersTableProps) {
  const styles = useStyles();
  const dateStyle = useDateStyle();
  const isPhone = useMediaQuery('(max-width: 767.98px)');
  const canManage = (user: UserResponse) => canManageUser(actor.role, actor.id, user.id);
  const showActions = actor.role === 'admin';

  const columns = useMemo<TableColumnDefinition<UserResponse>[]>(() => {
    const base: TableColumnDefinition<UserResponse>[] = [
      createTableColumn<UserResponse>({
        columnId: 'name',
        compare: (a, b) => compareText(a.name, b.name),
        renderHeaderCell: () => 'Name',
        renderCell: (user) => (
          <span className={styles.nameCell}>
            <span className={styles.ellipsis}>{user.name}</span>
            {user.id === actor.id && (
              <Badge appearance="outline" size="small">
                You
              </Badge>
            )}
          </span>
        ),
      }),
      createTableColumn<UserResponse>({
        columnId: 'email',
        compare: (a, b) => compareText(a.email, b.email),
        renderHeaderCell: () => 'E-mail',
        renderCell: (user) => (
          <span className={styles.ellipsis} title={user.email}>
            {user.email}
          </span>
        ),
      }),
      createTableColumn<UserResponse>({
        columnId: 'role',
        compare: (a, b) => compareText(ROLE_LABELS[a.role], ROLE_LABELS[b.role]),
        renderHeaderCell: () => 'Role',
        renderCell: (user) => ROLE_LABELS[user.role],
      }),
      createTableColumn<UserResponse>({
        columnId: 'status',
        compare: (a, b) => Number(a.isDisabled) - Number(b.isDisabled),
        renderHeaderCell: () => 'Status',
        renderCell: (user) => <UserStatusBadge isDisabled={user.isDisabled} />,
      }),
      createTableColumn<UserResponse>({
        columnId: 'lastSignIn',
        // Never signed in sorts as the oldest.
        compare: (a, b) => (a.lastSignInAt ?? '').localeCompare(b.lastSignInAt ?? ''),
        renderHeaderCell: () => 'Last sign-in',
        renderCell: (user) => (
          <span className={user.lastSignInAt ? undefined : styles.muted}>{lastSignIn(user, dateStyle)}</span>
        ),
      }),
    ];
    if (!showActions) return base;
    return [
      ...base,
      createTableColumn<UserResponse>({
        columnId: 'actions',
        renderHeaderCell: () => <span className={styles.ellipsis}>Actions</span>,
        renderCell: (user) => (canManageUser(actor.role, actor.id, user.id) ? <UserActions user={user} /> : null),
      }),
    ];
  }, [actor.id, actor.role, dateStyle, showActions, styles]);

  const columnClasses: Record<string, string> = {
    name: styles.name,
    email: styles.email,
    role: styles.role,
    status: styles.status,
    lastSignIn: styles.lastSignIn,
    actions: styles.actions,
  };
  const columnClass = (columnId: TableColumnId) => columnClasses[String(columnId)];

  if (isPhone) {
    return (
      <ul className={styles.cards} aria-label="People">
        {users.map((user) => (
          <li key={user.id} className={styles.card}>
            <div className={styles.cardMain}>
              <Text weight="semibold" size={400}>
                {user.name}
                {user.id === actor.id && ' (you)'}
              </Text>
              <Text className={styles.cardEmail}>{user.email}</Text>
            </div>
            {canManage(user) ? <UserActions user={user} /> : <span />}
            <div className={styles.cardFacts}>
              <Text weight="semibold">{ROLE_LABELS[user.role]}</Text>
              <UserStatusBadge isDisabled={user.isDisabled} />
              <Text size={200} className={styles.muted}>
                Last sign-in: {lastSignIn(user, dateStyle)}
              </Text>
            </div>
          </li>
        ))}
      </ul>
    );
  }

  return (
    <DataGrid
      items={[...users]}
      columns={columns}
      sortable
      defaultSortState={{ sortColumn: 'name', sortDirection: 'ascending' }}
      getRowId={(user: UserResponse) => user.id}
      resizableColumns={false}
      className={styles.grid}
      aria-label="People"
    >
      <DataGridHeader>
        <DataGridRow>
          {({ renderHeaderCell, columnId }) => (
            <DataGridHeaderCell className={columnClass(columnId)}>{renderHeaderCell()}</DataGridHeaderCell>
          )}
        </DataGridRow>
      </DataGridHeader>
      <DataGridBody<UserResponse>>
        {({ item, rowId }) => (
          <DataGridRow<UserResponse> key={rowId} className={styles.row}>
            {({ renderCell, columnId }) => (
              <DataGridCell className={columnClass(columnId)}>{renderCell(item)}</DataGridCell>
            )}
          </DataGridRow>
        )}
      </DataGridBody>
    </DataGrid>
  );
}
