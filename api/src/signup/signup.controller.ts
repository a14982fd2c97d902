import { Body, Controller, Get, HttpCode, HttpStatus, Param, Post, Req, Res, UseGuards } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { SkipThrottle } from '@nestjs/throttler';
import type { Request, Response } from 'express';

import { setRefreshCookie } from '../auth/refresh-cookie.js';
import { SignInThrottlerGuard } from '../auth/sign-in-throttler.guard.js';
import { ApiContract } from '../common/api-contract.decorator.js';
import { Public } from '../common/decorators/public.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import type { SessionResponse } from '../domain/auth/auth.schema.js';
import { SessionResponseSchema } from '../domain/auth/auth.schema.js';
import {
  type CreateSignupInput,
  CreateSignupSchema,
  type SignupAcceptedResponse,
  SignupAcceptedResponseSchema,
  type SignupMailResponse,
  SignupMailResponseSchema,
  type SignupStatusResponse,
  SignupStatusResponseSchema,
  type VerifySignupInput,
  VerifySignupSchema,
} from '../domain/signup/signup.schema.js';
import { SignupService } from './signup.service.js';

@ApiTags('signup')
@Controller('signup')
export class SignupController {
  constructor(private readonly signupService: SignupService) {}

  @Public()
  @Get('status')
  @ApiOperation({ summary: 'Whether companies may sign up here (mode), whether any company exists yet, and whether mail is captured locally' })
  @ApiContract({ responses: { 200: SignupStatusResponseSchema } })
  status(@Res({ passthrough: true }) res: Response): Promise<SignupStatusResponse> {
    res.setHeader('Cache-Control', 'no-store');
    return this.signupService.status();
  }

  @Public()
  @Post()
  @HttpCode(HttpStatus.ACCEPTED)
  @UseGuards(SignInThrottlerGuard)
  @ApiOperation({
    summary: 'Ask to create a company: e-mails a verification link (the answer is the same whether or not the address has an account)',
  })
  @ApiContract({ body: CreateSignupSchema, responses: { 202: SignupAcceptedResponseSchema } })
  request(@Body(new ZodValidationPipe(CreateSignupSchema)) body: CreateSignupInput): Promise<SignupAcceptedResponse> {
    return this.signupService.request(body);
  }

  @Public()
  @Get('mail/:receipt')
  @ApiOperation({ summary: 'With mail captured locally (no SMTP_URL): the message sent for a sign-up request' })
  @ApiContract({ responses: { 200: SignupMailResponseSchema } })
  mail(@Param('receipt') receipt: string, @Res({ passthrough: true }) res: Response): Promise<SignupMailResponse> {
    res.setHeader('Cache-Control', 'no-store');
    return this.signupService.mailForReceipt(receipt);
  }

  @Public()
  @Post('verify')
  @HttpCode(HttpStatus.OK)
  @UseGuards(SignInThrottlerGuard)
  // Limited per client address only: the body names no account, and one shared "account" bucket would
  // let a few visitors use up everyone's verifications.
  @SkipThrottle({ account: true, 'account-global': true })
  @ApiOperation({ summary: 'Follow the verification link: create the company and its first admin, and sign in' })
  @ApiContract({ body: VerifySignupSchema, responses: { 200: SessionResponseSchema } })
  async verify(
    @Body(new ZodValidationPipe(VerifySignupSchema)) body: VerifySignupInput,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SessionResponse> {
    const session = await this.signupService.verify(body.token, { ip: req.ip, userAgent: req.get('user-agent') });
    setRefreshCookie(req, res, session.refreshToken, session.refreshExpiresAt);
    res.setHeader('Cache-Control', 'no-store');
    return session.body;
  }
}
