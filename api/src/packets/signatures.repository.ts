import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { jobSignatures, type JobSignatureRow, packetSignatures } from '../db/schema/index.js';
import type { SignatureRole } from '../domain/packet/signature.schema.js';

/** The walkthrough signatures of a job's next revision, and their hand-over to the issued revision. */
@Injectable()
export class SignaturesRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  async listByJob(jobId: string, tx?: Tx): Promise<JobSignatureRow[]> {
    return (tx ?? this.db).select().from(jobSignatures).where(eq(jobSignatures.jobId, jobId)).orderBy(asc(jobSignatures.role));
  }

  async upsert(
    row: { jobId: string; role: SignatureRole; signerName: string; signedAt: Date; svgPath: string; capturedByUserId: string },
    tx: Tx,
  ): Promise<JobSignatureRow> {
    const [saved] = await tx
      .insert(jobSignatures)
      .values(row)
      .onConflictDoUpdate({
        target: [jobSignatures.jobId, jobSignatures.role],
        set: {
          signerName: row.signerName,
          signedAt: row.signedAt,
          svgPath: row.svgPath,
          capturedByUserId: row.capturedByUserId,
          updatedAt: sql`now()`,
        },
      })
      .returning();
    return saved!;
  }

  async remove(jobId: string, role: SignatureRole, tx: Tx): Promise<boolean> {
    const removed = await tx
      .delete(jobSignatures)
      .where(and(eq(jobSignatures.jobId, jobId), eq(jobSignatures.role, role)))
      .returning({ id: jobSignatures.id });
    return removed.length > 0;
  }

  /**
   * At issue: copies the job's signatures into the new revision (where they never change) and clears
   * them from the job, so a reopened job is signed again for its next revision. Returns how many.
   */
  async moveToRevision(jobId: string, revisionId: string, tx: Tx): Promise<number> {
    const rows = await this.listByJob(jobId, tx);
    if (rows.length === 0) return 0;
    await tx.insert(packetSignatures).values(
      rows.map((r) => ({ revisionId, role: r.role, signerName: r.signerName, signedAt: r.signedAt, svgPath: r.svgPath })),
    );
    await tx.delete(jobSignatures).where(eq(jobSignatures.jobId, jobId));
    return rows.length;
  }
}
