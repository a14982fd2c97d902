import { Badge } from '@fluentui/react-components';

export function UserStatusBadge({ isDisabled }: { isDisabled: boolean }) {
  return isDisabled ? (
    <Badge appearance="tint" color="danger" size="large">
      Disabled
    </Badge>
  ) : (
    <Badge appearance="tint" color="success" size="large">
      Active
    </Badge>
  );
}
