import { Inject, Injectable } from '@nestjs/common';
import { and, count, desc, eq } from 'drizzle-orm';

import { DB, type Db } from '../db/db.module.js';
import { capturedMail, capturedMailAttachments } from '../db/schema/index.js';

export interface CapturedMessage {
  companyId: string | null;
  messageId: string | null;
  fromAddress: string;
  toAddresses: string[];
  subject: string;
  text: string | null;
  html: string | null;
  headers: Record<string, string>;
  sizeBytes: number;
  attachments: { filename: string; contentType: string; content: Buffer }[];
}

@Injectable()
export class MailCaptureRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  async insert(message: CapturedMessage): Promise<string> {
    return this.db.transaction(async (tx) => {
      const { attachments, ...mail } = message;
      const [row] = await tx.insert(capturedMail).values(mail).returning({ id: capturedMail.id });
      // Guard against an empty multi-row insert, which drizzle rejects.
      if (attachments.length > 0) {
        await tx.insert(capturedMailAttachments).values(
          attachments.map((a) => ({ mailId: row!.id, ...a, sizeBytes: a.content.length })),
        );
      }
      return row!.id;
    });
  }

  /** Newest first, one company's messages only. */
  async listByCompany(companyId: string, limit: number, offset: number) {
    const where = eq(capturedMail.companyId, companyId);
    const [rows, [total]] = await Promise.all([
      this.db
        .select({
          id: capturedMail.id,
          fromAddress: capturedMail.fromAddress,
          toAddresses: capturedMail.toAddresses,
          subject: capturedMail.subject,
          receivedAt: capturedMail.receivedAt,
          sizeBytes: capturedMail.sizeBytes,
        })
        .from(capturedMail)
        .where(where)
        .orderBy(desc(capturedMail.receivedAt))
        .limit(limit)
        .offset(offset),
      this.db.select({ n: count() }).from(capturedMail).where(where),
    ]);
    return { rows, total: total?.n ?? 0 };
  }

  async findInCompany(companyId: string, id: string) {
    const [mail] = await this.db
      .select()
      .from(capturedMail)
      .where(and(eq(capturedMail.companyId, companyId), eq(capturedMail.id, id)));
    if (!mail) return undefined;
    const attachments = await this.db
      .select({
        id: capturedMailAttachments.id,
        filename: capturedMailAttachments.filename,
        contentType: capturedMailAttachments.contentType,
        sizeBytes: capturedMailAttachments.sizeBytes,
      })
      .from(capturedMailAttachments)
      .where(eq(capturedMailAttachments.mailId, id));
    return { ...mail, attachments };
  }

  async findAttachmentInCompany(companyId: string, mailId: string, attachmentId: string) {
    const [row] = await this.db
      .select({ attachment: capturedMailAttachments })
      .from(capturedMailAttachments)
      .innerJoin(capturedMail, eq(capturedMail.id, capturedMailAttachments.mailId))
      .where(
        and(
          eq(capturedMail.companyId, companyId),
          eq(capturedMail.id, mailId),
          eq(capturedMailAttachments.id, attachmentId),
        ),
      );
    return row?.attachment;
  }
}
