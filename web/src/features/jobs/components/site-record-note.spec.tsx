import { describe, expect, it } from 'vitest';

import { routeOf } from '../api/job-write-endpoints';

import { existingRemoveRequest, isInSiteRecord, siteRecordText } from './site-record-note';

const earlier = {
  kind: 'run' as const,
  isThisJob: false,
  installedBy: { jobId: 'job-a', jobTitle: 'Garden speakers' },
  installedOn: '2026-05-14',
  changedBy: [],
  abandoned: null,
};

describe('site record note (issue 21)', () => {
  it('says who put an earlier record in and when, and that it is read-only until this job changes it', () => {
    expect(siteRecordText(earlier, 'job-b')).toBe('Already in the ground: installed May 14, 2026 by “Garden speakers”. Read-only until this job changes it.');
  });

  it('says what this job did to it, and since when another job left it abandoned', () => {
    const changed = { ...earlier, changedBy: [{ jobId: 'job-b', jobTitle: 'Fire pit zone', change: 'abandoned' as const, on: '2027-04-02', isIssued: false }] };
    expect(siteRecordText(changed, 'job-b')).toBe('Already in the ground: installed May 14, 2026 by “Garden speakers”. This job abandons it in place.');
    const abandonedEarlier = { ...earlier, abandoned: { jobId: 'job-x', jobTitle: 'Lawn rework', on: '2026-09-01' } };
    expect(siteRecordText(abandonedEarlier, 'job-b')).toContain('Abandoned in place since Sep 1, 2026 (“Lawn rework”).');
  });

  it('takes an earlier record out instead of deleting it, with Undo as the undo of this job’s change', () => {
    const request = existingRemoveRequest('run', { id: 'run-1', label: 'Spare to planter' });
    expect(request.write).toMatchObject({ endpoint: 'deleteRun', params: { runId: 'run-1' } });
    expect(routeOf(request.write)).toEqual({ method: 'DELETE', path: '/runs/run-1' });
    expect(routeOf(request.undo!)).toEqual({ method: 'DELETE', path: '/site-changes/run-1' });
    expect(request.title).toBe('Take out the run “Spare to planter”?');
  });

  it('says this job’s own record was issued in an earlier revision, and what this revision does to it', () => {
    const own = {
      ...earlier,
      isThisJob: true,
      isIssued: true,
      installedBy: { jobId: 'job-b', jobTitle: 'Fire pit zone' },
      changedBy: [{ jobId: 'job-b', jobTitle: 'Fire pit zone', change: 'changed' as const, on: '2027-04-02', isIssued: false }],
    };
    expect(siteRecordText(own, 'job-b')).toBe('Already in the ground: installed May 14, 2026 and issued in an earlier revision of this job. This job changes it.');
  });

  it('tells a change an earlier revision of this job issued from the one this revision makes (issue 21, reopen)', () => {
    const rev1 = { jobId: 'job-b', jobTitle: 'Fire pit zone', change: 'changed' as const, on: '2027-04-02', isIssued: true };
    const issuedOnly = { ...earlier, changedBy: [rev1] };
    expect(siteRecordText(issuedOnly, 'job-b')).toBe(
      'Already in the ground: installed May 14, 2026 by “Garden speakers”. Changed Apr 2, 2027 by an earlier revision of this job. Read-only until this job changes it.',
    );
    const again = { ...earlier, changedBy: [rev1, { ...rev1, change: 'abandoned' as const, on: '2027-05-20', isIssued: false }] };
    expect(siteRecordText(again, 'job-b')).toBe(
      'Already in the ground: installed May 14, 2026 by “Garden speakers”. Changed Apr 2, 2027 by an earlier revision of this job. This job abandons it in place.',
    );
  });

  it('lists the issued changes of every job with their dates, and an abandonment by an earlier revision of this job', () => {
    const history = {
      ...earlier,
      abandoned: { jobId: 'job-c', jobTitle: 'Pond rework', on: '2027-03-03' },
      changedBy: [
        { jobId: 'job-b', jobTitle: 'Fire pit zone', change: 'changed' as const, on: '2027-04-02', isIssued: true },
        { jobId: 'job-c', jobTitle: 'Pond rework', change: 'abandoned' as const, on: '2027-03-03', isIssued: true },
        { jobId: 'job-c', jobTitle: 'Pond rework', change: 'changed' as const, on: '2027-08-10', isIssued: true },
      ],
    };
    // Seen from another job: who changed it and when; the abandonment once, in its own sentence.
    expect(siteRecordText(history, 'job-d')).toBe(
      'Already in the ground: installed May 14, 2026 by “Garden speakers”. Abandoned in place since Mar 3, 2027 (“Pond rework”). Changed Apr 2, 2027 by “Fire pit zone”; Aug 10, 2027 by “Pond rework”. Read-only until this job changes it.',
    );
    // Seen from the reopened job that abandoned it in revision 1 and changes it now.
    const reopened = { ...history, changedBy: [...history.changedBy, { jobId: 'job-c', jobTitle: 'Pond rework', change: 'changed' as const, on: '2027-09-01', isIssued: false }] };
    expect(siteRecordText(reopened, 'job-c')).toBe(
      'Already in the ground: installed May 14, 2026 by “Garden speakers”. Abandoned in place since Mar 3, 2027 by an earlier revision of this job. Changed Apr 2, 2027 by “Fire pit zone”; Aug 10, 2027 by an earlier revision of this job. This job changes it.',
    );
  });

  it('takes out this job’s own record once an earlier revision issued it; one never issued is deleted', () => {
    const own = { ...earlier, isThisJob: true, installedBy: { jobId: 'job-b', jobTitle: 'Fire pit zone' } };
    expect(isInSiteRecord({ ...own, isIssued: true })).toBe(true);
    expect(isInSiteRecord({ ...own, isIssued: false })).toBe(false);
    expect(isInSiteRecord(own)).toBe(false);
    expect(isInSiteRecord(earlier)).toBe(true);
    expect(isInSiteRecord(undefined)).toBe(false);
    const request = existingRemoveRequest('item', { id: 'item-1', label: 'Gate speaker' }, true);
    expect(request.consequences).toMatch(/^This job installed it in a revision already issued\. It is recorded as taken out by this job/);
    expect(routeOf(request.undo!)).toEqual({ method: 'DELETE', path: '/site-changes/item-1' });
  });
});
