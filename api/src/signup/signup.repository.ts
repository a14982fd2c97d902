import { Inject, Injectable } from '@nestjs/common';
import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import {
  capturedMail,
  companies,
  companyInviteCodes,
  companySettings,
  type CompanySignup,
  companySignups,
  type NewCompanySignup,
  outgoingMail,
  type User,
  users,
} from '../db/schema/index.js';

@Injectable()
export class SignupRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  async hasCompanies(): Promise<boolean> {
    const [row] = await this.db.select({ id: companies.id }).from(companies).limit(1);
    return row !== undefined;
  }

  /** The account holding this (lower-cased) address, in whichever company, with its company's name. */
  async findAccount(email: string): Promise<{ id: string; name: string; companyId: string; companyName: string } | undefined> {
    const [row] = await this.db
      .select({ id: users.id, name: users.name, companyId: users.companyId, companyName: companies.name })
      .from(users)
      .innerJoin(companies, eq(companies.id, users.companyId))
      .where(eq(users.email, email));
    return row;
  }

  /** An unused, unexpired company invitation code by its hash. */
  async findUsableInviteCode(codeHash: string): Promise<{ id: string } | undefined> {
    const [row] = await this.db
      .select({ id: companyInviteCodes.id })
      .from(companyInviteCodes)
      .where(and(eq(companyInviteCodes.codeHash, codeHash), isNull(companyInviteCodes.usedAt), gt(companyInviteCodes.expiresAt, sql`now()`)));
    return row;
  }

  /** Marks the address's open sign-ups superseded (a newer one replaces them), so at most one stays open. */
  async supersedeOpen(email: string, tx: Tx): Promise<void> {
    await tx
      .update(companySignups)
      .set({ supersededAt: sql`now()` })
      .where(and(eq(companySignups.email, email), isNull(companySignups.completedAt), isNull(companySignups.supersededAt)));
  }

  async insertSignup(row: NewCompanySignup, tx: Tx): Promise<CompanySignup> {
    const [inserted] = await tx.insert(companySignups).values(row).returning();
    return inserted!;
  }

  /** The sign-up a verification link belongs to, locked for the caller's transaction (whatever its state). */
  async lockByTokenHash(tokenHash: string, tx: Tx): Promise<CompanySignup | undefined> {
    const [row] = await tx.select().from(companySignups).where(eq(companySignups.tokenHash, tokenHash)).for('update');
    return row;
  }

  /** Uses up an invitation code; false when another sign-up used it first (or it expired meanwhile). */
  async claimInviteCode(id: string, companyId: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .update(companyInviteCodes)
      .set({ usedAt: sql`now()`, usedByCompanyId: companyId })
      .where(and(eq(companyInviteCodes.id, id), isNull(companyInviteCodes.usedAt), gt(companyInviteCodes.expiresAt, sql`now()`)))
      .returning({ id: companyInviteCodes.id });
    return rows.length === 1;
  }

  async emailTaken(email: string, tx: Tx): Promise<boolean> {
    const [row] = await tx.select({ id: users.id }).from(users).where(eq(users.email, email));
    return row !== undefined;
  }

  /** The company with its default settings (units, paper: the column defaults) and its first admin. */
  async createCompanyWithAdmin(
    signup: CompanySignup,
    tx: Tx,
  ): Promise<{ companyId: string; admin: User }> {
    const [company] = await tx.insert(companies).values({ name: signup.companyName }).returning({ id: companies.id });
    await tx.insert(companySettings).values({ companyId: company!.id });
    const [admin] = await tx
      .insert(users)
      .values({ companyId: company!.id, email: signup.email, name: signup.adminName, role: 'admin', passwordHash: signup.passwordHash })
      .returning();
    await tx
      .update(companySignups)
      .set({ completedAt: sql`now()`, companyId: company!.id })
      .where(eq(companySignups.id, signup.id));
    return { companyId: company!.id, admin: admin! };
  }

  /** The newest message queued for a sign-up request's receipt, with what the local server captured of it. */
  async mailForReceipt(receiptHash: string) {
    const [mail] = await this.db
      .select({ status: outgoingMail.status, messageId: outgoingMail.messageId })
      .from(outgoingMail)
      .where(eq(outgoingMail.receiptHash, receiptHash))
      .orderBy(desc(outgoingMail.createdAt))
      .limit(1);
    if (!mail) return undefined;
    if (!mail.messageId) return { status: mail.status, captured: undefined };
    const [captured] = await this.db
      .select({
        toAddresses: capturedMail.toAddresses,
        subject: capturedMail.subject,
        receivedAt: capturedMail.receivedAt,
        text: capturedMail.text,
        html: capturedMail.html,
      })
      .from(capturedMail)
      .where(eq(capturedMail.messageId, mail.messageId))
      .orderBy(desc(capturedMail.receivedAt))
      .limit(1);
    return { status: mail.status, captured };
  }
}
