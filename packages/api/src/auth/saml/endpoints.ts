/** Where Cairn's SAML endpoints are, and where the local fake identity provider's are. */
import type { CairnConfig } from '../../config/config.schema.js';

export interface SpEndpoints {
  entityId: string;
  /** Assertion consumer service (HTTP-POST binding) */
  acsUrl: string;
  /** Single logout service (HTTP-Redirect binding) */
  sloUrl: string;
  metadataUrl: string;
}

export function spEndpoints(config: CairnConfig): SpEndpoints {
  const base = config.server.publicUrl.replace(/\/+$/, '');
  return {
    entityId: config.auth.sp.entityId,
    acsUrl: `${base}/api/auth/saml/acs`,
    sloUrl: `${base}/api/auth/saml/slo`,
    metadataUrl: `${base}/api/auth/saml/metadata`,
  };
}

export interface IdpEndpoints {
  origin: string;
  entityId: string;
  ssoUrl: string;
  sloUrl: string;
  metadataUrl: string;
}

/** The local fake identity provider (mounted at /idp by the fakes process). */
export function fakeIdpEndpoints(config: CairnConfig): IdpEndpoints {
  const origin = `http://${config.devFakes.host}:${config.devFakes.port}`;
  return {
    origin,
    entityId: `${origin}/idp/metadata`,
    ssoUrl: `${origin}/idp/sso`,
    sloUrl: `${origin}/idp/slo`,
    metadataUrl: `${origin}/idp/metadata`,
  };
}
