import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { AsBuiltAnalysis } from '@domain/analysis/analyze';
import type { SiteRecordInfo } from '@domain/jobs/job.schema';

import { lightTheme } from '../../../app/theme';
import { setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { buildAsBuilt } from '../../../testing/job-data';
import { mockApi } from '../../../testing/mock-api';
import { createTestQueryClient } from '../../../testing/render-app';

import { FindingsPanel } from './findings-panel';

/*
 * Issue 21: the job's analysis runs over the site's whole system; each finding says whether it is about
 * this job's work or records an earlier job left in the ground (which job, when).
 */

const asBuilt = buildAsBuilt();
const [firstRun] = asBuilt.runs;

function renderPanel(siteRecords: Record<string, SiteRecordInfo> | undefined) {
  setSession(buildSessionResponse(buildSessionUser('lead')));
  // Unit preferences: nothing stored on the server; the panel shows the company default.
  mockApi({});
  const analysis = {
    summary: { critical: 0, warning: 1, info: 0 },
    channels: [],
    findings: [{ code: 'DEPTH_SHALLOW', severity: 'warning', message: 'Too shallow.', path: ['runs', 0, 'depthReadings', 0], runId: firstRun!.id }],
  } as unknown as AsBuiltAnalysis;
  return render(
    <FluentProvider theme={lightTheme}>
      <QueryClientProvider client={createTestQueryClient()}>
        <FindingsPanel analysis={analysis} asBuilt={asBuilt} {...(siteRecords ? { siteRecords } : {})} />
      </QueryClientProvider>
    </FluentProvider>,
  );
}

const info = (isThisJob: boolean): SiteRecordInfo => ({
  kind: 'run',
  isThisJob,
  installedBy: { jobId: 'job-a', jobTitle: 'Garden speakers' },
  installedOn: '2026-05-14',
  changedBy: [],
  abandoned: null,
});

describe('FindingsPanel (issue 21)', () => {
  beforeEach(() => localStorage.clear());

  it('flags a finding about a record already in the ground with the job that installed it', () => {
    renderPanel({ [firstRun!.id]: info(false) });
    const list = screen.getByRole('list', { name: 'Findings' });
    expect(within(list).getByText(`About records already in the ground: “${firstRun!.label}” (installed May 14, 2026 by “Garden speakers”).`)).toBeInTheDocument();
  });

  it('says a finding about this job’s own record is about this job’s work, and nothing without site records', () => {
    const { unmount } = renderPanel({ [firstRun!.id]: info(true) });
    expect(screen.getByText('About this job’s work.')).toBeInTheDocument();
    unmount();
    renderPanel(undefined);
    expect(screen.queryByText(/^About /)).not.toBeInTheDocument();
  });
});
