import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';

import { ApiContract, emptyResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CreateCustomerInput,
  CreateCustomerSchema,
  type CustomerListQuery,
  CustomerListQuerySchema,
  CustomerPageSchema,
  type CustomerResponse,
  CustomerResponseSchema,
  type UpdateCustomerInput,
  UpdateCustomerSchema,
} from '../domain/customers/customer.schema.js';
import type { CursorPage } from '../domain/paging/page.schema.js';
import { CustomersService } from './customers.service.js';

/** Staff read customers (crews see whom they work for); the office creates and changes them. */
@ApiTags('customers')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('customers')
export class CustomersController {
  constructor(private readonly customersService: CustomersService) {}

  @Get()
  @ApiOperation({ summary: 'The company’s customers by name, a page at a time', description: '`q` searches name and e-mail; `page` from 1 or `cursor` (the `nextCursor` of the page before, steady while customers are added or removed), `pageSize` up to 100 (default 25).' })
  @ApiContract({ query: CustomerListQuerySchema, responses: { 200: CustomerPageSchema } })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(CustomerListQuerySchema)) query: CustomerListQuery): Promise<CursorPage<CustomerResponse>> {
    return this.customersService.list(user, query);
  }

  @Post()
  @Roles('admin', 'office')
  @ApiContract({ body: CreateCustomerSchema, responses: { 201: CustomerResponseSchema } })
  create(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(CreateCustomerSchema)) body: CreateCustomerInput): Promise<CustomerResponse> {
    return this.customersService.create(user, body);
  }

  @Get(':id')
  @ApiContract({ responses: { 200: CustomerResponseSchema } })
  get(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<CustomerResponse> {
    return this.customersService.get(user, id);
  }

  @Patch(':id')
  @Roles('admin', 'office')
  @ApiContract({ body: UpdateCustomerSchema, responses: { 200: CustomerResponseSchema } })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body(new ZodValidationPipe(UpdateCustomerSchema)) body: UpdateCustomerInput,
  ): Promise<CustomerResponse> {
    return this.customersService.update(user, id, body);
  }

  @Delete(':id')
  @Roles('admin', 'office')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiContract({ responses: { 204: emptyResponse } })
  async remove(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    await this.customersService.remove(user, id);
  }
}
