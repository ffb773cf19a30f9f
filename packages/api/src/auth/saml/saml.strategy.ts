/**
 * Cairn's SAML service provider: @node-saml/passport-saml's MultiSamlStrategy
 * through @nestjs/passport. Multi, because the identity provider's settings
 * are resolved per request (IdpSettingsService: metadata may change or be
 * unreachable at boot). Each app gets its own Passport instance, so two Cairn
 * apps in one process (tests) never share a strategy.
 *
 * node-saml checks: both the Response and the Assertion signed by a trusted
 * certificate, one assertion only, audience, NotBefore/NotOnOrAfter with
 * auth.clockSkewSeconds, InResponseTo against the request cache (MariaDB).
 * `validate` adds what node-saml leaves to its caller: the Issuer, the
 * Response's Destination, the SubjectConfirmationData Recipient, and a
 * one-time claim of the request id (no replay, even of two copies at once).
 */
import { Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { PassportStrategy } from '@nestjs/passport';
import { type Profile, type SamlConfig, ValidateInResponseTo } from '@node-saml/node-saml';
import { MultiSamlStrategy } from '@node-saml/passport-saml';
import type { Request } from 'express';
import passport from 'passport';
import type { CairnConfig } from '../../config/config.schema.js';
import { SignInRefused } from '../sign-in-refusal.js';
import { spEndpoints } from './endpoints.js';
import { IdpSettingsService } from './idp-settings.js';
import { assertionRecipients, responseFacts } from './inspect.js';
import { SamlRequestCache } from './request-cache.js';
import { section } from '../config-section.js';

/** What a valid assertion says about the person (attributes per auth.attributes). */
export interface SamlIdentity {
  nameId: string;
  nameIdFormat: string | null;
  sessionIndex: string | null;
  issuer: string;
  inResponseTo: string;
  email: string | null;
  displayName: string | null;
  roleValues: string[];
  practiceCodes: string[];
}

type Authenticator = InstanceType<typeof passport.Passport>;

const values = (value: unknown): string[] =>
  (Array.isArray(value) ? value : value === undefined || value === null ? [] : [value])
    .filter((v): v is string => typeof v === 'string')
    .map((v) => v.trim())
    .filter(Boolean);

@Injectable()
export class SamlStrategy extends PassportStrategy(MultiSamlStrategy, 'saml') {
  /** This app's own Passport (set while the mixin's constructor registers the strategy) */
  declare private ownPassport: Authenticator | undefined;

  constructor(
    @Inject(ConfigService) private readonly configService: ConfigService,
    @Inject(IdpSettingsService) private readonly idp: IdpSettingsService,
    @Inject(SamlRequestCache) readonly cache: SamlRequestCache,
  ) {
    // One argument only: the mixin appends `validate` as the sign-on verify callback.
    const options = {
      passReqToCallback: true,
      getSamlOptions: (_req: Request, done: (err: Error | null, options?: SamlConfig) => void) => {
        samlOptions(configService, idp, cache).then(
          (options) => done(null, options),
          (error: Error) => done(error),
        );
      },
    };
    super(...([options] as unknown as [never, never]));
    // The @nestjs/passport mixin passes `validate` as the sign-on verify callback only. An
    // IdP-initiated LogoutRequest also needs a logout verify: it answers with the person
    // signed in on this request (AccessGuard has loaded them), so passport-saml can log
    // them out and reply to the identity provider.
    (this as unknown as { _logoutVerify: unknown })._logoutVerify = (
      req: Request & { user?: unknown },
      _profile: Profile | null,
      done: (err: Error | null, user?: unknown) => void,
    ) => done(null, req.user ?? {});
  }

  getPassportInstance(): Authenticator {
    this.ownPassport ??= new passport.Passport();
    return this.ownPassport;
  }

  /** The Passport instance this strategy is registered with, as 'saml'. */
  get authenticator(): Authenticator {
    return this.getPassportInstance();
  }

  async validate(_req: Request, profile: Profile | null): Promise<SamlIdentity> {
    if (!profile) throw new SignInRefused('no-assertion');
    const config = section(this.configService, 'auth');
    const sp = spEndpoints({
      server: section(this.configService, 'server'),
      auth: config,
    } as CairnConfig);
    const idp = await this.idp.current();
    const facts = responseFacts(profile.getSamlResponseXml?.() ?? '');
    const inResponseTo = typeof profile.inResponseTo === 'string' ? profile.inResponseTo : '';
    const detail = { inResponseTo, subject: profile.nameID };

    if (
      profile.issuer !== idp.entityId ||
      (facts.responseIssuer && facts.responseIssuer !== idp.entityId)
    ) {
      throw new SignInRefused('issuer', {
        ...detail,
        expected: idp.entityId,
        received: profile.issuer ?? facts.responseIssuer,
      });
    }
    // The Response's signature (required) covers its root element, so Destination is verified.
    if (facts.destination !== sp.acsUrl) {
      throw new SignInRefused('destination', {
        ...detail,
        expected: sp.acsUrl,
        received: facts.destination,
      });
    }
    const recipients = assertionRecipients(profile.getAssertionXml?.() ?? '');
    if (recipients.length === 0 || recipients.some((r) => r !== sp.acsUrl)) {
      throw new SignInRefused('recipient', {
        ...detail,
        expected: sp.acsUrl,
        received: recipients,
      });
    }
    if (!inResponseTo || !(await this.cache.claim(inResponseTo))) {
      throw new SignInRefused('replayed', detail);
    }

    const attributes = (profile.attributes ?? {}) as Record<string, unknown>;
    const names = config.attributes;
    return {
      nameId: profile.nameID,
      nameIdFormat: profile.nameIDFormat ?? null,
      sessionIndex: profile.sessionIndex ?? null,
      issuer: profile.issuer,
      inResponseTo,
      email: values(attributes[names.email])[0] ?? null,
      displayName: values(attributes[names.displayName])[0] ?? null,
      roleValues: values(attributes[names.role]),
      practiceCodes: values(attributes[names.practices]),
    };
  }
}

export async function samlOptions(
  configService: ConfigService,
  idpSettings: IdpSettingsService,
  cache: SamlRequestCache,
): Promise<SamlConfig> {
  const auth = section(configService, 'auth');
  const sp = spEndpoints({ server: section(configService, 'server'), auth } as CairnConfig);
  const idp = await idpSettings.current();
  return {
    callbackUrl: sp.acsUrl,
    issuer: sp.entityId,
    audience: sp.entityId,
    entryPoint: idp.ssoUrl,
    ...(idp.sloUrl ? { logoutUrl: idp.sloUrl } : {}),
    logoutCallbackUrl: sp.sloUrl,
    idpCert: idp.certs,
    idpIssuer: idp.entityId,
    wantAssertionsSigned: true,
    wantAuthnResponseSigned: true,
    acceptedClockSkewMs: auth.clockSkewSeconds * 1000,
    validateInResponseTo: ValidateInResponseTo.always,
    requestIdExpirationPeriodMs: auth.requestTtlMinutes * 60_000,
    cacheProvider: cache,
    identifierFormat: auth.nameIdFormat,
    signatureAlgorithm: 'sha256',
    digestAlgorithm: 'sha256',
    // Let the organisation choose how people authenticate (MFA, smart card…).
    disableRequestedAuthnContext: true,
  };
}
