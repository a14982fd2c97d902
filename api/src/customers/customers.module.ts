import { Module } from '@nestjs/common';

import { CustomersController } from './customers.controller.js';
import { CustomersRepository } from './customers.repository.js';
import { CustomersService } from './customers.service.js';

@Module({ controllers: [CustomersController], providers: [CustomersService, CustomersRepository] })
export class CustomersModule {}
