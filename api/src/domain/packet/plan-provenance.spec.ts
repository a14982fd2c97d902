import { describe, expect, it } from 'vitest';

import type { SiteRecordInfo } from '../jobs/job.schema.js';
import { runProvenanceLines } from './plan-provenance.js';

const record = (over: Partial<SiteRecordInfo>): SiteRecordInfo => ({
  kind: 'run',
  isThisJob: false,
  installedBy: { jobId: 'job-a', jobTitle: 'Garden speakers' },
  installedOn: '2026-05-14',
  changedBy: [],
  abandoned: null,
  ...over,
});

describe(runProvenanceLines.name, () => {
  it('says per run when it went in and by which job, and since when an abandoned run is abandoned', () => {
    const sut = runProvenanceLines(
      {
        'run-1': record({}),
        'run-2': record({ abandoned: { jobId: 'job-b', jobTitle: 'Lawn rework', on: '2027-06-02' } }),
        'run-3': record({ isThisJob: true, installedBy: { jobId: 'job-b', jobTitle: 'Lawn rework' }, installedOn: '2027-06-02' }),
        'item-1': record({ kind: 'item' }),
      },
      { timeZone: 'America/Chicago', locale: 'en-US' },
    );
    // A date-only work date prints as that calendar day in any zone (no shift to the day before).
    expect(sut).toEqual({
      'run-1': ['In since May 14, 2026, Garden speakers'],
      'run-2': ['In since May 14, 2026, Garden speakers', 'Abandoned since Jun 2, 2027, Lawn rework'],
      'run-3': ['In since Jun 2, 2027, Lawn rework'],
    });
  });

  it('has nothing for a revision issued before the site record', () => {
    expect(runProvenanceLines(undefined, {})).toEqual({});
  });
});
