import { describe, expect, it } from 'vitest';

import type { Role } from '../auth/roles.js';
import { canTransition, canWriteJob, type JobAccessFacts, type JobStatus, type JobWriteKind } from './job-rules.js';

const ME = 'user-me';
const OTHER = 'user-other';

/** A job in `status` that I lead ('lead'), am assigned to ('crew'), or have nothing to do with ('none'). */
function job(status: JobStatus, relation: 'lead' | 'crew' | 'none'): JobAccessFacts {
  return {
    status,
    crewLeadUserId: relation === 'lead' ? ME : OTHER,
    crewUserIds: relation === 'crew' ? [ME] : [],
  };
}

type Outcome = 'allow' | 'role' | 'state';

function outcome(decision: { isAllowed: boolean; kind?: 'role' | 'state' }): Outcome {
  return decision.isAllowed ? 'allow' : decision.kind!;
}

describe('canWriteJob', () => {
  it.each<[Role, JobStatus, 'lead' | 'crew' | 'none', JobWriteKind, Outcome]>([
    // office and admin: any job, until issued
    ['admin', 'draft', 'none', 'details', 'allow'],
    ['office', 'in_progress', 'none', 'record', 'allow'],
    ['office', 'submitted', 'none', 'record', 'allow'],
    ['office', 'ready_to_issue', 'none', 'field', 'allow'],
    ['admin', 'issued', 'none', 'record', 'state'],
    ['office', 'issued', 'none', 'details', 'state'],
    // delete: office/admin, draft only
    ['office', 'draft', 'none', 'delete', 'allow'],
    ['admin', 'in_progress', 'none', 'delete', 'state'],
    ['lead', 'draft', 'lead', 'delete', 'role'],
    ['tech', 'draft', 'crew', 'delete', 'role'],
    // crew lead: record and field data on jobs they lead or are assigned to, until submitted
    ['lead', 'draft', 'lead', 'record', 'allow'],
    ['lead', 'in_progress', 'lead', 'record', 'allow'],
    ['lead', 'in_progress', 'crew', 'field', 'allow'],
    ['lead', 'in_progress', 'none', 'record', 'role'],
    ['lead', 'in_progress', 'none', 'field', 'role'],
    ['lead', 'submitted', 'lead', 'record', 'state'],
    ['lead', 'ready_to_issue', 'lead', 'field', 'state'],
    ['lead', 'issued', 'lead', 'record', 'state'],
    ['lead', 'in_progress', 'lead', 'details', 'role'],
    // technician: field data on assigned jobs only
    ['tech', 'in_progress', 'crew', 'field', 'allow'],
    ['tech', 'draft', 'crew', 'field', 'allow'],
    ['tech', 'in_progress', 'crew', 'record', 'role'],
    ['tech', 'in_progress', 'none', 'field', 'role'],
    ['tech', 'submitted', 'crew', 'field', 'state'],
    ['tech', 'in_progress', 'crew', 'details', 'role'],
    // homeowner: never
    ['homeowner', 'in_progress', 'crew', 'field', 'role'],
    // sign-off at the walkthrough: office any job, the crew lead on their crew even once submitted,
    // technicians and homeowners never, nobody once issued
    ['office', 'ready_to_issue', 'none', 'signoff', 'allow'],
    ['lead', 'submitted', 'lead', 'signoff', 'allow'],
    ['lead', 'ready_to_issue', 'crew', 'signoff', 'allow'],
    ['lead', 'ready_to_issue', 'none', 'signoff', 'role'],
    ['tech', 'ready_to_issue', 'crew', 'signoff', 'role'],
    ['homeowner', 'ready_to_issue', 'crew', 'signoff', 'role'],
    ['lead', 'issued', 'lead', 'signoff', 'state'],
    ['admin', 'issued', 'none', 'signoff', 'state'],
  ])('%s on a %s job (%s) writing %s → %s', (role, status, relation, kind, expected) => {
    expect(outcome(canWriteJob({ role, userId: ME }, job(status, relation), kind))).toBe(expected);
  });
});

describe('canTransition', () => {
  it.each<[Role, JobStatus, 'lead' | 'crew' | 'none', JobStatus, string | undefined, Outcome | 'revision']>([
    ['lead', 'draft', 'lead', 'in_progress', undefined, 'allow'],
    ['lead', 'in_progress', 'lead', 'submitted', undefined, 'allow'],
    ['lead', 'in_progress', 'crew', 'submitted', undefined, 'allow'],
    ['lead', 'in_progress', 'none', 'submitted', undefined, 'role'],
    ['lead', 'submitted', 'lead', 'in_progress', 'fix it', 'role'],
    ['lead', 'submitted', 'lead', 'ready_to_issue', undefined, 'role'],
    ['lead', 'issued', 'lead', 'in_progress', undefined, 'role'],
    ['lead', 'draft', 'lead', 'submitted', undefined, 'state'],
    ['office', 'draft', 'none', 'in_progress', undefined, 'allow'],
    ['office', 'submitted', 'none', 'in_progress', 'Depth at P2 needs a photo', 'allow'],
    ['office', 'submitted', 'none', 'in_progress', undefined, 'state'],
    ['office', 'submitted', 'none', 'in_progress', '   ', 'state'],
    ['admin', 'submitted', 'none', 'ready_to_issue', undefined, 'allow'],
    ['admin', 'ready_to_issue', 'none', 'in_progress', 'one more check', 'allow'],
    ['admin', 'issued', 'none', 'in_progress', undefined, 'revision'],
    ['office', 'issued', 'none', 'in_progress', undefined, 'revision'],
    ['office', 'in_progress', 'none', 'ready_to_issue', undefined, 'state'],
    ['admin', 'ready_to_issue', 'none', 'issued', undefined, 'state'],
    ['admin', 'draft', 'none', 'draft', undefined, 'state'],
    ['tech', 'in_progress', 'crew', 'submitted', undefined, 'role'],
    ['homeowner', 'submitted', 'none', 'ready_to_issue', undefined, 'role'],
  ])('%s moving a %s job (%s) to %s with comment %j → %s', (role, from, relation, to, comment, expected) => {
    const decision = canTransition({ role, userId: ME }, job(from, relation), to, comment);
    if (expected === 'revision') {
      expect(decision).toEqual({ isAllowed: true, isNewRevision: true });
    } else {
      expect(outcome(decision)).toBe(expected);
      if (decision.isAllowed) expect(decision.isNewRevision).toBe(false);
    }
  });

  it('should name the missing comment with a stable code', () => {
    const decision = canTransition({ role: 'office', userId: ME }, job('submitted', 'none'), 'in_progress', '');
    expect(decision).toMatchObject({ isAllowed: false, code: 'COMMENT_REQUIRED' });
  });
});
