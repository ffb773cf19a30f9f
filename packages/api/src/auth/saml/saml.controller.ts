/**
 * Sign-in and sign-out over SAML 2.0 (Cairn as service provider):
 *
 *   GET  /api/auth/saml/metadata  SP metadata for the identity provider's administrator
 *   GET  /api/auth/saml/login     SP-initiated sign-in: AuthnRequest (HTTP-Redirect) to the IdP
 *   POST /api/auth/saml/acs       assertion consumer service (HTTP-POST binding)
 *   GET  /api/auth/saml/slo       single logout service (LogoutResponse / LogoutRequest, HTTP-Redirect)
 *   POST /api/auth/sign-out       ends the session; answers where to send the browser next
 *
 * The browser-facing routes never answer with an error body: a refused or
 * failed sign-in redirects to the web's /sign-in page with a reason code,
 * after the reason was written to the audit trail.
 */
import {
  Controller,
  Get,
  HttpCode,
  Inject,
  Logger,
  Post,
  Req,
  Res,
  UseFilters,
  UseGuards,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ApiOkResponse, ApiOperation, ApiProperty, ApiTags } from '@nestjs/swagger';
import { SkipThrottle } from '@nestjs/throttler';
import { generateServiceProviderMetadata } from '@node-saml/node-saml';
import type { Request, Response } from 'express';
import type { CairnConfig } from '../../config/config.schema.js';
import { OrganisationsService } from '../../organisations/organisations.service.js';
import { Public, SkipCsrf } from '../decorators.js';
import { SessionService } from '../session.service.js';
import { type RequestContext, SignInService } from '../sign-in.service.js';
import { SignInRefused } from '../sign-in-refusal.js';
import { SignInThrottlerGuard } from '../throttle.js';
import { classifySamlError } from './classify.js';
import { spEndpoints } from './endpoints.js';
import { IdpSettingsService } from './idp-settings.js';
import { runPassport } from './passport-run.js';
import { type SamlIdentity, SamlStrategy } from './saml.strategy.js';
import { SignInPageFilter } from './sign-in-page.filter.js';
import { section } from '../config-section.js';
import { ApiProblems } from '../../common/problem.dto.js';

export class SignOutDto {
  @ApiProperty({
    type: String,
    description:
      "Where to send the browser: the identity provider's single logout (which returns to Cairn), or Cairn's signed-out page",
    example: '/sign-in?signedOut=1',
  })
  redirectUrl!: string;
}

/** A safe place in the web app to return to after sign-in (RelayState: at most 80 bytes). */
export function safeReturnTo(value: unknown): string {
  if (typeof value !== 'string') return '/';
  if (value.length > 80 || !/^\/(?!\/)[A-Za-z0-9\-._~/?=&%]*$/.test(value)) return '/';
  if (value === '/api' || value.startsWith('/api/') || value.startsWith('/sign-')) return '/';
  return value;
}

export function requestContext(req: Request): RequestContext {
  return { requestId: (req as Request & { id?: string }).id ?? null, ipAddress: req.ip ?? null };
}

export const SIGNED_OUT_URL = '/sign-in?signedOut=1';

@ApiProblems()
@ApiTags('sign-in')
@Controller('auth')
@UseGuards(SignInThrottlerGuard)
export class SamlController {
  private readonly logger = new Logger('SignIn');

  constructor(
    @Inject(ConfigService) private readonly configService: ConfigService,
    @Inject(SamlStrategy) private readonly strategy: SamlStrategy,
    @Inject(IdpSettingsService) private readonly idp: IdpSettingsService,
    @Inject(SignInService) private readonly signIn: SignInService,
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
  ) {}

  private get config(): CairnConfig {
    return {
      server: section(this.configService, 'server'),
      auth: section(this.configService, 'auth'),
    } as CairnConfig;
  }

  @Get('saml/metadata')
  @Public()
  @SkipThrottle()
  @ApiOperation({ summary: "Cairn's SAML service provider metadata (for the identity provider)" })
  metadata(@Res() res: Response): void {
    const sp = spEndpoints(this.config);
    const xml = generateServiceProviderMetadata({
      issuer: sp.entityId,
      callbackUrl: sp.acsUrl,
      logoutCallbackUrl: sp.sloUrl,
      identifierFormat: this.config.auth.nameIdFormat,
      wantAssertionsSigned: true,
    });
    res.type('application/samlmetadata+xml').send(xml);
  }

  @Get('saml/login')
  @Public()
  @UseFilters(SignInPageFilter)
  @ApiOperation({
    summary:
      'Starts sign-in: redirects to the identity provider with a SAML AuthnRequest (returnTo: a path in Cairn to come back to)',
  })
  async login(@Req() req: Request, @Res() res: Response): Promise<void> {
    // passport-saml takes RelayState from the query or the body; Cairn's query says returnTo.
    (req as Request & { body: unknown }).body = { RelayState: safeReturnTo(req.query.returnTo) };
    const outcome = await runPassport(this.strategy.authenticator, 'saml', req, res);
    if (outcome.kind === 'responded') return;
    const error =
      outcome.kind === 'error' ? outcome.error : new Error(`unexpected ${outcome.kind}`);
    this.logger.error({ err: error }, 'sign-in could not start');
    res.redirect(303, '/sign-in?refused=idp-unavailable');
  }

