import { Body, Controller, Get, HttpCode, HttpStatus, Param, Post, Req, Res, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';

import { ApiContract, emptyResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Public } from '../common/decorators/public.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type AcceptInvitationInput,
  AcceptInvitationSchema,
  type InvitationPreviewResponse,
  InvitationPreviewResponseSchema,
  type MeResponse,
  MeResponseSchema,
  type PasswordResetAcceptedResponse,
  PasswordResetAcceptedResponseSchema,
  type RequestPasswordResetInput,
  RequestPasswordResetSchema,
  type ResetPasswordInput,
  ResetPasswordSchema,
  type SessionResponse,
  SessionResponseSchema,
  SignInSchema,
} from '../domain/auth/auth.schema.js';
import type { UserWithCompany } from './auth.repository.js';
import { AuthService, type ClientMeta, type IssuedSession } from './auth.service.js';
import { LocalAuthGuard } from './local-auth.guard.js';
import { clearRefreshCookie, readRefreshCookie, setRefreshCookie } from './refresh-cookie.js';
import { SignInThrottlerGuard } from './sign-in-throttler.guard.js';

function meta(req: Request): ClientMeta {
  return { ip: req.ip, userAgent: req.get('user-agent') };
}

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(private readonly authService: AuthService) {}

  @Public()
  @Post('sign-in')
  @HttpCode(HttpStatus.OK)
  @UseGuards(SignInThrottlerGuard, LocalAuthGuard)
  @ApiOperation({ summary: 'Sign in with e-mail and password; sets the refresh cookie' })
  @ApiContract({ body: SignInSchema, responses: { 200: SessionResponseSchema } })
  async signIn(@Req() req: Request & { user: UserWithCompany }, @Res({ passthrough: true }) res: Response) {
    return this.withCookie(req, res, await this.authService.signIn(req.user, meta(req)));
  }

  @Public()
  @Post('refresh')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Rotate the refresh cookie and get a new access token' })
  @ApiContract({ body: 'none', responses: { 200: SessionResponseSchema } })
  async refresh(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<SessionResponse> {
    try {
      return this.withCookie(req, res, await this.authService.refresh(readRefreshCookie(req), meta(req)));
    } catch (error) {
      clearRefreshCookie(req, res);
      throw error;
    }
  }

  @Public()
  @Post('sign-out')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'End this session (the refresh token family is revoked)' })
  @ApiContract({ body: 'none', responses: { 204: emptyResponse } })
  async signOut(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.authService.signOut(readRefreshCookie(req));
    clearRefreshCookie(req, res);
  }

  @Get('me')
  @ApiBearerAuth()
  @ApiContract({ responses: { 200: MeResponseSchema } })
  me(@CurrentUser() user: AuthUser): Promise<MeResponse> {
    return this.authService.me(user.id);
  }

  @Public()
  @Get('invitations/:token')
  @ApiOperation({ summary: 'What an invitation link is for (company, e-mail, role), before accepting it' })
  @ApiContract({ responses: { 200: InvitationPreviewResponseSchema } })
  previewInvitation(@Param('token') token: string): Promise<InvitationPreviewResponse> {
    return this.authService.previewInvitation(token);
  }

  @Public()
  @Post('invitations/accept')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Accept an invitation: set name and password, and sign in' })
  @ApiContract({ body: AcceptInvitationSchema, responses: { 200: SessionResponseSchema } })
  async acceptInvitation(
    @Body(new ZodValidationPipe(AcceptInvitationSchema)) body: AcceptInvitationInput,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SessionResponse> {
    return this.withCookie(req, res, await this.authService.acceptInvitation(body, meta(req)));
  }

  @Public()
  @Post('password-reset')
  @HttpCode(HttpStatus.ACCEPTED)
  @UseGuards(SignInThrottlerGuard)
  @ApiOperation({ summary: 'E-mail a reset link (the answer is the same whether or not the account exists)' })
  @ApiContract({ body: RequestPasswordResetSchema, responses: { 202: PasswordResetAcceptedResponseSchema } })
  requestPasswordReset(@Body(new ZodValidationPipe(RequestPasswordResetSchema)) body: RequestPasswordResetInput): PasswordResetAcceptedResponse {
    this.authService.requestPasswordReset(body.email);
    return { message: 'If that address has an account, a reset link is on its way.' };
  }

  @Public()
  @Post('password-reset/confirm')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Set a new password from a reset link; ends every session of the account' })
  @ApiContract({ body: ResetPasswordSchema, responses: { 204: emptyResponse } })
  async resetPassword(@Body(new ZodValidationPipe(ResetPasswordSchema)) body: ResetPasswordInput): Promise<void> {
    await this.authService.resetPassword(body);
  }

  private withCookie(req: Request, res: Response, session: IssuedSession): SessionResponse {
    setRefreshCookie(req, res, session.refreshToken, session.refreshExpiresAt);
    res.setHeader('Cache-Control', 'no-store');
    return session.body;
  }
}
