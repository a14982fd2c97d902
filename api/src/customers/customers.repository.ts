import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, eq, ilike, or } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { type Customer, customers, type NewCustomer } from '../db/schema/index.js';
import { afterCursor } from '../db/keyset.js';
import { type CursorPageQuery, cursorLimit, cursorPageOffset } from '../domain/paging/page.schema.js';

function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** Every method takes the company id from the signed-in user: nothing here crosses companies. */
@Injectable()
export class CustomersRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /**
   * One page of the company's customers matching `q` by name (with one row more than the page, to tell
   * whether another follows), and how many match in all.
   */
  async list(companyId: string, q: string | undefined, page: CursorPageQuery): Promise<{ rows: Customer[]; total: number }> {
    const search = q ? or(ilike(customers.name, likePattern(q)), ilike(customers.email, likePattern(q))) : undefined;
    const where = and(eq(customers.companyId, companyId), search);
    const [rows, [counted]] = await Promise.all([
      this.db
        .select()
        .from(customers)
        .where(and(where, afterCursor(customers.name, customers.id, page.cursor)))
        .orderBy(asc(customers.name), asc(customers.id))
        .limit(cursorLimit(page))
        .offset(cursorPageOffset(page)),
      this.db.select({ n: count() }).from(customers).where(where),
    ]);
    return { rows, total: counted?.n ?? 0 };
  }

  async findInCompany(companyId: string, id: string): Promise<Customer | undefined> {
    const [row] = await this.db.select().from(customers).where(and(eq(customers.companyId, companyId), eq(customers.id, id)));
    return row;
  }

  async insert(customer: NewCustomer, tx: Tx): Promise<Customer> {
    const [row] = await tx.insert(customers).values(customer).returning();
    return row!;
  }

  async updateInCompany(companyId: string, id: string, patch: Partial<NewCustomer>, tx: Tx): Promise<Customer | undefined> {
    const [row] = await tx
      .update(customers)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(customers.companyId, companyId), eq(customers.id, id)))
      .returning();
    return row;
  }

  async deleteInCompany(companyId: string, id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .delete(customers)
      .where(and(eq(customers.companyId, companyId), eq(customers.id, id)))
      .returning({ id: customers.id });
    return rows.length > 0;
  }
}
