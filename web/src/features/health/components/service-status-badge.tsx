import { Badge } from '@fluentui/react-components';
import {
  CheckmarkCircle16Filled,
  DismissCircle16Filled,
  QuestionCircle16Regular,
} from '@fluentui/react-icons';

import type { ServiceState } from '../utils/summarize-health';

const badgeByState = {
  up: { color: 'success', label: 'Up', icon: <CheckmarkCircle16Filled /> },
  down: { color: 'danger', label: 'Down', icon: <DismissCircle16Filled /> },
  checking: { color: 'informative', label: 'Checking…', icon: undefined },
  unknown: { color: 'subtle', label: 'Unknown', icon: <QuestionCircle16Regular /> },
} as const;

/** Up/down in words and colour, so it reads in sun glare and without colour vision. */
export function ServiceStatusBadge({ state }: { state: ServiceState }) {
  const { color, label, icon } = badgeByState[state];
  return (
    <Badge appearance="tint" color={color} size="large" shape="rounded" icon={icon}>
      {label}
    </Badge>
  );
}
