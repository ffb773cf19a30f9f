/**
 * Where Cairn learns about its identity provider (auth.idp.source):
 *   dev-fake       the local fake IdP (development and tests; refused in production)
 *   metadata-url   the IdP's SAML metadata, fetched and re-read every metadataRefreshMinutes
 *   metadata-file  the IdP's SAML metadata from a file
 *   settings       entityId, ssoUrl, sloUrl and certFile given one by one
 * Resolved lazily (at the first sign-in, not at boot) so that the API starts
 * even while the IdP is unreachable; the resolved settings are configuration,
 * kept per process and refreshed, never sign-in state.
 */
import { readFileSync } from 'node:fs';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import samlify from 'samlify';
import type { CairnConfig } from '../../config/config.schema.js';
import { findRepoRoot, resolvePath } from '../../config/load-config.js';
import { fakeIdpEndpoints } from './endpoints.js';
import { section } from '../config-section.js';

export interface IdpSettings {
  entityId: string;
  ssoUrl: string;
  sloUrl: string | null;
  /** Signing certificates (PEM or bare base64) */
  certs: string[];
}

export class IdpSettingsError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'IdpSettingsError';
  }
}

const REDIRECT = 'redirect';

/** Reads entity ID, HTTP-Redirect SSO/SLO locations and signing certificates from IdP metadata. */
export function parseIdpMetadata(xml: string, where: string): IdpSettings {
  let meta;
  try {
    meta = samlify.IdentityProvider({ metadata: xml }).entityMeta;
  } catch (error) {
    throw new IdpSettingsError(
      `${where}: not readable SAML metadata (${(error as Error).message})`,
    );
  }
  const entityId = meta.getEntityID();
  const first = (value: unknown): string | null =>
    typeof value === 'string' && value
      ? value
      : Array.isArray(value) && typeof value[0] === 'string'
        ? value[0]
        : null;
  const ssoUrl = first(meta.getSingleSignOnService(REDIRECT));
  const sloUrl = first(meta.getSingleLogoutService(REDIRECT));
  const rawCerts = meta.getX509Certificate('signing');
  const certs = (Array.isArray(rawCerts) ? rawCerts : [rawCerts]).filter(
    (c): c is string => typeof c === 'string' && c.trim().length > 0,
  );
  if (!entityId) throw new IdpSettingsError(`${where}: the metadata has no entityID`);
  if (!ssoUrl) {
    throw new IdpSettingsError(
      `${where}: the metadata has no SingleSignOnService with the HTTP-Redirect binding`,
    );
  }
  if (certs.length === 0)
    throw new IdpSettingsError(`${where}: the metadata has no signing certificate`);
  return { entityId, ssoUrl, sloUrl, certs };
}

@Injectable()
export class IdpSettingsService {
  private readonly logger = new Logger('IdpSettings');
  private cached: { settings: IdpSettings; until: number } | null = null;

  constructor(@Inject(ConfigService) private readonly configService: ConfigService) {
    this.assertUsable();
  }

  /** Fails at boot (while the app is created) on settings that can never work; reachability is checked at sign-in. */
  private assertUsable(): void {
    const idp = this.auth.idp;
    const production = process.env.NODE_ENV === 'production' || this.profile === 'production';
    const problem =
      idp.source === 'dev-fake' && production
        ? 'auth.idp.source is dev-fake, but the local fake identity provider never serves production (NODE_ENV=production): set auth.idp.source to metadata-url, metadata-file or settings'
        : idp.source === 'dev-fake' && !this.devFakes.enabled
          ? 'auth.idp.source is dev-fake, but devFakes.enabled is false: enable the fakes or point auth.idp at a real identity provider'
          : idp.source === 'metadata-url' && !idp.metadataUrl
            ? 'auth.idp.source is metadata-url: set auth.idp.metadataUrl (CAIRN_AUTH_IDP_METADATA_URL) to the identity provider metadata URL'
            : idp.source === 'metadata-file' && !idp.metadataFile
              ? 'auth.idp.source is metadata-file: set auth.idp.metadataFile to the metadata XML file'
              : idp.source === 'settings' && (!idp.entityId || !idp.ssoUrl || !idp.certFile)
                ? 'auth.idp.source is settings: set auth.idp.entityId, auth.idp.ssoUrl and auth.idp.certFile'
                : null;
    if (problem) throw new IdpSettingsError(problem);
  }

  private get auth(): CairnConfig['auth'] {
    return section(this.configService, 'auth');
  }
  private get devFakes(): CairnConfig['devFakes'] {
    return section(this.configService, 'devFakes');
  }
  private get profile(): CairnConfig['profile'] {
    return section(this.configService, 'profile');
  }

  /** The identity provider's current settings (cached for auth.idp.metadataRefreshMinutes). */
  async current(): Promise<IdpSettings> {
    if (this.cached && this.cached.until > Date.now()) return this.cached.settings;
    const settings = await this.resolve();
    this.cached = {
      settings,
      until: Date.now() + this.auth.idp.metadataRefreshMinutes * 60_000,
    };
    return settings;
  }

  private async resolve(): Promise<IdpSettings> {
    const idp = this.auth.idp;
    const root = findRepoRoot();
    switch (idp.source) {
      case 'dev-fake': {
        const { ensureSigningIdentity } = await import('../../dev/idp/identity.js');
        const fake = fakeIdpEndpoints({ devFakes: this.devFakes } as CairnConfig);
        const identity = await ensureSigningIdentity(resolvePath(root, this.devFakes.dataDir));
        return {
          entityId: fake.entityId,
          ssoUrl: fake.ssoUrl,
          sloUrl: fake.sloUrl,
          certs: [identity.cert],
        };
      }
      case 'metadata-url': {
        const url = idp.metadataUrl!;
        let xml: string;
        try {
          const response = await fetch(url, { signal: AbortSignal.timeout(10_000) });
          if (!response.ok) throw new Error(`HTTP ${response.status}`);
          xml = await response.text();
        } catch (error) {
          if (this.cached) {
            this.logger.warn(
              `identity provider metadata at ${url} could not be re-read (${(error as Error).message}); keeping the previous copy`,
            );
            return this.cached.settings;
          }
          throw new IdpSettingsError(
            `the identity provider metadata at ${url} could not be read: ${(error as Error).message}`,
          );
        }
        return parseIdpMetadata(xml, url);
      }
      case 'metadata-file': {
        const file = resolvePath(root, idp.metadataFile!);
        let xml: string;
        try {
          xml = readFileSync(file, 'utf8');
        } catch (error) {
          throw new IdpSettingsError(
            `auth.idp.metadataFile ${file} cannot be read: ${(error as Error).message}`,
          );
        }
        return parseIdpMetadata(xml, file);
      }
      case 'settings': {
        const file = resolvePath(root, idp.certFile!);
        let cert: string;
        try {
          cert = readFileSync(file, 'utf8');
        } catch (error) {
          throw new IdpSettingsError(
            `auth.idp.certFile ${file} cannot be read: ${(error as Error).message}`,
          );
        }
        return { entityId: idp.entityId!, ssoUrl: idp.ssoUrl!, sloUrl: idp.sloUrl, certs: [cert] };
      }
    }
  }
}