  @Post('saml/acs')
  @Public()
  @SkipCsrf()
  @HttpCode(303)
  @UseFilters(SignInPageFilter)
  @ApiOperation({
    summary: 'Assertion consumer service (SAML HTTP-POST binding): completes sign-in',
  })
  async acs(@Req() req: Request, @Res() res: Response): Promise<void> {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const samlResponse = typeof body.SAMLResponse === 'string' ? body.SAMLResponse : undefined;
    const context = requestContext(req);
    try {
      if (!samlResponse) throw new SignInRefused('no-response');
      const outcome = await runPassport(this.strategy.authenticator, 'saml', req, res);
      if (outcome.kind !== 'success') {
        throw await classifySamlError(
          outcome.kind === 'error' ? outcome.error : new Error(`passport: ${outcome.kind}`),
          samlResponse,
          this.strategy.cache,
          this.config.auth.clockSkewSeconds * 1000,
        );
      }
      const identity = outcome.user as SamlIdentity;
      const user = await this.signIn.complete(identity, context);
      await this.sessions.begin(req, user, {
        nameId: identity.nameId,
        nameIdFormat: identity.nameIdFormat,
        sessionIndex: identity.sessionIndex,
      });
      res.redirect(303, safeReturnTo(body.RelayState));
    } catch (error) {
      const refusal =
        error instanceof SignInRefused
          ? error
          : await classifySamlError(
              error,
              samlResponse,
              this.strategy.cache,
              this.config.auth.clockSkewSeconds * 1000,
            );
      if (!(error instanceof SignInRefused) && refusal.code === 'invalid-response') {
        this.logger.error({ err: error }, 'sign-in failed unexpectedly');
      }
      const region = await this.organisations.primaryRegion().catch(() => null);
      await this.signIn.recordRefusal(refusal, context, region?.id ?? null);
      this.logger.warn({ reason: refusal.code, requestId: context.requestId }, 'sign-in refused');
      if (!res.headersSent) res.redirect(303, `/sign-in?refused=${refusal.code}`);
    }
  }

  @Get('saml/slo')
  @Public()
  @UseFilters(SignInPageFilter)
  @ApiOperation({ summary: 'Single logout service (SAML HTTP-Redirect binding)' })
  async slo(@Req() req: Request, @Res() res: Response): Promise<void> {
    const r = req as unknown as { logOut: (cb: (err?: unknown) => void) => void };
    // An IdP-initiated LogoutRequest ends this browser's session.
    r.logOut = (cb: (err?: unknown) => void) => {
      this.signOutLocally(req, res, 'identity provider').then(
        () => cb(),
        (err: unknown) => cb(err),
      );
    };
    await this.sessions.resolve(req);
    const outcome = await runPassport(this.strategy.authenticator, 'saml', req, res);
    if (outcome.kind === 'responded') return;
    if (outcome.kind === 'error') {
      this.logger.warn({ err: outcome.error }, 'single logout message not accepted');
    }
    res.redirect(303, SIGNED_OUT_URL);
  }

  @Post('sign-out')
  @Public()
  @HttpCode(200)
  @SkipThrottle()
  @ApiOperation({
    summary:
      'Signs out: ends the session (and at the identity provider, where it offers single logout)',
  })
  @ApiOkResponse({ type: SignOutDto })
  async signOut(
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SignOutDto> {
    const auth = await this.signOutLocally(req, res, 'person');
    if (!auth) return { redirectUrl: SIGNED_OUT_URL };
    const idp = await this.idp.current().catch(() => null);
    if (!idp?.sloUrl) return { redirectUrl: SIGNED_OUT_URL };
    const redirectUrl = await new Promise<string | null>((resolve) => {
      this.strategy.logout(
        {
          user: {
            nameID: auth.nameId,
            nameIDFormat: auth.nameIdFormat,
            sessionIndex: auth.sessionIndex,
          },
          query: {},
          body: {},
        } as unknown as Parameters<SamlStrategy['logout']>[0],
        (err: Error | null, url?: string | null) => resolve(err ? null : (url ?? null)),
      );
    });
    return { redirectUrl: redirectUrl ?? SIGNED_OUT_URL };
  }

  private async signOutLocally(req: Request, res: Response, by: 'person' | 'identity provider') {
    const { user } = await this.sessions.resolve(req);
    const auth = await this.sessions.end(req, res);
    if (user && auth) {
      await this.signIn.recordSignOut(user, by, requestContext(req));
    }
    return auth;
  }
}
