import { beforeEach, describe, expect, it, vi } from 'vitest';

import type { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Tx } from '../db/db.module.js';
import type { Job } from '../db/schema/index.js';
import { ConflictError, ForbiddenError, NotFoundError, VersionConflictError } from '../domain/errors.js';
import { JobWriter } from './job-writer.js';
import type { JobsRepository } from './jobs.repository.js';

const tx = {} as Tx;

function job(overrides: Partial<Job> = {}): Job {
  return {
    id: 'job-1',
    companyId: 'company-1',
    siteId: 'site-1',
    title: 'Patio',
    crewLeadUserId: 'lead-1',
    startDate: null,
    endDate: null,
    status: 'in_progress',
    revision: 1,
    version: 4,
    notes: null,
    reviewComment: null,
    createdByUserId: null,
    createdAt: new Date(),
    updatedAt: new Date(),
    ...overrides,
  };
}

const user = (role: AuthUser['role'], id = `${role}-1`): AuthUser => ({ id, companyId: 'company-1', role, email: 'x@example.net', name: 'X' });

describe(JobWriter.name, () => {
  let sut: JobWriter;
  let repository: { transaction: ReturnType<typeof vi.fn>; lock: ReturnType<typeof vi.fn>; technicians: ReturnType<typeof vi.fn>; bumpVersion: ReturnType<typeof vi.fn>; loadRecord: ReturnType<typeof vi.fn> };
  let audit: { record: ReturnType<typeof vi.fn> };
  const work = vi.fn();

  beforeEach(() => {
    repository = {
      transaction: vi.fn((fn: (t: Tx) => unknown) => fn(tx)),
      lock: vi.fn().mockResolvedValue(job()),
      technicians: vi.fn().mockResolvedValue([{ id: 'tech-1', name: 'Tech' }]),
      bumpVersion: vi.fn().mockResolvedValue(5),
      loadRecord: vi.fn(),
    };
    audit = { record: vi.fn() };
    work.mockReset().mockResolvedValue({ result: { zone: { id: 'z' } }, audit: { action: 'job.zone.create', targetType: 'zone', targetId: 'z' } });
    sut = new JobWriter(repository as unknown as JobsRepository, audit as unknown as AuditService);
  });

  describe('write', () => {
    it('should do the work, bump the version and audit with the new version', async () => {
      await expect(sut.write(user('lead'), 'job-1', 4, 'record', work)).resolves.toEqual({ zone: { id: 'z' }, jobVersion: 5 });
      expect(repository.lock).toHaveBeenCalledWith('company-1', 'job-1', tx);
      expect(audit.record).toHaveBeenCalledWith(
        expect.objectContaining({ action: 'job.zone.create', details: { jobId: 'job-1', jobVersion: 5 } }),
        tx,
      );
    });

    it('should answer 404 for a job outside the company', async () => {
      repository.lock.mockResolvedValue(undefined);
      await expect(sut.write(user('admin'), 'job-1', 4, 'record', work)).rejects.toBeInstanceOf(NotFoundError);
      expect(work).not.toHaveBeenCalled();
    });

    it('should answer 412 VERSION_CONFLICT (Precondition Failed) with the current version and do nothing', async () => {
      const error = await sut.write(user('office'), 'job-1', 3, 'record', work).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(VersionConflictError);
      expect(error).toMatchObject({ code: 'VERSION_CONFLICT', currentVersion: 4 });
      expect(work).not.toHaveBeenCalled();
      expect(repository.bumpVersion).not.toHaveBeenCalled();
      expect(audit.record).not.toHaveBeenCalled();
    });

    it.each<[AuthUser, 'record' | 'field', 'allow' | 403 | 409, Partial<Job>]>([
      [user('tech'), 'field', 'allow', {}],
      [user('tech'), 'record', 403, {}],
      [user('tech', 'tech-2'), 'field', 403, {}],
      [user('lead', 'lead-2'), 'record', 403, {}],
      [user('lead'), 'record', 409, { status: 'submitted' }],
      [user('office'), 'record', 409, { status: 'issued' }],
    ])('should apply the job rules (%o writing %s → %s)', async (actor, kind, expected, overrides) => {
      repository.lock.mockResolvedValue(job(overrides));
      const outcome = sut.write(actor, 'job-1', 4, kind, work);
      if (expected === 'allow') await expect(outcome).resolves.toMatchObject({ jobVersion: 5 });
      else await expect(outcome).rejects.toBeInstanceOf(expected === 403 ? ForbiddenError : ConflictError);
    });
  });
});
