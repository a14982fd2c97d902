import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';

import { ApiContract } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type UpdateUserInput,
  UpdateUserSchema,
  type UserListQuery,
  UserListQuerySchema,
  type UserListResponse,
  UserListResponseSchema,
  type UserResponse,
  UserResponseSchema,
} from '../domain/auth/auth.schema.js';
import { UsersService } from './users.service.js';

@ApiTags('users')
@ApiBearerAuth()
@Controller('users')
export class UsersController {
  constructor(private readonly usersService: UsersService) {}

  @Get()
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'The company’s people by name, a page at a time', description: '`page` from 1 or `cursor` (the `nextCursor` of the page before, steady while people are added), `pageSize` up to 100 (default 25).' })
  @ApiContract({ query: UserListQuerySchema, responses: { 200: UserListResponseSchema } })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(UserListQuerySchema)) query: UserListQuery): Promise<UserListResponse> {
    return this.usersService.list(user, query);
  }

  @Patch(':id')
  @Roles('admin')
  @ApiContract({ body: UpdateUserSchema, responses: { 200: UserResponseSchema } })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body(new ZodValidationPipe(UpdateUserSchema)) body: UpdateUserInput,
  ): Promise<UserResponse> {
    return this.usersService.update(user, id, body);
  }
}
