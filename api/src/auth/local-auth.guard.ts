import { type ExecutionContext, Injectable } from '@nestjs/common';
import { AuthGuard } from '@nestjs/passport';
import type { Request } from 'express';

import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { SignInSchema } from '../domain/auth/auth.schema.js';

const validate = new ZodValidationPipe(SignInSchema);

/**
 * Runs the local strategy, after checking the body's shape so that a missing or malformed field is a
 * 400 that names it rather than a bare 401.
 */
@Injectable()
export class LocalAuthGuard extends AuthGuard('local') {
  override canActivate(context: ExecutionContext) {
    const req = context.switchToHttp().getRequest<Request>();
    req.body = validate.transform(req.body);
    return super.canActivate(context);
  }
}
