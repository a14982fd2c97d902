import { describe, expect, it } from 'vitest';

import type { Role } from '../auth/roles.js';
import { JOB_STATUS_LABELS, type JobStatus } from '../jobs/job-rules.js';
import { canWriteSite, type SiteJobFacts, type SiteWriteKind } from './site-rules.js';

const ME = 'user-me';
const OTHER = 'user-other';

/** A job in `status` that I lead ('lead'), am assigned to ('crew'), or have nothing to do with ('none'). */
function job(status: JobStatus, relation: 'lead' | 'crew' | 'none', title = `Job ${status}`): SiteJobFacts {
  return {
    id: `job-${status}-${relation}`,
    title,
    status,
    crewLeadUserId: relation === 'lead' ? ME : OTHER,
    crewUserIds: relation === 'crew' ? [ME] : [],
  };
}

type Outcome = 'allow' | 'role' | 'state';

function outcome(decision: { isAllowed: boolean; kind?: 'role' | 'state' }): Outcome {
  return decision.isAllowed ? 'allow' : decision.kind!;
}

describe('canWriteSite', () => {
  it.each<[Role, SiteJobFacts[], SiteWriteKind, Outcome]>([
    // office and admin: details always; geometry unless a job is under review
    ['office', [], 'details', 'allow'],
    ['admin', [job('submitted', 'none')], 'details', 'allow'],
    ['office', [], 'geometry', 'allow'],
    ['office', [job('in_progress', 'none'), job('issued', 'none')], 'geometry', 'allow'],
    ['admin', [job('submitted', 'none')], 'geometry', 'state'],
    ['office', [job('draft', 'none'), job('ready_to_issue', 'none')], 'geometry', 'state'],
    // crew lead: geometry only on a site where they are on the crew of an open job
    ['lead', [job('draft', 'lead')], 'geometry', 'allow'],
    ['lead', [job('in_progress', 'crew')], 'geometry', 'allow'],
    ['lead', [job('in_progress', 'crew'), job('issued', 'none')], 'geometry', 'allow'],
    ['lead', [], 'geometry', 'role'],
    ['lead', [job('in_progress', 'none')], 'geometry', 'role'],
    ['lead', [job('issued', 'lead')], 'geometry', 'role'],
    ['lead', [job('submitted', 'lead')], 'geometry', 'role'],
    // the probe of issue 18 §2: a lead on no crew of a job that is ready to issue
    ['lead', [job('ready_to_issue', 'none')], 'geometry', 'role'],
    // on an open job's crew, but another job on the site is under review
    ['lead', [job('in_progress', 'lead'), job('ready_to_issue', 'none')], 'geometry', 'state'],
    ['lead', [job('in_progress', 'lead')], 'details', 'role'],
    // technicians and homeowners: never
    ['tech', [job('in_progress', 'crew')], 'geometry', 'role'],
    ['homeowner', [], 'details', 'role'],
  ])('%s with jobs %j writing %s → %s', (role, jobs, kind, expected) => {
    expect(outcome(canWriteSite({ role, userId: ME }, jobs, kind))).toBe(expected);
  });

  it('should name every job that holds the site, with its status', () => {
    const decision = canWriteSite(
      { role: 'office', userId: ME },
      [job('submitted', 'none', 'Back lawn speakers'), job('in_progress', 'none', 'Deck'), job('ready_to_issue', 'none', 'Pool house')],
      'geometry',
    );
    expect(decision).toMatchObject({ isAllowed: false, kind: 'state', code: 'SITE_JOBS_IN_REVIEW' });
    if (decision.isAllowed) throw new Error('refused above');
    expect(decision.message).toContain(`“Back lawn speakers” (${JOB_STATUS_LABELS.submitted.toLowerCase()})`);
    expect(decision.message).toContain(`“Pool house” (${JOB_STATUS_LABELS.ready_to_issue.toLowerCase()})`);
    expect(decision.message).not.toContain('Deck');
    expect(decision.jobs?.map((j) => j.title)).toEqual(['Back lawn speakers', 'Pool house']);
  });
});
