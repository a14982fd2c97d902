import { Badge, type BadgeProps } from '@fluentui/react-components';
import {
  CheckmarkCircle16Regular,
  Circle16Regular,
  DocumentCheckmark16Regular,
  Hourglass16Regular,
  Send16Regular,
} from '@fluentui/react-icons';
import type { JobStatus } from '@domain/jobs/job-rules';
import type { ReactElement } from 'react';

import { JOB_STATUS_TEXT } from '../utils/job-status';

// Each status has its own icon and words, so colour is never the only difference.
const LOOK: Record<JobStatus, { color: BadgeProps['color']; icon: ReactElement }> = {
  draft: { color: 'subtle', icon: <Circle16Regular /> },
  in_progress: { color: 'brand', icon: <Hourglass16Regular /> },
  submitted: { color: 'warning', icon: <Send16Regular /> },
  ready_to_issue: { color: 'success', icon: <CheckmarkCircle16Regular /> },
  issued: { color: 'informative', icon: <DocumentCheckmark16Regular /> },
};

export function JobStatusBadge({ status, size = 'medium' }: { status: JobStatus; size?: BadgeProps['size'] }) {
  const look = LOOK[status];
  return (
    <Badge appearance="tint" color={look.color} icon={look.icon} size={size === 'medium' ? 'large' : size}>
      {JOB_STATUS_TEXT[status]}
    </Badge>
  );
}
