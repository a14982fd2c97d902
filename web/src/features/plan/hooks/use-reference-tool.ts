import { useState } from 'react';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import type { useJobWriter } from '../../jobs';
import type { SiteResponse } from '../../sites';
import type { ReferencePointDialog } from '../components/reference-point-dialog';
import { roundPlanPoint } from '../utils/plan-geometry';

type JobWriter = ReturnType<typeof useJobWriter>;
type DialogProps = Parameters<typeof ReferencePointDialog>[0];

/**
 * The plan editor's reference tool: a tap on the plan asks for the point's label, then adds it to the
 * site through the job's writer (issue 17): with no signal it waits on the device with the job's other
 * writes, shows on the plan at once under an id of this device, and a tie made to it offline is sent
 * after it with the id the server gives it.
 */
export function useReferenceTool({ site, writer }: { site: SiteResponse; writer: JobWriter }) {
  const notify = useNotify();
  const [pending, setPending] = useState<{ key: number; point: PlanPoint } | undefined>();

  const onSave: DialogProps['onSave'] = async (input, { close, showFieldErrors, showMessage }) => {
    try {
      const outcome = await writer.save({
        endpoint: 'createReferencePoint',
        params: { siteId: site.id },
        body: input,
        label: `Reference point "${input.label}"`,
      });
      if (outcome === 'saved') notify.success('Reference point added', input.label);
      else if (outcome === 'queued') notify.success('Kept on this device', `"${input.label}" is added to the site as soon as the phone is back online.`);
      // A conflict has the job's dialog asking; either way this one is done.
      setPending(undefined);
      close();
    } catch (error) {
      if (!showFieldErrors(error)) showMessage(describeRequestError(error));
    }
  };

  return {
    tap: (point: PlanPoint) => setPending({ key: Date.now(), point: roundPlanPoint(point) }),
    /** A new dialog (fresh input) for every tap. */
    dialogKey: pending?.key ?? 0,
    dialog: {
      point: pending?.point,
      onSave,
      onCancel: () => setPending(undefined),
    } satisfies DialogProps,
  };
}
