import { Injectable } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { isForeignKeyViolation } from '../common/db-errors.js';
import type { Customer } from '../db/schema/index.js';
import { ConflictError, findOrFail, NotFoundError } from '../domain/errors.js';
import type { CreateCustomerInput, CustomerListQuery, CustomerResponse, UpdateCustomerInput } from '../domain/customers/customer.schema.js';
import { type CursorPage, cursorPageOf } from '../domain/paging/page.schema.js';
import { CustomersRepository } from './customers.repository.js';

function toCustomerResponse(row: Customer): CustomerResponse {
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    phone: row.phone,
    notes: row.notes,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

const notFound = () => new NotFoundError('CUSTOMER_NOT_FOUND', 'No such customer.');

@Injectable()
export class CustomersService {
  constructor(
    private readonly repository: CustomersRepository,
    private readonly audit: AuditService,
  ) {}

  async list(actor: AuthUser, query: CustomerListQuery): Promise<CursorPage<CustomerResponse>> {
    const { rows, total } = await this.repository.list(actor.companyId, query.q, query);
    return cursorPageOf(rows, total, query, (row) => row.name, toCustomerResponse);
  }

  async get(actor: AuthUser, id: string): Promise<CustomerResponse> {
    const row = await findOrFail(this.repository.findInCompany(actor.companyId, id), notFound);
    return toCustomerResponse(row);
  }

  async create(actor: AuthUser, input: CreateCustomerInput): Promise<CustomerResponse> {
    const row = await this.repository.transaction(async (tx) => {
      const created = await this.repository.insert(
        { companyId: actor.companyId, name: input.name, email: input.email ?? null, phone: input.phone ?? null, notes: input.notes ?? null },
        tx,
      );
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'customer.create', targetType: 'customer', targetId: created.id },
        tx,
      );
      return created;
    });
    return toCustomerResponse(row);
  }

  async update(actor: AuthUser, id: string, input: UpdateCustomerInput): Promise<CustomerResponse> {
    const row = await this.repository.transaction(async (tx) => {
      const updated = await findOrFail(this.repository.updateInCompany(actor.companyId, id, input, tx), notFound);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'customer.update',
          targetType: 'customer',
          targetId: id,
          details: { fields: Object.keys(input) },
        },
        tx,
      );
      return updated;
    });
    return toCustomerResponse(row);
  }

  /** Refused (409) while the customer has sites: their history stays attached. */
  async remove(actor: AuthUser, id: string): Promise<void> {
    try {
      await this.repository.transaction(async (tx) => {
        if (!(await this.repository.deleteInCompany(actor.companyId, id, tx))) throw notFound();
        await this.audit.record(
          { companyId: actor.companyId, actorUserId: actor.id, action: 'customer.delete', targetType: 'customer', targetId: id },
          tx,
        );
      });
    } catch (error) {
      if (isForeignKeyViolation(error)) {
        throw new ConflictError('CUSTOMER_HAS_SITES', 'This customer has sites: delete or move them first.');
      }
      throw error;
    }
  }
}
