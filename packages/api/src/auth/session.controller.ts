/**
 * What the web client asks on every load: who, if anyone, is signed in.
 * GET /api/session is always 200 (a signed-out visitor is a normal state);
 * GET /api/me is the same person for signed-in callers (401 otherwise).
 */
import { Controller, Get, Inject, Req } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request } from 'express';
import type { AuthUser } from './auth-user.js';
import { AnySignedIn, CurrentUser, Public } from './decorators.js';
import { MeDto, SessionDto } from './dto/session.dto.js';
import { MeService } from './me.service.js';
import { SessionService } from './session.service.js';
import { section } from './config-section.js';
import { ApiProblems } from '../common/problem.dto.js';

@ApiProblems()
@ApiTags('session')
@Controller()
export class SessionController {
  constructor(
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(MeService) private readonly me: MeService,
    @Inject(ConfigService) private readonly config: ConfigService,
  ) {}

  @Get('session')
  @Public()
  @ApiOperation({
    summary: 'The current session: the signed-in person (or null) and the CSRF token',
  })
  @ApiOkResponse({ type: SessionDto })
  async session(
    @Req() req: Request,
    @CurrentUser() user: AuthUser | undefined,
  ): Promise<SessionDto> {
    const { ended } = await this.sessions.resolve(req);
    const auth = section(this.config, 'auth');
    return {
      user: user ? await this.me.describe(user, this.sessions.signedInAt(req)) : null,
      csrfToken: user ? (this.sessions.csrfToken(req) ?? null) : null,
      sessionEnded: ended ?? null,
      localSignIn: auth.idp.source === 'dev-fake',
    };
  }

  @Get('me')
  @AnySignedIn()
  @ApiOperation({ summary: 'The signed-in person: role, region and practices' })
  @ApiOkResponse({ type: MeDto })
  async getMe(@Req() req: Request, @CurrentUser() user: AuthUser): Promise<MeDto> {
    return this.me.describe(user, this.sessions.signedInAt(req));
  }
}
