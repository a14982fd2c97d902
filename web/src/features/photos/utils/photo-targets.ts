import type { JobAsBuiltResponse } from '@domain/jobs/job.schema';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import { formatLength, type LengthSystem } from '../../../lib/units';
import { ITEM_KIND_LABELS } from '../../job-record';

/** One thing of a job a photo can show, with words for pickers and gallery headings. */
export type TargetOption = { key: string; target: PhotoTarget; label: string; group: 'Job' | 'Runs' | 'Equipment and wall entries' | 'Depth readings' };

/** A stable string for a target: `job`, `run:<id>`, … */
export function targetKey(target: PhotoTarget): string {
  return target.type === 'job' ? 'job' : `${target.type}:${target.id}`;
}

/** Everything on the job a photo may be attached to, in the order the crew works: job, runs, readings, items. */
export function photoTargetOptions(data: JobAsBuiltResponse, lengthSystem: LengthSystem): TargetOption[] {
  const { asBuilt, records } = data;
  const options: TargetOption[] = [{ key: 'job', target: { type: 'job' }, label: 'The job as a whole', group: 'Job' }];
  for (const run of asBuilt.runs) {
    options.push({ key: `run:${run.id}`, target: { type: 'run', id: run.id }, label: `Run ${run.label}`, group: 'Runs' });
  }
  for (const run of asBuilt.runs) {
    const ids = records.depthReadingIds[run.id] ?? [];
    (run.depthReadings ?? []).forEach((reading, index) => {
      const id = ids[index];
      if (!id) return;
      options.push({
        key: `depth_reading:${id}`,
        target: { type: 'depth_reading', id },
        label: `Depth ${formatLength(reading.depthM, lengthSystem, 'short')} at ${formatLength(reading.stationM, lengthSystem, 'long')} on ${run.label}`,
        group: 'Depth readings',
      });
    });
  }
  for (const item of asBuilt.items) {
    options.push({
      key: `item:${item.id}`,
      target: { type: 'item', id: item.id },
      label: `${item.label} (${ITEM_KIND_LABELS[item.kind].toLowerCase()})`,
      group: 'Equipment and wall entries',
    });
  }
  return options;
}

/** The words for `target`, or "Something no longer on the job" when its record was removed. */
export function targetLabel(target: PhotoTarget, options: readonly TargetOption[]): string {
  return options.find((option) => option.key === targetKey(target))?.label ?? 'Something no longer on the job';
}
